import { hash as argon2Hash, verify as argon2Verify, type Options as Argon2Options } from '@node-rs/argon2';
import bcrypt from 'bcryptjs';

/**
 * Password hashing: argon2id (RFC 9106) computed by @node-rs/argon2 on libuv's thread pool, so a burst of
 * sign-ups or sign-ins never holds the event loop that answers everyone else. Argon2 takes the whole password
 * (no 72-byte cut as in bcrypt). Hashes made before the move are bcrypt; they still verify, and are replaced by
 * an argon2id hash at the next successful sign-in.
 */
export const PASSWORD_HASH_DEFAULTS = {
  /** 19 MiB, 2 passes, 1 lane. */
  memoryCostKib: 19_456,
  timeCost: 2,
  parallelism: 1,
  /** Hashes computed at once; more would queue on libuv's 4 threads behind file and DNS work. */
  maxRunning: 2,
  /** Waiting behind those; past this a sign-up or sign-in is refused at once with 503 and Retry-After. */
  maxWaiting: 8,
  retryAfterSeconds: 5,
};

export const PASSWORD_HASH_SOURCES = {
  memoryCostKib: 'OWASP Password Storage Cheat Sheet, "Argon2id": m=19456 (19 MiB), t=2, p=1',
  timeCost: 'OWASP Password Storage Cheat Sheet, "Argon2id"',
  parallelism: 'OWASP Password Storage Cheat Sheet, "Argon2id"',
  maxRunning: 'common practice, no source: the 2 cores of the machine Sowcast is sized for',
  maxWaiting: 'common practice, no source: about two seconds of hashing at 50 ms a hash',
  retryAfterSeconds: 'common practice, no source',
};

/** Argon2id is algorithm 2 in @node-rs/argon2 (its `Algorithm` is a const enum, which isolated modules cannot import). */
const ARGON2ID = 2;
const ARGON2_OPTIONS: Argon2Options = {
  algorithm: ARGON2ID as Argon2Options['algorithm'],
  memoryCost: PASSWORD_HASH_DEFAULTS.memoryCostKib,
  timeCost: PASSWORD_HASH_DEFAULTS.timeCost,
  parallelism: PASSWORD_HASH_DEFAULTS.parallelism,
};
const CURRENT_PREFIX = `$argon2id$v=19$m=${ARGON2_OPTIONS.memoryCost},t=${ARGON2_OPTIONS.timeCost},p=${ARGON2_OPTIONS.parallelism}$`;

/** Every hashing slot and queue place is taken: the caller answers 503 with Retry-After. */
export class HashingBusyError extends Error {
  readonly retryAfterSeconds = PASSWORD_HASH_DEFAULTS.retryAfterSeconds;
  constructor() {
    super('Sowcast is busy checking passwords. Try again in a few seconds.');
  }
}

let running = 0;
const waiting: (() => void)[] = [];

/** Runs `work` in one of the hashing slots, or refuses at once when the slots and the queue are full. */
async function inHashingSlot<T>(work: () => Promise<T>): Promise<T> {
  if (running >= PASSWORD_HASH_DEFAULTS.maxRunning) {
    if (waiting.length >= PASSWORD_HASH_DEFAULTS.maxWaiting) throw new HashingBusyError();
    await new Promise<void>((resolve) => waiting.push(resolve));
  } else {
    running += 1;
  }
  try {
    return await work();
  } finally {
    const next = waiting.shift();
    if (next) next();
    else running -= 1;
  }
}

export function hashPassword(password: string): Promise<string> {
  return inHashingSlot(() => argon2Hash(password, ARGON2_OPTIONS));
}

let dummyHash: Promise<string> | null = null;
/** An argon2id hash of nothing anyone knows, with the same parameters, so an unknown e-mail costs what a real one does. */
function dummy(): Promise<string> {
  dummyHash ??= argon2Hash(`sowcast-no-such-account-${Math.random()}`, ARGON2_OPTIONS);
  return dummyHash;
}

/**
 * Checks a password against a stored hash (argon2id, or a legacy bcrypt one); with no stored hash, against a
 * dummy hash at the same cost, and answers false.
 */
export async function verifyPassword(password: string, storedHash: string | null | undefined): Promise<boolean> {
  const stored = storedHash ?? (await dummy());
  const ok = await inHashingSlot(async () => {
    if (stored.startsWith('$argon2')) return argon2Verify(stored, password);
    if (/^\$2[aby]\$/.test(stored)) return bcrypt.compare(password, stored);
    return false;
  });
  return ok && Boolean(storedHash);
}

/** True when a stored hash is not argon2id with today's parameters (bcrypt, or older settings). */
export const needsRehash = (storedHash: string) => !storedHash.startsWith(CURRENT_PREFIX);
