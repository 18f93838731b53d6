import type PgBoss from 'pg-boss';
import type { Logger } from './log';

/** What a handler may use besides the data layer and the engine: the queue (to enqueue the next job), who it is, the log. */
export interface JobContext {
  boss: PgBoss;
  workerId: string;
  log: Logger;
}
