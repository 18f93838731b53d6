// Push endpoints must be public https hosts (OWASP Server-Side Request Forgery Prevention Cheat Sheet:
// resolve the name, check every address). The ranges are IANA's special-purpose address registries
// (RFC 6890): loopback 127/8 and ::1 (RFC 1122, RFC 4291), private 10/8 172.16/12 192.168/16 (RFC 1918),
// link-local 169.254/16 (RFC 3927) and fe80::/10 (RFC 4291), unique-local fc00::/7 (RFC 4193), shared
// CGNAT space 100.64/10 (RFC 6598), unspecified 0.0.0.0 and ::, IPv4-mapped ::ffff:0:0/96 (RFC 4291 §2.5.5.2).
import https from 'node:https';
import { describe, expect, it } from 'vitest';
import { addressRefusal, checkPushEndpoint, pushAgent, PushEndpointRefused } from '@/lib/notify/push-endpoint';

const NO_ALLOW = {};
const resolvesTo = (...addresses: string[]) => async () => addresses;

describe('addressRefusal', () => {
  it.each([
    '127.0.0.1', '127.255.0.9', '::1', '10.0.0.5', '172.16.4.4', '172.31.255.255', '192.168.1.1', '169.254.169.254',
    'fe80::1', 'fc00::1', 'fd12:3456::1', '100.64.0.1', '100.127.255.254', '0.0.0.0', '::', '::ffff:127.0.0.1',
    '::ffff:10.1.2.3', '224.0.0.1', 'ff02::1', '255.255.255.255',
  ])('refuses %s', (address) => {
    expect(addressRefusal(address)).toMatch(/not a public one/);
  });

  it.each(['11.22.33.44', '2a02:1800::1', '172.32.0.1', '100.128.0.1', '11.0.0.1'])('lets the public address %s through', (address) => {
    expect(addressRefusal(address)).toBeNull();
  });
});

describe('checkPushEndpoint', () => {
  it('refuses loopback, private and link-local hosts, written as addresses', async () => {
    for (const host of ['127.0.0.1:4030', '[::1]', '10.0.0.8', '192.168.0.10:8443', '169.254.169.254', '[fe80::1]', '[fd00::2]', '100.64.1.1', '[::ffff:7f00:1]']) {
      await expect(checkPushEndpoint(`https://${host}/push/x`, NO_ALLOW, resolvesTo('11.22.33.44')), host).rejects.toBeInstanceOf(PushEndpointRefused);
    }
  });

  it('refuses a name that resolves to a private address, even when only one of its addresses is', async () => {
    await expect(checkPushEndpoint('https://push.internal/x', NO_ALLOW, resolvesTo('10.1.1.1'))).rejects.toThrow(/10\.1\.1\.1 is a private address/);
    await expect(checkPushEndpoint('https://push.internal/x', NO_ALLOW, resolvesTo('11.22.33.44', '127.0.0.1'))).rejects.toThrow(/loopback/);
    await expect(checkPushEndpoint('https://localhost:4030/x', NO_ALLOW)).rejects.toThrow(/loopback/);
  });

  it('refuses a name that does not resolve, plain http, and credentials in the URL', async () => {
    await expect(checkPushEndpoint('https://push.nowhere/x', NO_ALLOW, async () => { throw new Error('ENOTFOUND'); })).rejects.toThrow(/could not be found/);
    await expect(checkPushEndpoint('http://push.example/x', NO_ALLOW, resolvesTo('11.22.33.44'))).rejects.toThrow(/https/);
    await expect(checkPushEndpoint('https://user:pw@push.example/x', NO_ALLOW, resolvesTo('11.22.33.44'))).rejects.toThrow(/user name or password/);
  });

  it('accepts a public host', async () => {
    await expect(checkPushEndpoint('https://push.example/send/abc', NO_ALLOW, resolvesTo('11.22.33.44', '2a02:1800::1'))).resolves.toBeUndefined();
  });

  it('lets only the listed origin through (the local fake), not other ports or hosts on loopback', async () => {
    const env = { PUSH_ENDPOINT_ALLOWED_ORIGINS: 'https://127.0.0.1:4030' };
    await expect(checkPushEndpoint('https://127.0.0.1:4030/push/1', env)).resolves.toBeUndefined();
    await expect(checkPushEndpoint('https://127.0.0.1:4031/push/1', env)).rejects.toBeInstanceOf(PushEndpointRefused);
    await expect(checkPushEndpoint('https://127.0.0.2:4030/push/1', env)).rejects.toBeInstanceOf(PushEndpointRefused);
  });
});

describe('pushAgent (the worker’s connection)', () => {
  it('refuses to connect when the name resolves to loopback at connection time (DNS rebinding after the check)', async () => {
    const error = await new Promise<NodeJS.ErrnoException>((resolve) => {
      https.get({ host: 'localhost', port: 9, path: '/push/x', agent: pushAgent() }, () => resolve(new Error('connected') as NodeJS.ErrnoException)).on('error', resolve);
    });
    expect(error.code).toBe('EPUSHREFUSED');
    expect(error.message).toMatch(/loopback/);
  });
});
