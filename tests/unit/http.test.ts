// The route wrapper's request checks, on Request objects as route handlers receive them:
// - same-origin for state-changing methods: OWASP Cross-Site Request Forgery Prevention Cheat Sheet,
//   "Verifying Origin with standard headers" and "Fetch Metadata headers" (W3C Fetch Metadata §2.1);
// - JSON bodies only as application/json (RFC 8259 §11 media type), 415 otherwise (RFC 9110 §15.5.16);
// - bodies capped while they stream (413, RFC 9110 §15.5.14) and cut when too slow (408, RFC 9110 §15.5.9).
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { JSON_BODY_LIMIT_BYTES, parseBody, readBodyWithin, route } from '@/lib/http';

const APP = 'http://127.0.0.1:3000';
process.env.NEXTAUTH_URL = APP;

const echo = route(async (request: Request) => Response.json(await parseBody(request, z.object({ name: z.string().optional() }))));

const call = (init: RequestInit, url = `${APP}/api/x`) =>
  echo(new Request(url, init), {});

const jsonPost = (headers: Record<string, string>) =>
  call({ method: 'POST', headers: { 'content-type': 'application/json', host: '127.0.0.1:3000', ...headers }, body: '{"name":"Ridge"}' });

describe('same-origin check on state-changing requests', () => {
  it('lets the app’s own pages through (Origin of NEXTAUTH_URL, or the very host the request went to)', async () => {
    expect((await jsonPost({ origin: APP })).status).toBe(200);
    expect((await jsonPost({ origin: APP, 'sec-fetch-site': 'same-origin' })).status).toBe(200);
    expect((await jsonPost({ origin: 'http://sowcast.internal:8443', host: 'sowcast.internal:8443' })).status).toBe(200);
  });

  it('lets a client that is not a browser through (no Origin, no Sec-Fetch-Site: no ambient session to abuse)', async () => {
    expect((await jsonPost({})).status).toBe(200);
  });

  for (const [what, headers] of [
    ['a sibling port', { origin: 'http://127.0.0.1:8080' }],
    ['a sibling subdomain', { origin: 'http://evil.127.0.0.1.nip.io:3000' }],
    ['a sandboxed frame (Origin: null)', { origin: 'null' }],
    ['Sec-Fetch-Site: same-site without Origin', { 'sec-fetch-site': 'same-site' }],
    ['Sec-Fetch-Site: cross-site', { 'sec-fetch-site': 'cross-site', origin: APP }],
    ['a malformed Origin', { origin: 'not a url' }],
  ] as const) {
    it(`refuses ${what} with 403 before the handler runs`, async () => {
      let ran = false;
      const handler = route(async () => {
        ran = true;
        return new Response(null, { status: 204 });
      });
      for (const method of ['POST', 'PUT', 'PATCH', 'DELETE']) {
        const res = await handler(new Request(`${APP}/api/x`, { method, headers: { host: '127.0.0.1:3000', ...headers } }), {});
        expect(res.status, method).toBe(403);
        expect((await res.json()).error).toMatch(/Sowcast's own pages/);
      }
      expect(ran).toBe(false);
    });
  }

  it('does not check safe methods (GET reads only)', async () => {
    const handler = route(async () => new Response('ok'));
    const res = await handler(new Request(`${APP}/api/x`, { headers: { origin: 'http://127.0.0.1:8080', 'sec-fetch-site': 'cross-site' } }), {});
    expect(res.status).toBe(200);
  });
});

describe('JSON bodies', () => {
  it('refuses a body sent as a form or text/plain with 415 (what a cross-site form can send without preflight)', async () => {
    for (const type of ['text/plain', 'application/x-www-form-urlencoded', 'multipart/form-data; boundary=x']) {
      const res = await call({ method: 'POST', headers: { 'content-type': type }, body: '{"name":"Ridge"}' });
      expect(res.status, type).toBe(415);
      expect((await res.json()).error).toMatch(/application\/json/);
    }
  });

  it('refuses a body without any Content-Type, and accepts application/json with a charset or a +json type', async () => {
    expect((await call({ method: 'POST', body: new Blob(['{"name":"Ridge"}']) })).status).toBe(415);
    expect((await call({ method: 'POST', headers: { 'content-type': 'application/json; charset=utf-8' }, body: '{"name":"A"}' })).status).toBe(200);
    expect((await call({ method: 'POST', headers: { 'content-type': 'application/merge-patch+json' }, body: '{"name":"A"}' })).status).toBe(200);
  });

  it('reads no body at all as an empty object', async () => {
    const res = await call({ method: 'POST' });
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({});
  });
});

/** A body of `totalBytes` in 64 KiB chunks, counting how many bytes the reader pulled. */
function countedBody(totalBytes: number) {
  const chunk = new Uint8Array(64 * 1024).fill(0x20);
  const counter = { pulled: 0 };
  const stream = new ReadableStream<Uint8Array>({
    pull(controller) {
      if (counter.pulled >= totalBytes) return controller.close();
      counter.pulled += chunk.byteLength;
      controller.enqueue(chunk);
    },
  }, { highWaterMark: 0 });
  return { stream, counter };
}

describe('body size and time limits', () => {
  it('refuses a 50 MB body with 413 after pulling no more than the 1 MB cap plus one chunk', async () => {
    const { stream, counter } = countedBody(50 * 1024 * 1024);
    const res = await call({ method: 'POST', headers: { 'content-type': 'application/json' }, body: stream, duplex: 'half' } as RequestInit);
    expect(res.status).toBe(413);
    expect((await res.json()).error).toMatch(/too large/);
    expect(counter.pulled).toBeLessThanOrEqual(JSON_BODY_LIMIT_BYTES + 64 * 1024);
  });

  it('refuses a declared Content-Length over the cap before reading anything', async () => {
    const { stream, counter } = countedBody(2 * 1024 * 1024);
    const request = new Request(`${APP}/api/x`, { method: 'POST', headers: { 'content-length': String(2 * 1024 * 1024) }, body: stream, duplex: 'half' } as RequestInit);
    await expect(readBodyWithin(request, JSON_BODY_LIMIT_BYTES)).rejects.toMatchObject({ status: 413 });
    expect(counter.pulled).toBe(0);
  });

  it('cuts a body that stops arriving with 408', async () => {
    const stalled = new ReadableStream<Uint8Array>({
      start(controller) {
        controller.enqueue(new TextEncoder().encode('{"name":'));
      },
    });
    const request = new Request(`${APP}/api/x`, { method: 'POST', body: stalled, duplex: 'half' } as RequestInit);
    const started = Date.now();
    await expect(readBodyWithin(request, JSON_BODY_LIMIT_BYTES, 200)).rejects.toMatchObject({ status: 408 });
    expect(Date.now() - started).toBeLessThan(2_000);
  });
});
