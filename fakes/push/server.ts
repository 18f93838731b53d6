// A local Web Push service for development, the demo and the tests. It does what a browser vendor's push service
// and a phone do together, over the real protocol:
//   - hands out subscriptions for "virtual devices" (each keeps its own P-256 key pair and auth secret),
//   - receives push messages as RFC 8030 describes (POST to the subscription's endpoint, TTL required),
//   - checks the sender's VAPID token as RFC 8292 describes (ES256 JWT signed by the key in `k`),
//   - decrypts the aes128gcm body as the device would (RFC 8291 on top of RFC 8188, with http_ece),
//   - and lists what arrived, as JSON under /_control and as a page at /.
// It speaks HTTPS because web-push always does; the certificate is self-signed and made with openssl on first start.
import { execFileSync } from 'node:child_process';
import { createECDH, createPublicKey, randomBytes, randomUUID, verify, type ECDH } from 'node:crypto';
import fs from 'node:fs';
import type { IncomingMessage, ServerResponse } from 'node:http';
import https from 'node:https';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { decrypt } from 'http_ece';

export interface FakePushOptions {
  port?: number; // 0 → any free port
  dir?: string; // where cert.pem and key.pem live
  maxMessages?: number;
}

export interface FakePush {
  url: string;
  certPath: string;
  close(): Promise<void>;
}

interface VirtualDevice {
  id: string;
  label: string;
  createdAt: string;
  gone: boolean;
  ecdh: ECDH;
  p256dh: string; // base64url uncompressed point
  auth: string; // base64url, 16 bytes
  /** RFC 8292 §3.2: a subscription made with an application server key only takes messages signed by it. */
  applicationServerKey: string | null;
}

export interface ReceivedPush {
  id: string;
  subscriptionId: string;
  label: string;
  /** The decrypted payload, parsed as JSON when it is JSON. */
  payload: unknown;
  payloadText: string | null;
  /** The request body exactly as it arrived (aes128gcm coded), base64. */
  rawBody: string;
  ttl: number;
  urgency: string;
  topic: string | null;
  receivedAt: string;
  vapid: { subject: string; audience: string; expiresAt: string; publicKey: string };
}

// RFC 8291 §4: a push service need not accept more than 4096 octets of payload body.
const MAX_BODY_BYTES = 4096;
const MAX_CONTROL_BYTES = 64 * 1024;
// RFC 8292 §2: the JWT's exp MUST NOT be more than 24 hours from the time of the request.
const MAX_JWT_LIFETIME_S = 24 * 3600;
const URGENCIES = new Set(['very-low', 'low', 'normal', 'high']); // RFC 8030 §5.3
const TOPIC = /^[A-Za-z0-9_-]{1,32}$/; // RFC 8030 §5.4

class HttpProblem extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly headers: Record<string, string> = {},
  ) {
    super(message);
  }
}

/** Makes (once) and returns the self-signed certificate for 127.0.0.1. */
export function ensureCertificate(dir: string): { certPath: string; keyPath: string } {
  const certPath = path.join(dir, 'cert.pem');
  const keyPath = path.join(dir, 'key.pem');
  if (fs.existsSync(certPath) && fs.existsSync(keyPath)) return { certPath, keyPath };
  fs.mkdirSync(dir, { recursive: true });
  const tmp = fs.mkdtempSync(path.join(dir, '.new-'));
  try {
    const tmpCert = path.join(tmp, 'cert.pem');
    const tmpKey = path.join(tmp, 'key.pem');
    try {
      execFileSync(
        process.env.OPENSSL || 'openssl',
        [
          'req', '-x509', '-newkey', 'ec', '-pkeyopt', 'ec_paramgen_curve:prime256v1', '-nodes', '-days', '3650',
          '-subj', '/CN=127.0.0.1', '-addext', 'subjectAltName=IP:127.0.0.1',
          '-keyout', tmpKey, '-out', tmpCert,
        ],
        { stdio: ['ignore', 'ignore', 'pipe'] },
      );
    } catch (err) {
      const stderr = (err as { stderr?: Buffer }).stderr?.toString().trim();
      throw new Error(`Could not make the fake push service's certificate with openssl${stderr ? `: ${stderr}` : ''}`);
    }
    fs.chmodSync(tmpKey, 0o600);
    // Key first, certificate last: the certificate's presence is what says "ready".
    fs.renameSync(tmpKey, keyPath);
    fs.renameSync(tmpCert, certPath);
  } finally {
    fs.rmSync(tmp, { recursive: true, force: true });
  }
  return { certPath, keyPath };
}

