import { createHash } from 'node:crypto';
import { NextResponse } from 'next/server';
import { RateLimiterRes } from 'rate-limiter-flexible';
import { postgresLimiter } from '@/lib/data/rate-limits';

/**
 * Sign-in: no hard lock. Failures are counted per e-mail + address pair and per address; past a few free
 * failures each further try must wait a delay that doubles with every failure, up to a ceiling. A correct
 * password is refused only while its own pair or its own address is waiting, so failures elsewhere never
 * lock anyone out, and an account that has signed in from an address before is not held up by other
 * people's failures from that address (a club behind one router).
 */
export const SIGN_IN_DELAY_DEFAULTS = {
  pairFreeFailures: 5,
  addressFreeFailures: 30,
  firstDelaySeconds: 2,
  maxDelaySeconds: 900,
  /** Failures are forgotten this long after the first of a run; a success forgets the pair's at once. */
  failureMemoryHours: 24,
  /** An account that signed in from an address skips that address's delay for this long. */
  knownAddressDays: 30,
};

export const SIGN_IN_DELAY_SOURCES = {
  pairFreeFailures: 'OWASP Authentication Cheat Sheet, "Protect Against Automated Attacks": account lockout thresholds; the number is common practice, no source',
  addressFreeFailures: 'common practice, no source: a shared connection of a camp or club',
  firstDelaySeconds: 'NIST SP 800-63B §5.2.2 (rate limiting; "delays that increase with each failed attempt"); the numbers are common practice, no source',
  maxDelaySeconds: 'common practice, no source: 15 minutes, the old lock\'s length',
  failureMemoryHours: 'common practice, no source',
  knownAddressDays: 'rate-limiter-flexible wiki, "Login endpoint protection" (trusted device); the number is common practice, no source',
};

export const SIGN_UP_LIMIT_DEFAULTS = {
  perAddressPerHour: 10,
  /** Overridden by SIGN_UP_GLOBAL_PER_HOUR. */
  globalPerHour: 500,
};

export const SIGN_UP_LIMIT_SOURCES = {
  perAddressPerHour: 'common practice, no source: a club signing its members up at one camp',
  globalPerHour: 'common practice, no source: far above the sign-ups a small product sees, far below a scripted flood',
};

/** Overridden by INVITATIONS_PER_PROPERTY_PER_HOUR. */
export const INVITATION_LIMIT_DEFAULTS = { perPropertyPerHour: 20 };
export const INVITATION_LIMIT_SOURCES = {
  perPropertyPerHour: 'common practice, no source: a club inviting its members in one sitting',
};

const HOUR_SECONDS = 3_600;
/** Keys hold a hash, not the e-mail itself, and stay inside the store's 255 characters. */
const keyOf = (...parts: string[]) => createHash('sha256').update(parts.join('\n')).digest('base64url');

type Limiter = ReturnType<typeof postgresLimiter>;
let limiters: Record<'pairFailures' | 'addressFailures' | 'delays' | 'known' | 'signUpAddress' | 'signUpAll' | 'invitations', Limiter> | null = null;

function positiveFromEnv(name: string, fallback: number): number {
  const raw = Number(process.env[name]);
  return Number.isInteger(raw) && raw > 0 ? raw : fallback;
}

/** Sign-ups per hour from everyone together, as configured. */
export const globalSignUpsPerHour = () => positiveFromEnv('SIGN_UP_GLOBAL_PER_HOUR', SIGN_UP_LIMIT_DEFAULTS.globalPerHour);
/** Invitations one property may send per hour, as configured. */
export const invitationsPerPropertyPerHour = () =>
  positiveFromEnv('INVITATIONS_PER_PROPERTY_PER_HOUR', INVITATION_LIMIT_DEFAULTS.perPropertyPerHour);

function store() {
  const d = SIGN_IN_DELAY_DEFAULTS;
  limiters ??= {
    pairFailures: postgresLimiter('signin-pair', 1_000_000, d.failureMemoryHours * HOUR_SECONDS),
    addressFailures: postgresLimiter('signin-address', 1_000_000, d.failureMemoryHours * HOUR_SECONDS),
    // A key is waiting while `block` has put it past its single point.
    delays: postgresLimiter('signin-delay', 1, 1),
    known: postgresLimiter('signin-known', 1, d.knownAddressDays * 24 * HOUR_SECONDS),
    signUpAddress: postgresLimiter('signup-address', SIGN_UP_LIMIT_DEFAULTS.perAddressPerHour, HOUR_SECONDS),
    signUpAll: postgresLimiter('signup-all', globalSignUpsPerHour(), HOUR_SECONDS),
    invitations: postgresLimiter('invite-property', invitationsPerPropertyPerHour(), HOUR_SECONDS),
  };
  return limiters;
}

