// The words of Sowcast's e-mails and notifications: what each must say, the links it must carry, and that
// names people type cannot inject markup or headers.
import { simpleParser } from 'mailparser';
import { describe, expect, it } from 'vitest';
import {
  checkGermination,
  formatLocalDate,
  invitation,
  killWaitOver,
  morningDigest,
  stepDue,
  stepsMoved,
  type NotifyMessage,
} from '@/lib/notify/messages';

const baseUrl = 'https://sowcast.example.test/';
const settings = 'https://sowcast.example.test/settings';
const settingsLine = `Change what Sowcast sends you: ${settings}`;

function expectSettingsLink(m: NotifyMessage) {
  expect(m.text).toContain(settingsLine);
  expect(m.html).toContain('Change what Sowcast sends you:');
  expect(m.html).toContain(`href="${settings}"`);
}

/**
 * How a mail client sees an HTML body as text: mailparser turns an HTML-only message into text with
 * html-to-text, which drops <script> elements. Escaped markup survives as visible characters; live markup
 * would vanish or turn into elements.
 */
async function htmlAsText(html: string): Promise<string> {
  const raw = `MIME-Version: 1.0\r\nContent-Type: text/html; charset=utf-8\r\nContent-Transfer-Encoding: base64\r\n\r\n${Buffer.from(html).toString('base64')}\r\n`;
  return (await simpleParser(raw)).text ?? '';
}

describe('formatLocalDate', () => {
  it('writes a local date as "Tue 14 Sep", the weekday agreeing with ICU\'s Gregorian calendar (Intl)', () => {
    for (const date of ['2027-09-14', '2027-03-14', '2028-02-29', '2027-11-07', '2027-01-01']) {
      const utc = new Date(`${date}T12:00:00Z`);
      const weekday = new Intl.DateTimeFormat('en-US', { weekday: 'short', timeZone: 'UTC' }).format(utc);
      const day = utc.getUTCDate();
      const month = new Intl.DateTimeFormat('en-US', { month: 'short', timeZone: 'UTC' }).format(utc);
      expect(formatLocalDate(date)).toBe(`${weekday} ${day} ${month}`);
    }
    expect(formatLocalDate('2027-09-14')).toBe('Tue 14 Sep');
  });

  it('refuses what is not a calendar date', () => {
    expect(() => formatLocalDate('2027-02-29')).toThrow(/not a calendar date/);
    expect(() => formatLocalDate('14/09/2027')).toThrow(/YYYY-MM-DD/);
  });
});

describe('kill wait over', () => {
  const m = killWaitOver({
    baseUrl,
    stepId: 'step-1',
    plotName: 'Creekside strip',
    propertyName: 'Hollow Oak Club',
    endsOn: '2027-09-14',
    sprayedOn: '2027-08-31',
    waitDays: 14,
    next: { title: 'Broadcast seed', date: '2027-09-15' },
  });

  it('says the wait on the plot is over and what to do now', () => {
    expect(m.subject).toBe('The kill wait on Creekside strip is over — seed or till now');
    expect(m.text).toContain('The kill wait on Creekside strip (Hollow Oak Club) ends today, Tue 14 Sep.');
    expect(m.text).toContain('The burndown went on Tue 31 Aug and has had its 14 days.');
    expect(m.text).toContain('Next step: Broadcast seed, Wed 15 Sep.');
    expect(m.html).toContain('Creekside strip (Hollow Oak Club)');
  });

  it('links to the step in both bodies and the notification, and to settings', () => {
    expect(m.text).toContain('Open the step: https://sowcast.example.test/steps/step-1');
    expect(m.html).toContain('href="https://sowcast.example.test/steps/step-1"');
    expect(m.push).toEqual({
      title: 'Kill wait over: Creekside strip',
      body: 'Seed or till now. Hollow Oak Club',
      url: 'https://sowcast.example.test/steps/step-1',
      tag: 'kill-wait:step-1',
    });
    expectSettingsLink(m);
  });
});

