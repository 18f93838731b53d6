// One JSON object per line on stdout: what happened, on which queue and job, and the numbers that matter.
// SOWCAST_LOG_LEVEL (debug, info, warn, error; default info) drops the lines below it — every job's "job done"
// and every quiet reminders run are debug.
export type LogLevel = 'debug' | 'info' | 'warn' | 'error';

export interface Logger {
  (level: LogLevel, msg: string, fields?: Record<string, unknown>): void;
}

const RANK: Record<LogLevel, number> = { debug: 10, info: 20, warn: 30, error: 40 };

export function createLogger(base: Record<string, unknown>, threshold: string = process.env.SOWCAST_LOG_LEVEL ?? 'info'): Logger {
  const min = RANK[threshold as LogLevel] ?? RANK.info;
  return (level, msg, fields = {}) => {
    if (RANK[level] < min) return;
    process.stdout.write(`${JSON.stringify({ time: new Date().toISOString(), level, msg, ...base, ...fields })}\n`);
  };
}

export const errorText = (error: unknown) => (error instanceof Error ? error.message : String(error));