const b64url = (buf: Buffer) => buf.toString('base64url');

function escapeHtml(value: string): string {
  return value.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

function header(req: IncomingMessage, name: string): string | undefined {
  const value = req.headers[name.toLowerCase()];
  return Array.isArray(value) ? value.join(', ') : value;
}

function readBody(req: IncomingMessage, limit: number): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const declared = Number(header(req, 'content-length') ?? 0);
    if (declared > limit) {
      req.resume();
      reject(new HttpProblem(413, `Body of ${declared} bytes is over the ${limit}-byte limit`));
      return;
    }
    const chunks: Buffer[] = [];
    let size = 0;
    req.on('data', (chunk: Buffer) => {
      size += chunk.length;
      if (size > limit) {
        reject(new HttpProblem(413, `Body is over the ${limit}-byte limit`));
        req.resume();
        return;
      }
      chunks.push(chunk);
    });
    req.on('end', () => resolve(Buffer.concat(chunks)));
    req.on('error', reject);
  });
}

async function readJson(req: IncomingMessage): Promise<Record<string, unknown>> {
  const body = await readBody(req, MAX_CONTROL_BYTES);
  if (body.length === 0) return {};
  try {
    const parsed: unknown = JSON.parse(body.toString('utf8'));
    if (parsed && typeof parsed === 'object' && !Array.isArray(parsed)) return parsed as Record<string, unknown>;
  } catch {
    // answered below
  }
  throw new HttpProblem(400, 'Expected a JSON object');
}

function decodeJsonPart(part: string, what: string): Record<string, unknown> {
  try {
    const parsed: unknown = JSON.parse(Buffer.from(part, 'base64url').toString('utf8'));
    if (parsed && typeof parsed === 'object') return parsed as Record<string, unknown>;
  } catch {
    // answered below
  }
  throw new HttpProblem(403, `VAPID token ${what} is not base64url JSON`);
}

/**
 * RFC 8292 §3: `Authorization: vapid t=<JWT>, k=<public key>`. Absent → 401 (§4.2); present but wrong → 403.
 */
export function checkVapid(authorization: string | undefined, audience: string, nowMs: number) {
  const challenge = { 'WWW-Authenticate': 'vapid' };
  if (!authorization) throw new HttpProblem(401, 'Missing Authorization: vapid t=…, k=… (RFC 8292)', challenge);
  const scheme = /^vapid\s+(.+)$/i.exec(authorization.trim());
  if (!scheme) throw new HttpProblem(401, 'Authorization must use the "vapid" scheme (RFC 8292 §3)', challenge);
  const params = new Map<string, string>();
  for (const piece of scheme[1].split(',')) {
    const eq = piece.indexOf('=');
    if (eq > 0) params.set(piece.slice(0, eq).trim().toLowerCase(), piece.slice(eq + 1).trim().replace(/^"|"$/g, ''));
  }
  const token = params.get('t');
  const k = params.get('k');
  if (!token || !k) throw new HttpProblem(401, 'The vapid Authorization needs both t (token) and k (key)', challenge);

  const parts = token.split('.');
  if (parts.length !== 3) throw new HttpProblem(403, 'VAPID token is not a JWS compact serialization');
  const [h, p, s] = parts;
  const jwtHeader = decodeJsonPart(h, 'header');
  if (jwtHeader.alg !== 'ES256') throw new HttpProblem(403, `VAPID token must be signed with ES256, not ${String(jwtHeader.alg)}`);

  const point = Buffer.from(k, 'base64url');
  if (point.length !== 65 || point[0] !== 0x04) throw new HttpProblem(403, 'k must be an uncompressed P-256 point, base64url');
  let publicKey;
  try {
    publicKey = createPublicKey({
      key: { kty: 'EC', crv: 'P-256', x: b64url(point.subarray(1, 33)), y: b64url(point.subarray(33)) },
      format: 'jwk',
    });
  } catch {
    throw new HttpProblem(403, 'k is not a point on P-256');
  }
  // JWS ES256 signatures are r||s, 32 bytes each (RFC 7518 §3.4), which is Node's 'ieee-p1363' encoding.
  const signature = Buffer.from(s, 'base64url');
  const valid =
    signature.length === 64 && verify('sha256', Buffer.from(`${h}.${p}`), { key: publicKey, dsaEncoding: 'ieee-p1363' }, signature);
  if (!valid) throw new HttpProblem(403, 'VAPID token signature does not verify with k');

  const claims = decodeJsonPart(p, 'claims');
  if (claims.aud !== audience) throw new HttpProblem(403, `VAPID aud must be the push service origin ${audience}, got ${String(claims.aud)}`);
  const nowS = Math.floor(nowMs / 1000);
  if (typeof claims.exp !== 'number' || !Number.isInteger(claims.exp)) throw new HttpProblem(403, 'VAPID exp must be an integer');
  if (claims.exp <= nowS) throw new HttpProblem(403, 'VAPID token has expired');
  if (claims.exp > nowS + MAX_JWT_LIFETIME_S) throw new HttpProblem(403, 'VAPID exp is more than 24 hours ahead (RFC 8292 §2)');
  if (typeof claims.sub !== 'string' || !/^(mailto:|https:)/.test(claims.sub)) {
    throw new HttpProblem(403, 'VAPID sub must be a mailto: or https: contact (RFC 8292 §2.1)');
  }
  return { subject: claims.sub, audience: claims.aud as string, expiresAt: new Date(claims.exp * 1000).toISOString(), publicKey: k };
}

