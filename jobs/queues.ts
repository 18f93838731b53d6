// The worker's queues and how pg-boss treats each. pg-boss 10 needs every queue created before a send, a
// work or a schedule (a send to a missing queue returns null silently), so the worker creates them all first,
// the dead-letter queue before the queues that name it.
import type PgBoss from 'pg-boss';

export const QUEUES = {
  forecastRefresh: 'forecast-refresh',
  replan: 'replan',
  remindersDue: 'reminders-due',
  emailSend: 'email-send',
  pushSend: 'push-send',
  deadLetter: 'dead-letter',
} as const;

export type QueueName = (typeof QUEUES)[keyof typeof QUEUES];

export interface ForecastRefreshJob {
  /** One property (just created or moved); absent → every property. */
  propertyId?: string;
}
export interface ReplanJob {
  plantingId: string;
}
export type RemindersDueJob = Record<string, never>;
export interface SendJob {
  notificationId: string;
  /** Who claimed the row, and which try this is: for the log. */
  claimedBy: string;
  attempt: number;
}

type QueueOptions = Omit<PgBoss.Queue, 'name'>;

const DEAD_LETTER = QUEUES.deadLetter;

/**
 * 'stately' keeps at most one queued and one running job per singleton key: a second forecast for the same
 * planting waits behind the running replan instead of piling up, and a notification is never queued twice.
 * Reminders run 'standard', so two workers may run them at once — the notification rows' unique dedupe key and
 * SKIP LOCKED claims are what keep that safe.
 */
export const QUEUE_OPTIONS: Record<QueueName, QueueOptions> = {
  [QUEUES.deadLetter]: { policy: 'standard', retentionMinutes: 14 * 24 * 60 },
  [QUEUES.forecastRefresh]: {
    policy: 'stately',
    retryLimit: 2,
    retryDelay: 60,
    retryBackoff: true,
    expireInSeconds: 10 * 60,
    deadLetter: DEAD_LETTER,
  },
  [QUEUES.replan]: { policy: 'stately', retryLimit: 3, retryDelay: 5, retryBackoff: true, expireInSeconds: 120, deadLetter: DEAD_LETTER },
  // Each run is made again a minute later, so a failed one is not retried.
  [QUEUES.remindersDue]: { policy: 'standard', retryLimit: 0, expireInSeconds: 120, deadLetter: DEAD_LETTER },
  [QUEUES.emailSend]: { policy: 'stately', retryLimit: 4, retryDelay: 15, retryBackoff: true, expireInSeconds: 120, deadLetter: DEAD_LETTER },
  [QUEUES.pushSend]: { policy: 'stately', retryLimit: 4, retryDelay: 15, retryBackoff: true, expireInSeconds: 120, deadLetter: DEAD_LETTER },
};

/** Creation order: the dead-letter queue first. */
export const QUEUE_ORDER: QueueName[] = [
  QUEUES.deadLetter,
  QUEUES.forecastRefresh,
  QUEUES.replan,
  QUEUES.remindersDue,
  QUEUES.emailSend,
  QUEUES.pushSend,
];

/** pg-boss cron is minute-grained and evaluated in UTC; reminders pick their own local hours. */
export const SCHEDULES = [
  { queue: QUEUES.remindersDue, cron: '* * * * *' },
  { queue: QUEUES.forecastRefresh, cron: '0 */3 * * *' },
] as const;

export async function createQueues(boss: PgBoss): Promise<void> {
  for (const name of QUEUE_ORDER) await boss.createQueue(name, { name, ...QUEUE_OPTIONS[name] });
}

export const replanJob = (plantingId: string) =>
  ({ name: QUEUES.replan, data: { plantingId } satisfies ReplanJob, options: { singletonKey: plantingId } }) as const;

export const forecastRefreshJob = (propertyId?: string) =>
  ({
    name: QUEUES.forecastRefresh,
    data: (propertyId ? { propertyId } : {}) satisfies ForecastRefreshJob,
    options: { singletonKey: propertyId ?? 'all' },
  }) as const;
