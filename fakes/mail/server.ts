// A local mail relay for development, the demo and the tests: an SMTP server (smtp-server) that takes every
// message, parses it as MIME (mailparser) and keeps it in memory, and a small web inbox to read what arrived.
// The app reaches it through SMTP_URL like any relay; nothing else knows it is local.
import http, { type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer, type SMTPServerDataStream, type SMTPServerSession } from 'smtp-server';

export interface FakeMailOptions {
  smtpPort?: number; // 0 → any free port
  inboxPort?: number; // 0 → any free port
  maxMessages?: number;
  maxMessageBytes?: number;
}

export interface FakeMail {
  smtpUrl: string;
  inboxUrl: string;
  close(): Promise<void>;
}

export interface StoredMail {
  id: string;
  messageId: string | null;
  /** The From header as written. */
  from: string;
  /** Who the message was delivered to: the SMTP envelope's recipients (RCPT TO), which include any Bcc. */
  to: string[];
  /** The To header's addresses. */
  headerTo: string[];
  subject: string;
  text: string;
  html: string;
  /** Header name (lower case) → unfolded value; repeated headers joined by newlines. */
  headers: Record<string, string>;
  receivedAt: string;
  sizeBytes: number;
  authUser: string | null;
}

type Mode = 'ok' | 'down';

function smtpError(message: string, responseCode: number): Error {
  return Object.assign(new Error(message), { responseCode });
}

function addresses(value: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(value) ? value : value ? [value] : [];
  return list.flatMap((a) => a.value.map((v) => v.address ?? '').filter(Boolean));
}

function escapeHtml(value: string): string {
  return value.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

class Mailbox {
  messages: { mail: StoredMail; raw: Buffer }[] = [];
  mode: Mode = 'ok';
  private downTimer: NodeJS.Timeout | null = null;
  private nextId = 1;

  constructor(private readonly maxMessages: number) {}

  setMode(mode: Mode, forMs?: number) {
    if (this.downTimer) clearTimeout(this.downTimer);
    this.downTimer = null;
    this.mode = mode;
    if (mode === 'down' && forMs) {
      this.downTimer = setTimeout(() => this.setMode('ok'), forMs);
      this.downTimer.unref();
    }
  }

  async store(raw: Buffer, session: SMTPServerSession) {
    const parsed = await simpleParser(raw, { skipImageLinks: true });
    const headers: Record<string, string> = {};
    for (const line of parsed.headerLines) {
      const value = line.line.slice(line.line.indexOf(':') + 1).replace(/\r?\n[ \t]+/g, ' ').trim();
      headers[line.key] = headers[line.key] === undefined ? value : `${headers[line.key]}\n${value}`;
    }
    const mail: StoredMail = {
      id: String(this.nextId++),
      messageId: parsed.messageId ?? null,
      from: parsed.from?.text ?? '',
      to: session.envelope.rcptTo.map((r) => r.address),
      headerTo: addresses(parsed.to),
      subject: parsed.subject ?? '',
      text: parsed.text ?? '',
      html: parsed.html || '',
      headers,
      receivedAt: new Date().toISOString(),
      sizeBytes: raw.length,
      authUser: typeof session.user === 'string' ? session.user : null,
    };
    this.messages.push({ mail, raw });
    if (this.messages.length > this.maxMessages) this.messages.splice(0, this.messages.length - this.maxMessages);
    return mail;
  }

  find(id: string) {
    return this.messages.find((m) => m.mail.id === id);
  }
}

function send(res: ServerResponse, status: number, body: unknown, contentType?: string) {
  const isText = typeof body === 'string' || Buffer.isBuffer(body);
  res.writeHead(status, {
    'Content-Type': contentType ?? (isText ? 'text/html; charset=utf-8' : 'application/json; charset=utf-8'),
    'Cache-Control': 'no-store',
    // A message's HTML is shown in a sandboxed frame; nothing in these pages needs to run scripts.
    'Content-Security-Policy': "script-src 'none'; object-src 'none'",
  });
  res.end(isText ? body : JSON.stringify(body, null, 2));
}

function readJson(req: IncomingMessage): Promise<Record<string, unknown>> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on('data', (c: Buffer) => {
      size += c.length;
      if (size <= 64 * 1024) chunks.push(c);
    });
    req.on('end', () => {
      if (size > 64 * 1024) return reject(new Error('Body too large'));
      const text = Buffer.concat(chunks).toString('utf8');
      try {
        const parsed: unknown = text ? JSON.parse(text) : {};
        if (parsed && typeof parsed === 'object' && !Array.isArray(parsed)) return resolve(parsed as Record<string, unknown>);
      } catch {
        // answered below
      }
      reject(new Error('Expected a JSON object'));
    });
    req.on('error', reject);
  });
}

