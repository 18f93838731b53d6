import { readFileSync } from 'node:fs';

/**
 * The one clock of the web and worker processes. With SOWCAST_CLOCK_FILE set (tests, demos), the instant in
 * that file is "now", read on every call, so a test moves time for another process by writing the file —
 * no sleeping, no process restart.
 */
export function now(): Date {
  const file = process.env.SOWCAST_CLOCK_FILE;
  if (file) {
    try {
      const text = readFileSync(file, 'utf8').trim();
      const instant = new Date(text);
      if (text && !Number.isNaN(instant.getTime())) return instant;
    } catch {
      // no file yet: real time
    }
  }
  return new Date();
}