describe('steps moved', () => {
  const moves = [
    {
      stepId: 'seed-north',
      stepTitle: 'Broadcast seed',
      plotName: 'North corner',
      propertyName: 'Hollow Oak Club',
      from: '2027-09-16',
      to: '2027-09-13',
      reason: '0.6 in of rain forecast Tue 14 Sep; seed the day before',
    },
    {
      stepId: 'fert-creek',
      stepTitle: 'Fertilize',
      plotName: 'Creekside strip',
      propertyName: 'Hollow Oak Club',
      from: '2027-09-15',
      to: '2027-09-12',
      reason: 'Rain Tue 14 Sep will carry the fertilizer into the seedbed',
    },
  ];

  it('puts several moves into one message, each with old → new dates and its reason', () => {
    const m = stepsMoved({ baseUrl, moves });
    expect(m.subject).toBe('2 steps moved: Creekside strip, North corner');
    expect(m.text).toContain('Fertilize — Creekside strip (Hollow Oak Club)\n  Wed 15 Sep → Sun 12 Sep\n  Why: Rain Tue 14 Sep will carry the fertilizer into the seedbed');
    expect(m.text).toContain('Broadcast seed — North corner (Hollow Oak Club)\n  Thu 16 Sep → Mon 13 Sep\n  Why: 0.6 in of rain forecast Tue 14 Sep; seed the day before');
    // Soonest new date first.
    expect(m.text.indexOf('Creekside strip')).toBeLessThan(m.text.indexOf('North corner'));
    expect(m.text).toContain('https://sowcast.example.test/steps/seed-north');
    expect(m.text).toContain('https://sowcast.example.test/steps/fert-creek');
    expect(m.html).toContain('Wed 15 Sep → Sun 12 Sep');
    expect(m.html).toContain('Why: 0.6 in of rain forecast Tue 14 Sep; seed the day before');
    expect(m.push.title).toBe('2 steps moved');
    expect(m.push.body).toBe('Creekside strip: Fertilize Wed 15 Sep → Sun 12 Sep; North corner: Broadcast seed Thu 16 Sep → Mon 13 Sep');
    expect(m.push.url).toBe('https://sowcast.example.test/steps/fert-creek');
    expectSettingsLink(m);
  });

  it('names the step and its new date when only one moved', () => {
    const m = stepsMoved({ baseUrl, moves: [moves[0]] });
    expect(m.subject).toBe('Broadcast seed on North corner moved to Mon 13 Sep');
    expect(m.push.body).toBe('Thu 16 Sep → Mon 13 Sep. 0.6 in of rain forecast Tue 14 Sep; seed the day before');
    expect(m.push.url).toBe('https://sowcast.example.test/steps/seed-north');
    expectSettingsLink(m);
  });

  it('gives the same tag whatever order the moves come in, so a phone replaces rather than stacks', () => {
    expect(stepsMoved({ baseUrl, moves }).push.tag).toBe(stepsMoved({ baseUrl, moves: [...moves].reverse() }).push.tag);
  });

  it('refuses an empty list', () => {
    expect(() => stepsMoved({ baseUrl, moves: [] })).toThrow(/at least one move/);
  });
});

describe('check germination', () => {
  const m = checkGermination({
    baseUrl,
    plotId: 'plot-7',
    stepId: 'step-3',
    plotName: 'North corner',
    propertyName: 'Hollow Oak Club',
    date: '2027-09-24',
    seededOn: '2027-09-13',
  });

  it('asks for the check today and opens the check form for that step', () => {
    expect(m.subject).toBe('Check germination on North corner today');
    expect(m.push.title).toBe('Check germination on North corner today');
    expect(m.push.url).toBe('https://sowcast.example.test/plots/plot-7/check?step=step-3');
    expect(m.text).toContain('North corner (Hollow Oak Club) was seeded on Mon 13 Sep. Today, Fri 24 Sep, is the day to see what came up.');
    expect(m.text).toContain('Record the check: https://sowcast.example.test/plots/plot-7/check?step=step-3');
    expectSettingsLink(m);
  });
});

