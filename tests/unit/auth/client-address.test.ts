// Which X-Forwarded-For entry is the client, and the web server's own hop. The list grows left to right, each
// proxy appending the address it was reached from (MDN "X-Forwarded-For"; RFC 7239 §5.2 for the same rule in
// Forwarded). Entries left of the trusted hops were written by the client and are never believed.
import http from 'node:http';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { describe, expect, it } from 'vitest';
import { addressKey, clientAddress, normalizeAddress, trustedProxyHops } from '@/lib/auth/client-address';
// @ts-expect-error plain .mjs helper of the web server, no types
import { appendPeerAddress, forwardedForWithPeer } from '../../../scripts/lib/forwarded-for.mjs';

describe('clientAddress', () => {
  it('with no trusted proxy (the default) is the socket peer the web server appended, whatever the client wrote', () => {
    expect(clientAddress('203.0.113.9', 0)).toBe('203.0.113.9');
    expect(clientAddress('1.2.3.4, 5.6.7.8, 198.51.100.7', 0)).toBe('198.51.100.7');
  });

  it('with N trusted proxies is the entry N places from the right (what the outermost trusted proxy saw)', () => {
    // client-written, what proxy 1 saw, proxy 1's address seen by the web server
    expect(clientAddress('1.2.3.4, 203.0.113.9, 10.0.0.2', 1)).toBe('203.0.113.9');
    expect(clientAddress('9.9.9.9, 203.0.113.9, 10.0.0.3, 10.0.0.2', 2)).toBe('203.0.113.9');
  });

  it('a request that skipped the proxies still gets an entry a trusted hop wrote, never null when one exists', () => {
    expect(clientAddress('198.51.100.7', 2)).toBe('198.51.100.7');
    expect(clientAddress('', 0)).toBeNull();
    expect(clientAddress(null, 0)).toBeNull();
  });

  it('IPv4-mapped IPv6 becomes the IPv4 address; junk becomes "unknown"', () => {
    expect(normalizeAddress('::ffff:127.0.0.1')).toBe('127.0.0.1');
    expect(normalizeAddress('[2001:db8::1]:443')).toBe('2001:db8::1');
    expect(normalizeAddress('203.0.113.9:5000')).toBe('203.0.113.9');
    expect(normalizeAddress('<script>')).toBe('unknown');
  });

  it('an IPv6 address counts by its /64 (RFC 6177 §3: one site gets a /48 or /56, one link a /64)', () => {
    expect(addressKey('2001:db8:1:2:aaaa::1')).toBe('2001:db8:1:2::/64');
    expect(addressKey('2001:db8:1:2:ffff:ffff:ffff:ffff')).toBe('2001:db8:1:2::/64');
    expect(addressKey('2001:db8::5')).toBe('2001:db8:0:0::/64');
    expect(addressKey('203.0.113.9')).toBe('203.0.113.9');
  });

  it('TRUSTED_PROXY_HOPS: 0 unless set; anything but a whole number from 0 to 10 is refused at start', () => {
    expect(trustedProxyHops({})).toBe(0);
    expect(trustedProxyHops({ TRUSTED_PROXY_HOPS: '2' })).toBe(2);
    expect(() => trustedProxyHops({ TRUSTED_PROXY_HOPS: 'yes' })).toThrow(/TRUSTED_PROXY_HOPS/);
    expect(() => trustedProxyHops({ TRUSTED_PROXY_HOPS: '-1' })).toThrow(/TRUSTED_PROXY_HOPS/);
  });
});

describe("the web server's hop (scripts/web-server.mjs)", () => {
  it("Next's own server keeps a client's X-Forwarded-For as sent and adds the socket address only when there is none", () => {
    // The fact the web server is built on: `??=` in Next's base server. Should Next start appending, this fails
    // and the web server's own append would count the peer twice.
    const source = readFileSync(path.resolve(__dirname, '../../../node_modules/next/dist/server/base-server.js'), 'utf8');
    expect(source).toMatch(/req\.headers\['x-forwarded-for'\] \?\?= [^;]*remoteAddress/);
    expect(source.match(/x-forwarded-for/g)?.length).toBe(1);
  });

  it('appends the socket peer to whatever came in', () => {
    expect(forwardedForWithPeer(undefined, '127.0.0.1')).toBe('127.0.0.1');
    expect(forwardedForWithPeer('6.6.6.6', '127.0.0.1')).toBe('6.6.6.6, 127.0.0.1');
    expect(forwardedForWithPeer(['6.6.6.6', '7.7.7.7'], '::1')).toBe('6.6.6.6, 7.7.7.7, ::1');
  });

  it('over a real socket: a client claiming another address is still seen at its own', async () => {
    const server = http.createServer((request, response) => {
      appendPeerAddress(request);
      response.end(String(clientAddress(request.headers['x-forwarded-for'] as string, 0)));
    });
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    try {
      const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/`;
      expect(await (await fetch(url, { headers: { 'x-forwarded-for': '203.0.113.50' } })).text()).toBe('127.0.0.1');
      expect(await (await fetch(url)).text()).toBe('127.0.0.1');
    } finally {
      server.close();
    }
  });
});
