import path from 'node:path';
import { defineConfig } from 'vitest/config';

export default defineConfig({
  resolve: { alias: { '@': path.resolve(__dirname) } },
  test: {
    include: ['tests/**/*.test.ts'],
    environment: 'node',
    testTimeout: 60_000,
    hookTimeout: 90_000,
    // Browser tests poll the page for what a person would wait for; on a busy 2-core CI machine a page can take
    // several seconds to fetch and render, so the 1 s default would fail on slowness, not on a fault.
    expect: { poll: { timeout: 15_000, interval: 100 } },
    pool: 'forks',
    maxWorkers: 2,
    reporters: ['default'],
  },
});