describe('step due', () => {
  const spray = {
    baseUrl,
    stepId: 'spray-1',
    stepTitle: 'Spray the burndown',
    plotName: 'Creekside strip',
    propertyName: 'Hollow Oak Club',
    date: '2027-08-31',
    hours: { start: '09:00', end: '13:00' },
    carry: ['2 sprayer fills of 4 gal, 10 fl oz of product in each'],
    cautions: ['The label is the law: read it and follow it.', 'Wear the protective equipment the label lists.'],
  };

  it('says tomorrow or today, with the hours, what to carry and the cautions', () => {
    const tomorrow = stepDue({ ...spray, when: 'tomorrow' });
    expect(tomorrow.subject).toBe('Tomorrow: Spray the burndown on Creekside strip');
    expect(tomorrow.text).toContain('Spray the burndown on Creekside strip (Hollow Oak Club) is due tomorrow, Tue 31 Aug, best between 09:00 and 13:00.');
    expect(tomorrow.text).toContain('- 2 sprayer fills of 4 gal, 10 fl oz of product in each');
    expect(tomorrow.text).toContain('! The label is the law: read it and follow it.');
    expect(tomorrow.html).toContain('Wear the protective equipment the label lists.');
    expect(tomorrow.push.url).toBe('https://sowcast.example.test/steps/spray-1');
    expectSettingsLink(tomorrow);

    const today = stepDue({ ...spray, when: 'today' });
    expect(today.subject).toBe('Today: Spray the burndown on Creekside strip');
    expect(today.text).toContain('is due today, Tue 31 Aug');
    expectSettingsLink(today);
  });

  it('says why the step sits on its day and carries the engine’s warnings, as the plan words them', () => {
    // The lime step's words from lib/schedule/rules/lime-timing.ts (the "lime now" wording).
    const lime = stepDue({
      baseUrl,
      when: 'today',
      stepId: 'lime-1',
      stepTitle: 'Lime',
      plotName: 'Creekside strip',
      propertyName: 'Hollow Oak Club',
      date: '2027-08-31',
      carry: ['2,000 lb of lime — 40 bags'],
      reason: 'lime now; it needs months to react — expect the full effect next season; spread it on the surface, where it works down slowly',
      warnings: ['Lime only 14 days before seeding: it needs 3–6 months to react, so this stand gets only part of its effect; expect the full effect next season.'],
    });
    expect(lime.text).toContain('Why this day: lime now; it needs months to react — expect the full effect next season');
    expect(lime.text).toContain('! Lime only 14 days before seeding');
    expect(lime.html).toContain('expect the full effect next season');
  });
});

describe('morning digest', () => {
  it('lists today\'s steps, each with its link', () => {
    const m = morningDigest({
      baseUrl,
      date: '2027-09-13',
      steps: [
        { stepId: 's1', stepTitle: 'Broadcast seed', plotName: 'North corner', propertyName: 'Hollow Oak Club' },
        { stepId: 's2', stepTitle: 'Fertilize', plotName: 'Creekside strip', propertyName: 'Hollow Oak Club', hours: { start: '07:00', end: '11:00' } },
      ],
    });
    expect(m.subject).toBe('Today on your plots, Mon 13 Sep: 2 steps');
    expect(m.text).toContain('Broadcast seed — North corner (Hollow Oak Club)');
    expect(m.text).toContain('Fertilize — Creekside strip (Hollow Oak Club), 07:00–11:00');
    expect(m.text).toContain('https://sowcast.example.test/steps/s1');
    expect(m.text).toContain('https://sowcast.example.test/steps/s2');
    expect(m.push.body).toBe('North corner: Broadcast seed; Creekside strip: Fertilize');
    expectSettingsLink(m);
  });

  it('says plainly when nothing is due', () => {
    const m = morningDigest({ baseUrl, date: '2027-09-13', steps: [] });
    expect(m.subject).toBe('Nothing due on your plots today, Mon 13 Sep');
    expectSettingsLink(m);
  });
});

