// Sending e-mail over real SMTP to the local mail server started here (port 0), then reading the delivered
// source back and parsing it on our own with mailparser: valid MIME (RFC 5322 message, RFC 2045/2046
// multipart/alternative) with both bodies, the settings link, and the Message-ID derived from the dedupe key.
// No database needed.
import { simpleParser } from 'mailparser';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { startFakeMail, type FakeMail, type StoredMail } from '@/fakes/mail/server';
import { closeEmailTransport, messageIdFor, sendEmail } from '@/lib/notify/email';
import { killWaitOver, stepsMoved } from '@/lib/notify/messages';

let mail: FakeMail;
const savedEnv = { SMTP_URL: process.env.SMTP_URL, MAIL_FROM: process.env.MAIL_FROM };

beforeAll(async () => {
  mail = await startFakeMail({ smtpPort: 0, inboxPort: 0 });
  process.env.SMTP_URL = mail.smtpUrl;
  process.env.MAIL_FROM = 'Sowcast <reminders@sowcast.invalid>';
});

afterAll(async () => {
  closeEmailTransport();
  await mail?.close();
  for (const [k, v] of Object.entries(savedEnv)) {
    if (v === undefined) delete process.env[k];
    else process.env[k] = v;
  }
});

beforeEach(async () => {
  await control('ok');
  await fetch(`${mail.inboxUrl}/api/messages`, { method: 'DELETE' });
});

async function control(mode: 'ok' | 'down', forMs?: number) {
  const res = await fetch(`${mail.inboxUrl}/api/control`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ mode, forMs }),
  });
  expect(res.status).toBe(200);
}

async function inbox(): Promise<StoredMail[]> {
  const res = await fetch(`${mail.inboxUrl}/api/messages`);
  expect(res.status).toBe(200);
  return (await res.json()) as StoredMail[];
}

const message = killWaitOver({
  baseUrl: 'http://127.0.0.1:3999',
  stepId: 'kill-wait-step-1',
  plotName: 'Creekside strip',
  propertyName: 'Hollow Oak Club',
  endsOn: '2027-09-14',
  sprayedOn: '2027-08-31',
  waitDays: 14,
});
const dedupeKey = 'step:kill-wait-step-1|kill-wait-over|user:u-1|email|2027-09-14';

describe('sendEmail over SMTP', () => {
  it('delivers a valid MIME message with text and HTML bodies, the settings link and the derived Message-ID', async () => {
    await sendEmail({ to: 'ann@example.test', ...message, messageId: messageIdFor(dedupeKey) });

    const [stored, ...rest] = await inbox();
    expect(rest).toHaveLength(0);
    expect(stored.to).toEqual(['ann@example.test']);

    // Parse the source as delivered, independently of what the server stored.
    const raw = Buffer.from(await (await fetch(`${mail.inboxUrl}/api/messages/${stored.id}/raw`)).arrayBuffer());
    const parsed = await simpleParser(raw);
    // RFC 2045 §4: a MIME message declares MIME-Version: 1.0.
    expect(parsed.headers.get('mime-version')).toBe('1.0');
    // RFC 2046 §5.1.4: the same content as text and HTML is multipart/alternative.
    const contentType = parsed.headers.get('content-type') as { value: string; params: Record<string, string> };
    expect(contentType.value).toBe('multipart/alternative');
    expect(contentType.params.boundary).toBeTruthy();
    // RFC 5322 §3.6.4: msg-id = "<" id-left "@" id-right ">".
    expect(parsed.messageId).toBe(messageIdFor(dedupeKey));
    expect(parsed.messageId).toMatch(/^<[0-9a-f]{40}@sowcast\.invalid>$/);
    // RFC 5322 §3.6.1: Date is required; §3.6.2: From is required.
    expect(parsed.date).toBeInstanceOf(Date);
    expect(parsed.from?.value[0]).toMatchObject({ address: 'reminders@sowcast.invalid', name: 'Sowcast' });
    // The em dash travels as an RFC 2047 encoded-word and decodes back.
    expect(parsed.subject).toBe('The kill wait on Creekside strip is over — seed or till now');
    expect(raw.toString('latin1')).toMatch(/^Subject: =\?UTF-8\?/m);

    expect(parsed.text).toContain('The kill wait on Creekside strip (Hollow Oak Club) ends today, Tue 14 Sep.');
    expect(parsed.text).toContain('Change what Sowcast sends you: http://127.0.0.1:3999/settings');
    expect(parsed.text).toContain('http://127.0.0.1:3999/steps/kill-wait-step-1');
    expect(parsed.html).toBeTruthy();
    expect(parsed.html).toContain('href="http://127.0.0.1:3999/settings"');
    expect(parsed.html).toContain('href="http://127.0.0.1:3999/steps/kill-wait-step-1"');

    // The server's own parse agrees.
    expect(stored.messageId).toBe(messageIdFor(dedupeKey));
    expect(stored.subject).toBe(parsed.subject);
  });

  it('gives a retried send the same Message-ID, so it is the same message again, not a second one', async () => {
    const id = messageIdFor(dedupeKey);
    expect(messageIdFor(dedupeKey)).toBe(id);
    expect(messageIdFor(`${dedupeKey}-other`)).not.toBe(id);
    await sendEmail({ to: 'ann@example.test', ...message, messageId: id });
    await sendEmail({ to: 'ann@example.test', ...message, messageId: id });
    const ids = (await inbox()).map((m) => m.messageId);
    expect(ids).toEqual([id, id]);
  });

  it('passes extra headers through', async () => {
    await sendEmail({
      to: 'ann@example.test',
      ...message,
      messageId: messageIdFor('headers'),
      headers: { 'List-Unsubscribe': '<http://127.0.0.1:3999/settings>' },
    });
    const [stored] = await inbox();
    expect(stored.headers['list-unsubscribe']).toBe('<http://127.0.0.1:3999/settings>');
  });

  it('rejects while the relay answers 421 (RFC 5321 §4.2.3: service not available), and delivers once it is back', async () => {
    await control('down');
    await expect(sendEmail({ to: 'ann@example.test', ...message, messageId: messageIdFor('retry') })).rejects.toThrow();
    expect(await inbox()).toHaveLength(0);

    await control('ok');
    await sendEmail({ to: 'ann@example.test', ...message, messageId: messageIdFor('retry') });
    const stored = await inbox();
    expect(stored).toHaveLength(1);
    expect(stored[0].messageId).toBe(messageIdFor('retry'));
  });

  it('lets a down spell end by itself after forMs', async () => {
    await control('down', 300);
    await expect(sendEmail({ to: 'ann@example.test', ...message, messageId: messageIdFor('spell') })).rejects.toThrow();
    await new Promise((r) => setTimeout(r, 500));
    await sendEmail({ to: 'ann@example.test', ...message, messageId: messageIdFor('spell') });
    expect(await inbox()).toHaveLength(1);
  });

  it('refuses a malformed Message-ID before talking to the relay', async () => {
    await expect(sendEmail({ to: 'ann@example.test', ...message, messageId: 'no-brackets' })).rejects.toThrow(/Message-ID/);
  });

  it('sends several moves as one message', async () => {
    const moved = stepsMoved({
      baseUrl: 'http://127.0.0.1:3999',
      moves: [
        { stepId: 'a', stepTitle: 'Broadcast seed', plotName: 'North corner', from: '2027-09-16', to: '2027-09-13', reason: '0.6 in of rain forecast Tue 14 Sep' },
        { stepId: 'b', stepTitle: 'Fertilize', plotName: 'Creekside strip', from: '2027-09-15', to: '2027-09-12', reason: 'Rain Tue 14 Sep' },
      ],
    });
    await sendEmail({ to: 'bo@example.test', ...moved, messageId: messageIdFor('moved') });
    const stored = await inbox();
    expect(stored).toHaveLength(1);
    expect(stored[0].text).toContain('Thu 16 Sep → Mon 13 Sep');
    expect(stored[0].text).toContain('Wed 15 Sep → Sun 12 Sep');
  });
});