class PushService {
  readonly devices = new Map<string, VirtualDevice>();
  messages: ReceivedPush[] = [];
  url = '';

  constructor(private readonly maxMessages: number) {}

  createDevice(input: Record<string, unknown>) {
    const label = input.label === undefined ? 'device' : input.label;
    if (typeof label !== 'string' || label.trim() === '' || label.length > 200) {
      throw new HttpProblem(400, 'label must be a non-empty string of at most 200 characters');
    }
    const key = input.applicationServerKey;
    if (key !== undefined && key !== null && (typeof key !== 'string' || Buffer.from(key, 'base64url').length !== 65)) {
      throw new HttpProblem(400, 'applicationServerKey must be an uncompressed P-256 public key, base64url');
    }
    const ecdh = createECDH('prime256v1');
    ecdh.generateKeys();
    const device: VirtualDevice = {
      id: randomUUID(),
      label: label.trim(),
      createdAt: new Date().toISOString(),
      gone: false,
      ecdh,
      p256dh: b64url(ecdh.getPublicKey()),
      auth: b64url(randomBytes(16)), // RFC 8291 §3.2: a 16-octet authentication secret
      applicationServerKey: typeof key === 'string' ? key : null,
    };
    this.devices.set(device.id, device);
    return device;
  }

  subscriptionJson(d: VirtualDevice) {
    return { id: d.id, label: d.label, endpoint: `${this.url}/push/${d.id}`, expirationTime: null, keys: { p256dh: d.p256dh, auth: d.auth } };
  }

