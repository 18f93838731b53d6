// Why a forecast could not be had. The worker keeps the last good forecast and marks it stale on any of
// these; `kind` tells the log (and the weather panel) whether the provider was slow, down, or talking nonsense.
export type WeatherErrorKind = 'timeout' | 'http' | 'invalid' | 'network';

export class WeatherError extends Error {
  readonly kind: WeatherErrorKind;
  /** HTTP status of the last answer, for kind 'http'. */
  readonly status?: number;
  /** How many requests were made before giving up. */
  readonly attempts: number;

  constructor(kind: WeatherErrorKind, message: string, options: { status?: number; attempts?: number; cause?: unknown } = {}) {
    super(message, options.cause === undefined ? undefined : { cause: options.cause });
    this.name = 'WeatherError';
    this.kind = kind;
    this.status = options.status;
    this.attempts = options.attempts ?? 1;
  }
}