describe('the local mail server', () => {
  it('accepts AUTH when a client offers it (RFC 4954 PLAIN/LOGIN) and records the user', async () => {
    const url = new URL(mail.smtpUrl);
    url.username = 'worker';
    url.password = 'any-password';
    process.env.SMTP_URL = url.toString();
    try {
      await sendEmail({ to: 'ann@example.test', ...message, messageId: messageIdFor('auth') });
    } finally {
      process.env.SMTP_URL = mail.smtpUrl;
    }
    const [stored] = await inbox();
    expect(stored.authUser).toBe('worker');
  });

  it('refuses a message over its size limit (RFC 1870: 552)', async () => {
    const small = await startFakeMail({ smtpPort: 0, inboxPort: 0, maxMessageBytes: 4000 });
    process.env.SMTP_URL = small.smtpUrl;
    try {
      await expect(
        sendEmail({ to: 'ann@example.test', ...message, text: 'x'.repeat(10_000), messageId: messageIdFor('big') }),
      ).rejects.toThrow(/552|size/i);
      const stored = (await (await fetch(`${small.inboxUrl}/api/messages`)).json()) as StoredMail[];
      expect(stored).toHaveLength(0);
    } finally {
      process.env.SMTP_URL = mail.smtpUrl;
      closeEmailTransport();
      await small.close();
    }
  });

  it('shows the inbox newest first, and a message with its HTML in a sandboxed frame and its text', async () => {
    await sendEmail({ to: 'ann@example.test', ...message, subject: 'First <b>one</b>', messageId: messageIdFor('p1') });
    await sendEmail({ to: 'ann@example.test', ...message, subject: 'Second one', messageId: messageIdFor('p2') });
    const page = await (await fetch(`${mail.inboxUrl}/`)).text();
    expect(page.indexOf('Second one')).toBeLessThan(page.indexOf('First &lt;b&gt;one&lt;/b&gt;'));
    const [first] = await inbox();
    const view = await fetch(`${mail.inboxUrl}/messages/${first.id}`);
    expect(view.status).toBe(200);
    const html = await view.text();
    expect(html).toContain('<iframe sandbox');
    expect(html).toContain('Change what Sowcast sends you: http://127.0.0.1:3999/settings');
    expect((await fetch(`${mail.inboxUrl}/health`)).status).toBe(200);
    expect((await fetch(`${mail.inboxUrl}/messages/nope`)).status).toBe(404);
  });

  it('answers a bad control request with a clear message', async () => {
    const res = await fetch(`${mail.inboxUrl}/api/control`, { method: 'POST', body: JSON.stringify({ mode: 'sideways' }) });
    expect(res.status).toBe(400);
    expect(((await res.json()) as { error: string }).error).toMatch(/mode/);
  });
});