  async receive(req: IncomingMessage, id: string): Promise<ReceivedPush> {
    const device = this.devices.get(id);
    // RFC 8030 §7.3: an expired or unknown subscription answers 404 or 410.
    if (!device) throw new HttpProblem(404, 'No such subscription');
    if (device.gone) throw new HttpProblem(410, 'This subscription is gone');

    const vapid = checkVapid(header(req, 'authorization'), this.url, Date.now());
    if (device.applicationServerKey && device.applicationServerKey !== vapid.publicKey) {
      throw new HttpProblem(403, 'This subscription was made for another application server key (RFC 8292 §4.1)');
    }

    const ttlHeader = header(req, 'ttl');
    if (ttlHeader === undefined || !/^\d+$/.test(ttlHeader.trim())) {
      throw new HttpProblem(400, 'A TTL header with a number of seconds is required (RFC 8030 §5.2)');
    }
    const urgency = (header(req, 'urgency') ?? 'normal').trim().toLowerCase();
    if (!URGENCIES.has(urgency)) throw new HttpProblem(400, 'Urgency must be very-low, low, normal or high (RFC 8030 §5.3)');
    const topic = header(req, 'topic')?.trim() ?? null;
    if (topic !== null && !TOPIC.test(topic)) {
      throw new HttpProblem(400, 'Topic must be at most 32 characters of the base64url alphabet (RFC 8030 §5.4)');
    }

    const body = await readBody(req, MAX_BODY_BYTES);
    let payloadText: string | null = null;
    let payload: unknown = null;
    if (body.length > 0) {
      const encoding = header(req, 'content-encoding')?.trim().toLowerCase();
      if (encoding !== 'aes128gcm') {
        throw new HttpProblem(415, 'Content-Encoding must be aes128gcm (RFC 8291 §4)');
      }
      // RFC 8291 §4: the header's keyid is the sender's 65-octet ephemeral public key.
      if (body.length < 21 || body[20] !== 65) throw new HttpProblem(400, 'aes128gcm header must carry a 65-octet keyid (RFC 8291 §4)');
      let plain: Buffer;
      try {
        plain = decrypt(body, { version: 'aes128gcm', privateKey: device.ecdh, authSecret: device.auth });
      } catch (err) {
        throw new HttpProblem(400, `The payload does not decrypt for this subscription: ${(err as Error).message}`);
      }
      payloadText = plain.toString('utf8');
      try {
        payload = JSON.parse(payloadText);
      } catch {
        payload = payloadText;
      }
    }

    const message: ReceivedPush = {
      id: randomUUID(),
      subscriptionId: device.id,
      label: device.label,
      payload,
      payloadText,
      rawBody: body.toString('base64'),
      ttl: Number(ttlHeader),
      urgency,
      topic,
      receivedAt: new Date().toISOString(),
      vapid,
    };
    this.messages.push(message);
    if (this.messages.length > this.maxMessages) this.messages.splice(0, this.messages.length - this.maxMessages);
    return message;
  }
}

function send(res: ServerResponse, status: number, body: unknown, headers: Record<string, string> = {}) {
  const text = typeof body === 'string' ? body : JSON.stringify(body, null, 2);
  res.writeHead(status, {
    'Content-Type': typeof body === 'string' ? 'text/html; charset=utf-8' : 'application/json; charset=utf-8',
    'Cache-Control': 'no-store',
    ...headers,
  });
  res.end(text);
}

