// Request bodies over real HTTP against the running server: a JSON body is refused while it streams, once it
// passes 1 MB (413, RFC 9110 §15.5.14), not after all of it has arrived; a body that stops arriving is cut
// after 30 s (408, RFC 9110 §15.5.9). Sent with node:http so the test controls every byte and sees how much
// was taken before the answer. Also the security headers every API answer carries (OWASP HTTP Headers
// Cheat Sheet: nosniff, Referrer-Policy, Permissions-Policy; CSP Level 3 frame-ancestors).
import http from 'node:http';
import { beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, SESSION_COOKIE, signedInUser, type Client } from '../support/http';

let owner: Client;

beforeAll(async () => {
  owner = (await signedInUser('limits')).client;
});

interface Sent {
  status: number;
  body: string;
  /** Bytes written into the socket when the answer's head arrived. */
  bytesWrittenAtAnswer: number;
  finishedSending: boolean;
  elapsedMs: number;
}

/** POSTs `totalBytes` of JSON-looking text in 64 KiB chunks, waiting for the socket to drain between them. */
function streamBody(path: string, totalBytes: number, headers: Record<string, string>, stallAfterBytes?: number): Promise<Sent> {
  const url = new URL(`${baseUrl()}${path}`);
  const chunk = Buffer.alloc(64 * 1024, 0x20);
  const started = Date.now();
  return new Promise((resolve, reject) => {
    let written = 0;
    let answered = false;
    const request = http.request({ host: url.hostname, port: url.port, path: url.pathname, method: 'POST', headers }, (response) => {
      answered = true;
      const at = request.socket?.bytesWritten ?? written;
      let body = '';
      response.setEncoding('utf8');
      response.on('data', (d: string) => (body += d));
      response.on('end', () => {
        resolve({ status: response.statusCode ?? 0, body, bytesWrittenAtAnswer: at, finishedSending: written >= totalBytes, elapsedMs: Date.now() - started });
        request.destroy();
      });
    });
    request.on('error', (error) => {
      if (!answered) reject(error);
    });
    request.write('{"name":"');
    const pump = () => {
      while (!answered && written < totalBytes) {
        if (stallAfterBytes !== undefined && written >= stallAfterBytes) return;
        written += chunk.byteLength;
        if (!request.write(chunk)) return void request.once('drain', pump);
      }
      if (!answered && stallAfterBytes === undefined) request.end('"}');
    };
    pump();
  });
}

const sessionHeaders = () => ({
  'content-type': 'application/json',
  cookie: `${SESSION_COOKIE}=${owner.cookie(SESSION_COOKIE)}`,
  origin: baseUrl(),
  'x-forwarded-for': owner.address ?? '10.0.0.1',
});

describe('JSON body limits', () => {
  // Each body below stops arriving part-way. Reading it in full before checking its size (as request.text()
  // does) would wait for an end that never comes; an answer while it is stalled proves the check streams.
  it('refuses a chunked JSON body with 413 as soon as it passes 1 MB, while the rest of 50 MB is still to come', async () => {
    const sent = await streamBody('/api/properties', 50 * 1024 * 1024, { ...sessionHeaders(), 'transfer-encoding': 'chunked' }, 2 * 1024 * 1024);
    expect(sent.status, sent.body).toBe(413);
    expect(JSON.parse(sent.body).error).toMatch(/too large/);
    expect(sent.finishedSending).toBe(false);
    expect(sent.bytesWrittenAtAnswer).toBeLessThanOrEqual(2 * 1024 * 1024 + 64 * 1024);
    expect(sent.elapsedMs).toBeLessThan(20_000);
  }, 60_000);

  it('refuses a declared Content-Length of 50 MB at once, before reading the body', async () => {
    const sent = await streamBody('/api/properties', 50 * 1024 * 1024, { ...sessionHeaders(), 'content-length': String(50 * 1024 * 1024 + 11) }, 64 * 1024);
    expect(sent.status, sent.body).toBe(413);
    expect(sent.finishedSending).toBe(false);
    expect(sent.elapsedMs).toBeLessThan(20_000);
  }, 60_000);

  it('cuts a body that stops arriving with 408 after 30 s (it was never cut)', async () => {
    // Half the limit declared, a tenth of it sent, then nothing.
    const sent = await streamBody('/api/properties', 500_000, { ...sessionHeaders(), 'content-length': String(500_000 + 11) }, 50_000);
    expect(sent.status, sent.body).toBe(408);
    expect(JSON.parse(sent.body).error).toMatch(/did not arrive within 30 s/);
    expect(sent.elapsedMs).toBeGreaterThanOrEqual(29_000);
    expect(sent.elapsedMs).toBeLessThan(45_000);
  }, 60_000);
});

describe('security headers on API answers', () => {
  it('JSON, errors and CSV alike: nosniff, a sandboxed CSP that forbids framing, Referrer-Policy, Permissions-Policy', async () => {
    for (const res of [await owner.get('/api/properties'), await owner.get('/api/properties/not-an-id'), await owner.get('/api/health')]) {
      expect(res.headers.get('x-content-type-options')).toBe('nosniff');
      expect(res.headers.get('content-security-policy')).toMatch(/default-src 'none'.*frame-ancestors 'none'/);
      expect(res.headers.get('referrer-policy')).toBe('strict-origin-when-cross-origin');
      expect(res.headers.get('permissions-policy')).toMatch(/geolocation=\(\)/);
      // The test server's public address is http: HSTS would be wrong there (RFC 6797 §7.2).
      expect(res.headers.get('strict-transport-security')).toBeNull();
    }
  });
});
