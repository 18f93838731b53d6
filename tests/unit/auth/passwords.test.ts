// Password hashing with @node-rs/argon2 (argon2id, RFC 9106) and the old bcrypt hashes, for real (no mocks).
import bcrypt from 'bcryptjs';
import { describe, expect, it } from 'vitest';
import { HashingBusyError, hashPassword, needsRehash, PASSWORD_HASH_DEFAULTS, verifyPassword } from '@/lib/auth/passwords';
import { weakPasswordReason } from '@/lib/auth/password-strength';

describe('hashPassword / verifyPassword', () => {
  it('makes argon2id with OWASP\'s parameters (Password Storage Cheat Sheet: m=19456, t=2, p=1) and checks it', async () => {
    const hash = await hashPassword('winter wheat and clover');
    expect(hash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
    expect(await verifyPassword('winter wheat and clover', hash)).toBe(true);
    expect(await verifyPassword('winter wheat and clover!', hash)).toBe(false);
    expect(needsRehash(hash)).toBe(false);
  });

  it('uses every byte: passwords equal in their first 72 bytes (all bcrypt reads) but not after are different', async () => {
    const prefix = 'a'.repeat(72);
    const hash = await hashPassword(`${prefix}-one`);
    expect(await verifyPassword(`${prefix}-two`, hash)).toBe(false);
    // bcrypt, by contrast, cannot tell them apart (OpenBSD bcrypt(3): the key is at most 72 bytes).
    const old = await bcrypt.hash(`${prefix}-one`, 4);
    expect(await bcrypt.compare(`${prefix}-two`, old)).toBe(true);
  });

  it('still verifies a bcrypt hash, and asks for it to be replaced', async () => {
    const old = await bcrypt.hash('an old password of 2026', 4);
    expect(await verifyPassword('an old password of 2026', old)).toBe(true);
    expect(await verifyPassword('another', old)).toBe(false);
    expect(needsRehash(old)).toBe(true);
    expect(needsRehash('$argon2id$v=19$m=4096,t=3,p=1$abc$def')).toBe(true);
  });

  it('with no stored hash (unknown e-mail) answers false after the same work', async () => {
    expect(await verifyPassword('anything at all', null)).toBe(false);
  });

  it(`refuses at once past ${PASSWORD_HASH_DEFAULTS.maxRunning} running and ${PASSWORD_HASH_DEFAULTS.maxWaiting} waiting, and recovers`, async () => {
    const total = PASSWORD_HASH_DEFAULTS.maxRunning + PASSWORD_HASH_DEFAULTS.maxWaiting + 5;
    const results = await Promise.allSettled(Array.from({ length: total }, (_, i) => hashPassword(`burst ${i} of sign-ups`)));
    const refused = results.filter((r) => r.status === 'rejected');
    expect(refused).toHaveLength(5);
    for (const r of refused) expect((r as PromiseRejectedResult).reason).toBeInstanceOf(HashingBusyError);
    expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(total - 5);
    expect(await hashPassword('after the burst')).toMatch(/^\$argon2id\$/);
  });

  it('keeps the event loop free while hashing (argon2 runs on libuv threads): timers fire on time', async () => {
    let worstLagMs = 0;
    let last = performance.now();
    const timer = setInterval(() => {
      const now = performance.now();
      worstLagMs = Math.max(worstLagMs, now - last - 5);
      last = now;
    }, 5);
    await Promise.all(Array.from({ length: 8 }, (_, i) => hashPassword(`concurrent ${i}`)));
    clearInterval(timer);
    // One argon2id hash at these settings takes ~50 ms of CPU; on the event loop eight would block 400 ms.
    expect(worstLagMs).toBeLessThan(150);
  });
});

describe('weakPasswordReason (zxcvbn-ts; NIST SP 800-63B §5.1.1.2 context-specific and common passwords)', () => {
  const person = { email: 'dale.fieldhand@example.test', name: 'Dale Fieldhand' };
  it('refuses common and keyboard passwords, the e-mail and its local part, and words from the name', () => {
    for (const p of ['password1234', 'qwertyuiop12', '1234567890', 'dale.fieldhand@example.test', 'DALE.FIELDHAND', 'fieldhand2026']) {
      expect(weakPasswordReason(p, person), p).toMatch(/Password/);
    }
  });
  it('accepts unrelated words and random strings', () => {
    for (const p of ['copper lantern meadow 47', 'pw-7f3c2e1a-9b4d-4c11-8e2f-5a6b7c8d9e0f', 'Kestrel-harrow-Oat-1931']) {
      expect(weakPasswordReason(p, person), p).toBeNull();
    }
  });
  it('scores a long password in bounded time (it holds the event loop)', () => {
    const started = performance.now();
    weakPasswordReason('1a'.repeat(100), person);
    expect(performance.now() - started).toBeLessThan(1_000);
  });
});