function page(service: PushService): string {
  const messages = [...service.messages].reverse();
  const devices = [...service.devices.values()];
  const row = (m: ReceivedPush) => {
    const p = (m.payload && typeof m.payload === 'object' ? m.payload : {}) as Record<string, unknown>;
    const title = typeof p.title === 'string' ? p.title : (m.payloadText ?? '(no payload)');
    const body = typeof p.body === 'string' ? p.body : '';
    const link = typeof p.url === 'string' ? `<a href="${escapeHtml(p.url)}">${escapeHtml(p.url)}</a>` : '';
    return `<tr><td>${escapeHtml(m.receivedAt)}</td><td>${escapeHtml(m.label)}</td><td><strong>${escapeHtml(title)}</strong><br>${escapeHtml(body)}<br>${link}</td><td>${m.urgency}, TTL ${m.ttl} s</td></tr>`;
  };
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta http-equiv="refresh" content="10"><title>Local push service</title>
<style>body{font-family:system-ui,sans-serif;margin:24px;color:#4a3b2f;background:#f7f4ec}table{border-collapse:collapse;width:100%;margin-bottom:28px}
td,th{border-bottom:1px solid #d9d2c3;padding:6px 8px;text-align:left;vertical-align:top}code{font-size:12px}</style></head>
<body><h1>Local push service</h1>
<p>Notifications received for the virtual devices below, newest first. JSON: <a href="/_control/messages">/_control/messages</a>.</p>
<h2>Received (${messages.length})</h2>
<table><tr><th>Received</th><th>Device</th><th>Notification</th><th>Delivery</th></tr>
${messages.map(row).join('\n') || '<tr><td colspan="4">Nothing yet.</td></tr>'}</table>
<h2>Virtual devices (${devices.length})</h2>
<table><tr><th>Label</th><th>Endpoint</th><th>State</th></tr>
${devices.map((d) => `<tr><td>${escapeHtml(d.label)}</td><td><code>${escapeHtml(service.subscriptionJson(d).endpoint)}</code></td><td>${d.gone ? 'gone' : 'active'}</td></tr>`).join('\n') || '<tr><td colspan="3">None yet.</td></tr>'}</table>
</body></html>`;
}

async function route(service: PushService, req: IncomingMessage, res: ServerResponse) {
  const url = new URL(req.url ?? '/', service.url);
  const parts = url.pathname.split('/').filter(Boolean);
  const method = req.method ?? 'GET';

  if (method === 'POST' && parts[0] === 'push' && parts.length === 2) {
    const message = await service.receive(req, parts[1]);
    // RFC 8030 §5: 201 Created, with the push message resource in Location.
    return send(res, 201, { id: message.id }, { Location: `${service.url}/_control/messages/${message.id}` });
  }
  if (method === 'GET' && url.pathname === '/') return send(res, 200, page(service));
  if (method === 'GET' && url.pathname === '/health') {
    return send(res, 200, { ok: true, subscriptions: service.devices.size, messages: service.messages.length });
  }
  if (parts[0] !== '_control') throw new HttpProblem(404, 'Not found');

  const [, what, id, action] = parts;
  if (what === 'subscriptions') {
    if (method === 'POST' && !id) {
      const device = service.createDevice(await readJson(req));
      return send(res, 201, service.subscriptionJson(device));
    }
    if (method === 'GET' && !id) {
      return send(res, 200, [...service.devices.values()].map((d) => ({ ...service.subscriptionJson(d), gone: d.gone, createdAt: d.createdAt })));
    }
    const device = id ? service.devices.get(id) : undefined;
    if (!device) throw new HttpProblem(404, 'No such subscription');
    if (method === 'POST' && action === 'gone') {
      device.gone = true;
      return send(res, 200, { id: device.id, gone: true });
    }
    // Only a fake can do this: hand out the device's private key so a test can decrypt a body on its own.
    if (method === 'GET' && action === 'private-key') {
      return send(res, 200, { id: device.id, privateKey: b64url(device.ecdh.getPrivateKey()), p256dh: device.p256dh, auth: device.auth });
    }
  }
  if (what === 'messages') {
    if (method === 'GET' && !id) {
      const label = url.searchParams.get('label');
      const subscriptionId = url.searchParams.get('subscriptionId');
      return send(
        res,
        200,
        service.messages.filter((m) => (!label || m.label === label) && (!subscriptionId || m.subscriptionId === subscriptionId)),
      );
    }
    if (method === 'GET' && id) {
      const message = service.messages.find((m) => m.id === id);
      if (!message) throw new HttpProblem(404, 'No such message');
      return send(res, 200, message);
    }
    if (method === 'DELETE' && !id) {
      service.messages = [];
      return send(res, 200, { cleared: true });
    }
  }
  if (what === 'reset' && method === 'POST') {
    service.messages = [];
    service.devices.clear();
    return send(res, 200, { reset: true });
  }
  throw new HttpProblem(404, 'Not found');
}

export async function startFakePush(options: FakePushOptions = {}): Promise<FakePush> {
  const dir = path.resolve(options.dir ?? process.env.FAKE_PUSH_DIR ?? '.data/fake-push');
  const { certPath, keyPath } = ensureCertificate(dir);
  const service = new PushService(options.maxMessages ?? 5000);
  const server = https.createServer({ cert: fs.readFileSync(certPath), key: fs.readFileSync(keyPath) }, (req, res) => {
    route(service, req, res).catch((err: unknown) => {
      if (res.headersSent) return res.destroy();
      if (err instanceof HttpProblem) send(res, err.status, { error: err.message }, err.headers);
      else send(res, 500, { error: (err as Error).message });
    });
  });
  const port = options.port ?? Number(process.env.FAKE_PUSH_PORT ?? 4030);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => {
      server.off('error', reject);
      resolve();
    });
  });
  service.url = `https://127.0.0.1:${(server.address() as AddressInfo).port}`;
  return {
    url: service.url,
    certPath,
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}

if (process.argv[1] && import.meta.url === pathToFileURL(path.resolve(process.argv[1])).href) {
  startFakePush()
    .then((push) => {
      console.log(`fake push service on ${push.url} (page at ${push.url}/ ; certificate ${push.certPath} — trust it with NODE_EXTRA_CA_CERTS)`);
      const stop = () => void push.close().then(() => process.exit(0));
      process.once('SIGTERM', stop);
      process.once('SIGINT', stop);
    })
    .catch((err: unknown) => {
      console.error(`fake push service could not start: ${(err as Error).message}`);
      process.exit(1);
    });
}