describe('invitation', () => {
  it('names who invited, to which property, in which role, with the acceptance link', () => {
    const m = invitation({
      baseUrl,
      propertyName: 'Hollow Oak Club',
      inviterName: 'Dana Reyes',
      role: 'member',
      link: 'https://sowcast.example.test/invitations/tok123',
      expiresOn: '2027-09-20',
    });
    expect(m.subject).toBe('Dana Reyes invited you to Hollow Oak Club on Sowcast');
    expect(m.text).toContain('as a member: you can see the plans, complete your steps and log records');
    expect(m.text).toContain('Accept the invitation: https://sowcast.example.test/invitations/tok123');
    expect(m.text).toContain('The link works until Mon 20 Sep.');
    expect(m.html).toContain('href="https://sowcast.example.test/invitations/tok123"');
    expectSettingsLink(m);
  });
});

describe('names people type', () => {
  const hostile = '<script>alert("x")</script> & <img src=x onerror=alert(1)>';

  it('are escaped in HTML (a mail client shows them as text; html-to-text via mailparser)', async () => {
    const m = killWaitOver({ baseUrl, stepId: 's', plotName: hostile, propertyName: 'Club "A" & B', endsOn: '2027-09-14' });
    expect(m.html).not.toContain('<script>');
    expect(m.html).not.toContain('<img');
    expect(m.html).toContain('&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; &amp; &lt;img src=x onerror=alert(1)&gt;');
    expect(m.html).toContain('Club &quot;A&quot; &amp; B');
    // Plain text is not HTML: the name appears as typed.
    expect(m.text).toContain(hostile);
    const seen = await htmlAsText(m.html);
    expect(seen).toContain('<script>alert("x")</script>');
    expect(seen).toContain('<img src=x onerror=alert(1)>');
  });

  it('are escaped in every message kind', () => {
    const messages = [
      stepsMoved({ baseUrl, moves: [{ stepId: 's', stepTitle: hostile, plotName: hostile, from: '2027-09-14', to: '2027-09-12', reason: hostile }] }),
      checkGermination({ baseUrl, plotId: 'p', plotName: hostile, propertyName: hostile, date: '2027-09-14' }),
      stepDue({ baseUrl, when: 'today', stepId: 's', stepTitle: hostile, plotName: hostile, propertyName: hostile, date: '2027-09-14', carry: [hostile], cautions: [hostile] }),
      morningDigest({ baseUrl, date: '2027-09-14', steps: [{ stepId: 's', stepTitle: hostile, plotName: hostile, propertyName: hostile }] }),
      invitation({ baseUrl, propertyName: hostile, inviterName: hostile, role: 'viewer', link: 'https://sowcast.example.test/invitations/"><script>' }),
    ];
    for (const m of messages) {
      expect(m.html).not.toContain('<script');
      expect(m.html).not.toContain('<img');
    }
  });

  it('cannot break the Subject header or the notification title onto a new line (RFC 5322 §2.2: header fields are single lines unless folded)', () => {
    const m = checkGermination({ baseUrl, plotId: 'p', plotName: 'North\r\nBcc: someone@example.test', propertyName: 'Club', date: '2027-09-14' });
    expect(m.subject).toBe('Check germination on North Bcc: someone@example.test today');
    expect(m.push.title).not.toMatch(/[\r\n]/);
  });

  it('are percent-encoded in links', () => {
    const m = checkGermination({ baseUrl, plotId: 'a/b?c', stepId: 'x&y=z', plotName: 'N', propertyName: 'C', date: '2027-09-14' });
    expect(m.push.url).toBe('https://sowcast.example.test/plots/a%2Fb%3Fc/check?step=x%26y%3Dz');
  });
});