const PAGE_STYLE =
  'body{font-family:system-ui,sans-serif;margin:24px;color:#4a3b2f;background:#f7f4ec}table{border-collapse:collapse;width:100%}' +
  'td,th{border-bottom:1px solid #d9d2c3;padding:6px 8px;text-align:left;vertical-align:top}a{color:#3d7a3a}' +
  'iframe{width:100%;height:520px;border:1px solid #d9d2c3;background:#fff}pre{white-space:pre-wrap;background:#fff;padding:12px;border:1px solid #d9d2c3}';

function listPage(box: Mailbox, smtpUrl: string): string {
  const rows = [...box.messages]
    .reverse()
    .map(
      ({ mail }) =>
        `<tr><td>${escapeHtml(mail.receivedAt)}</td><td>${escapeHtml(mail.to.join(', '))}</td><td><a href="/messages/${mail.id}">${escapeHtml(mail.subject || '(no subject)')}</a></td></tr>`,
    )
    .join('\n');
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta http-equiv="refresh" content="10"><title>Local inbox</title><style>${PAGE_STYLE}</style></head>
<body><h1>Local inbox</h1>
<p>Every message sent to ${escapeHtml(smtpUrl)}, newest first (${box.messages.length}). SMTP is <strong>${box.mode === 'ok' ? 'accepting' : 'refusing (421)'}</strong>. JSON: <a href="/api/messages">/api/messages</a>.</p>
<table><tr><th>Received</th><th>To</th><th>Subject</th></tr>
${rows || '<tr><td colspan="3">Nothing yet.</td></tr>'}</table></body></html>`;
}

function messagePage(mail: StoredMail): string {
  const headerRows = Object.entries(mail.headers)
    .map(([k, v]) => `<tr><th>${escapeHtml(k)}</th><td>${escapeHtml(v)}</td></tr>`)
    .join('');
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(mail.subject)}</title><style>${PAGE_STYLE}</style></head>
<body><p><a href="/">← Inbox</a> · <a href="/api/messages/${mail.id}/raw">Raw source</a></p>
<h1>${escapeHtml(mail.subject || '(no subject)')}</h1>
<p>To ${escapeHtml(mail.to.join(', '))} · from ${escapeHtml(mail.from)} · ${escapeHtml(mail.receivedAt)}</p>
<h2>HTML</h2>
${mail.html ? `<iframe sandbox title="HTML body" srcdoc="${escapeHtml(mail.html)}"></iframe>` : '<p>No HTML body.</p>'}
<h2>Plain text</h2>
<pre>${escapeHtml(mail.text) || 'No plain-text body.'}</pre>
<h2>Headers</h2><table>${headerRows}</table></body></html>`;
}

async function route(box: Mailbox, smtpUrl: string, req: IncomingMessage, res: ServerResponse) {
  const url = new URL(req.url ?? '/', 'http://127.0.0.1');
  const method = req.method ?? 'GET';
  const parts = url.pathname.split('/').filter(Boolean);

  if (method === 'GET' && url.pathname === '/') return send(res, 200, listPage(box, smtpUrl));
  if (method === 'GET' && url.pathname === '/health') return send(res, 200, { ok: true, mode: box.mode, messages: box.messages.length });
  if (method === 'GET' && parts[0] === 'messages' && parts.length === 2) {
    const found = box.find(parts[1]);
    return found ? send(res, 200, messagePage(found.mail)) : send(res, 404, '<p>No such message.</p>');
  }
  if (parts[0] === 'api' && parts[1] === 'messages') {
    if (parts.length === 2 && method === 'GET') {
      const to = url.searchParams.get('to')?.toLowerCase();
      return send(res, 200, box.messages.map((m) => m.mail).filter((m) => !to || m.to.some((a) => a.toLowerCase() === to)));
    }
    if (parts.length === 2 && method === 'DELETE') {
      box.messages = [];
      return send(res, 200, { cleared: true });
    }
    const found = parts[2] ? box.find(parts[2]) : undefined;
    if (!found) return send(res, 404, { error: 'No such message' });
    if (parts.length === 3 && method === 'GET') return send(res, 200, found.mail);
    if (parts.length === 4 && parts[3] === 'raw' && method === 'GET') return send(res, 200, found.raw, 'message/rfc822');
  }
  if (url.pathname === '/api/control') {
    if (method === 'GET') return send(res, 200, { mode: box.mode });
    if (method === 'POST') {
      let body: Record<string, unknown>;
      try {
        body = await readJson(req);
      } catch (err) {
        return send(res, 400, { error: (err as Error).message });
      }
      const forMs = body.forMs;
      if ((body.mode !== 'ok' && body.mode !== 'down') || (forMs !== undefined && (typeof forMs !== 'number' || !(forMs > 0)))) {
        return send(res, 400, { error: "Expected {mode: 'ok' | 'down', forMs?: positive number}" });
      }
      box.setMode(body.mode, forMs as number | undefined);
      return send(res, 200, { mode: box.mode });
    }
  }
  return send(res, 404, { error: 'Not found' });
}