/** The delay after `failures` failures in a row when the first `free` cost nothing: 2 s, 4 s, 8 s … 15 min. */
export function delayAfterFailures(failures: number, free: number): number {
  const d = SIGN_IN_DELAY_DEFAULTS;
  if (failures < free) return 0;
  return Math.min(d.firstDelaySeconds * 2 ** (failures - free), d.maxDelaySeconds);
}

async function waitingSeconds(key: string): Promise<number> {
  const res = await store().delays.get(key);
  if (!res || res.consumedPoints <= 1) return 0;
  return Math.ceil(res.msBeforeNext / 1000);
}

/** Seconds this e-mail must wait from this address before its password is even checked; 0 to go ahead. */
export async function signInWaitSeconds(email: string, address: string): Promise<number> {
  const pair = keyOf('pair', email.toLowerCase(), address);
  const pairWait = await waitingSeconds(pair);
  if (pairWait > 0) return pairWait;
  const addressWait = await waitingSeconds(keyOf('address', address));
  if (addressWait === 0) return 0;
  return (await store().known.get(pair)) ? 0 : addressWait;
}

export async function recordSignInFailure(email: string, address: string) {
  const d = SIGN_IN_DELAY_DEFAULTS;
  const { pairFailures, addressFailures, delays } = store();
  const pair = keyOf('pair', email.toLowerCase(), address);
  const byAddress = keyOf('address', address);
  const pairCount = (await pairFailures.penalty(pair, 1)).consumedPoints;
  const addressCount = (await addressFailures.penalty(byAddress, 1)).consumedPoints;
  const pairDelay = delayAfterFailures(pairCount, d.pairFreeFailures);
  const addressDelay = delayAfterFailures(addressCount, d.addressFreeFailures);
  if (pairDelay > 0) await delays.block(pair, pairDelay);
  if (addressDelay > 0) await delays.block(byAddress, addressDelay);
}

/** A correct password: the pair's failures are forgotten and the address becomes known for the account. */
export async function recordSignInSuccess(email: string, address: string) {
  const { pairFailures, delays, known } = store();
  const pair = keyOf('pair', email.toLowerCase(), address);
  await pairFailures.delete(pair);
  await delays.delete(pair);
  await known.set(pair, 1, SIGN_IN_DELAY_DEFAULTS.knownAddressDays * 24 * HOUR_SECONDS);
}

/** Takes one try from a limiter; the seconds to wait when none is left, else 0. Store errors are thrown. */
async function take(limiter: Limiter, key: string): Promise<number> {
  try {
    await limiter.consume(key, 1);
    return 0;
  } catch (result) {
    if (result instanceof RateLimiterRes) return Math.max(1, Math.ceil(result.msBeforeNext / 1000));
    throw result;
  }
}

/** One sign-up from this address: seconds to wait when this address or everyone together is over the limit. */
export async function takeSignUp(address: string): Promise<number> {
  const byAddress = await take(store().signUpAddress, keyOf('address', address));
  if (byAddress > 0) return byAddress;
  return take(store().signUpAll, 'all');
}

/** One invitation from this property: seconds to wait when its hourly allowance is used up. */
export function takeInvitation(propertyId: string): Promise<number> {
  return take(store().invitations, propertyId);
}

/** A 429 or 503 answer with Retry-After (RFC 9110 §10.2.3), in the JSON shape every route uses. */
export function retryLater(status: 429 | 503, message: string, retryAfterSeconds: number) {
  return NextResponse.json({ error: message }, { status, headers: { 'Retry-After': String(retryAfterSeconds) } });
}

/** "5 minutes", "40 seconds": how long to wait, in words. */
export function waitWords(seconds: number): string {
  if (seconds >= 90) return `${Math.ceil(seconds / 60)} minutes`;
  return `${seconds} second${seconds === 1 ? '' : 's'}`;
}