function listen(server: { listen(port: number, host: string, cb: () => void): unknown; once(e: 'error', l: (err: Error) => void): unknown; off(e: 'error', l: (err: Error) => void): unknown }, port: number) {
  return new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => {
      server.off('error', reject);
      resolve();
    });
  });
}

export async function startFakeMail(options: FakeMailOptions = {}): Promise<FakeMail> {
  const box = new Mailbox(options.maxMessages ?? 5000);
  const maxBytes = options.maxMessageBytes ?? 5 * 1024 * 1024;

  const smtp = new SMTPServer({
    name: 'sowcast-local-mail',
    banner: 'local mail for development; nothing leaves this machine',
    size: maxBytes,
    authOptional: true,
    // Loopback only, so AUTH over plain text is fine; STARTTLS would need a certificate the client trusts.
    allowInsecureAuth: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    // Every client is on loopback; a reverse DNS lookup per connection only adds delay.
    disableReverseLookup: true,
    closeTimeout: 2000,
    onAuth(auth, _session, callback) {
      callback(null, { user: auth.username ?? 'anonymous' });
    },
    onConnect(_session, callback) {
      // RFC 5321 §3.8 / §4.2.3: 421 is "service not available, closing transmission channel", the reply a
      // relay gives when it cannot take mail for now; clients treat it as temporary and try again later.
      if (box.mode === 'down') return callback(smtpError('Service not available, try again later', 421));
      callback();
    },
    onMailFrom(_address, _session, callback) {
      if (box.mode === 'down') return callback(smtpError('Service not available, try again later', 421));
      callback();
    },
    onData(stream: SMTPServerDataStream, session: SMTPServerSession, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        if (stream.sizeExceeded) return callback(smtpError(`Message exceeds the ${maxBytes}-byte limit`, 552));
        box.store(Buffer.concat(chunks), session).then(
          () => callback(),
          (err: Error) => callback(smtpError(`Could not parse the message: ${err.message}`, 554)),
        );
      });
    },
  });
  smtp.on('error', (err) => console.error(`fake SMTP: ${err.message}`));
  await listen(smtp, options.smtpPort ?? Number(process.env.FAKE_SMTP_PORT ?? 2525));
  const smtpPort = (smtp.server.address() as AddressInfo).port;
  const smtpUrl = `smtp://127.0.0.1:${smtpPort}`;

  const inbox = http.createServer((req, res) => {
    route(box, smtpUrl, req, res).catch((err: Error) => {
      if (res.headersSent) res.destroy();
      else send(res, 500, { error: err.message });
    });
  });
  try {
    await listen(inbox, options.inboxPort ?? Number(process.env.FAKE_INBOX_PORT ?? 4020));
  } catch (err) {
    await new Promise<void>((resolve) => smtp.close(() => resolve()));
    throw err;
  }
  const inboxUrl = `http://127.0.0.1:${(inbox.address() as AddressInfo).port}`;

  return {
    smtpUrl,
    inboxUrl,
    close: async () => {
      box.setMode('ok');
      await Promise.all([
        new Promise<void>((resolve) => smtp.close(() => resolve())),
        new Promise<void>((resolve) => {
          inbox.close(() => resolve());
          inbox.closeAllConnections();
        }),
      ]);
    },
  };
}

if (process.argv[1] && import.meta.url === pathToFileURL(path.resolve(process.argv[1])).href) {
  startFakeMail()
    .then((mail) => {
      console.log(`fake SMTP on ${mail.smtpUrl}; inbox at ${mail.inboxUrl}`);
      const stop = () => void mail.close().then(() => process.exit(0));
      process.once('SIGTERM', stop);
      process.once('SIGINT', stop);
    })
    .catch((err: unknown) => {
      console.error(`fake mail could not start: ${(err as Error).message}`);
      process.exit(1);
    });
}
