// What Sowcast says in its e-mails and phone notifications. Pure: plain data in, plain data out (no clock, no
// environment), so the worker can store a built message with its notification row and send the same words on
// every retry. Every e-mail ends with the link to the recipient's settings.

export interface PushContent {
  title: string;
  body: string;
  /** Absolute URL the notification opens when tapped. */
  url: string;
  /** Same tag → the phone replaces the older notification instead of stacking a second one. */
  tag: string;
}

export interface NotifyMessage {
  subject: string;
  text: string;
  html: string;
  push: PushContent;
}

/** Where links point: the app's absolute base URL, e.g. `appBaseUrl()` from lib/links.ts. */
export interface LinkBase {
  baseUrl: string;
}

const WEEKDAYS = ['Sun', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat'];
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/**
 * A local calendar date (YYYY-MM-DD, already in the property's zone) as people write it: "Tue 14 Sep".
 * Built by hand rather than with Intl because ICU versions disagree on "Sep" vs "Sept" for en-GB.
 */
export function formatLocalDate(date: string): string {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  if (!match) throw new Error(`Expected a local date as YYYY-MM-DD, got "${date}"`);
  const [, y, m, d] = match.map(Number);
  const utc = new Date(Date.UTC(y, m - 1, d));
  if (utc.getUTCMonth() !== m - 1 || utc.getUTCDate() !== d) throw new Error(`"${date}" is not a calendar date`);
  return `${WEEKDAYS[utc.getUTCDay()]} ${d} ${MONTHS[m - 1]}`;
}

export function escapeHtml(value: string): string {
  return value
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

/** Names typed by people end up in a Subject header and a notification title: keep them on one line. */
function oneLine(value: string): string {
  return value.replace(/[\r\n\t]+/g, ' ').replace(/ {2,}/g, ' ').trim();
}

function base(links: LinkBase): string {
  return links.baseUrl.replace(/\/+$/, '');
}

export const stepUrl = (links: LinkBase, stepId: string) => `${base(links)}/steps/${encodeURIComponent(stepId)}`;
export const plotUrl = (links: LinkBase, plotId: string) => `${base(links)}/plots/${encodeURIComponent(plotId)}`;
export const settingsUrl = (links: LinkBase) => `${base(links)}/settings`;
/** The germination check form of a plot, for the check step the reminder is about. */
export const checkUrl = (links: LinkBase, plotId: string, stepId?: string | null) =>
  `${plotUrl(links, plotId)}/check${stepId ? `?step=${encodeURIComponent(stepId)}` : ''}`;

// --- the two bodies -------------------------------------------------------------------------------------------

/** A block of the message, written once and rendered both as plain text and as HTML. */
export type Block =
  | { kind: 'para'; text: string }
  | { kind: 'link'; label: string; url: string }
  | { kind: 'list'; items: string[] }
  | { kind: 'caution'; lines: string[] }
  | { kind: 'item'; heading: string; lines: string[]; link?: { label: string; url: string } };

function footerText(links: LinkBase): string {
  return `Change what Sowcast sends you: ${settingsUrl(links)}`;
}

function renderText(blocks: Block[], links: LinkBase): string {
  const parts = blocks.map((b) => {
    switch (b.kind) {
      case 'para':
        return b.text;
      case 'link':
        return `${b.label}: ${b.url}`;
      case 'list':
        return b.items.map((i) => `- ${i}`).join('\n');
      case 'caution':
        return ['Take care:', ...b.lines.map((l) => `! ${l}`)].join('\n');
      case 'item':
        return [b.heading, ...b.lines.map((l) => `  ${l}`), ...(b.link ? [`  ${b.link.label}: ${b.link.url}`] : [])].join('\n');
    }
  });
  return `${parts.join('\n\n')}\n\n-- \n${footerText(links)}\n`;
}

const INK = '#4a3b2f'; // loam
const LINK = '#3d7a3a'; // clover
const GROUND = '#f7f4ec';
const EMBER = '#b9502a';

function a(url: string, label: string): string {
  return `<a href="${escapeHtml(url)}" style="color:${LINK}">${escapeHtml(label)}</a>`;
}

function renderHtml(subject: string, blocks: Block[], links: LinkBase): string {
  const body = blocks
    .map((b) => {
      switch (b.kind) {
        case 'para':
          return `<p style="margin:0 0 14px">${escapeHtml(b.text)}</p>`;
        case 'link':
          return `<p style="margin:0 0 14px">${a(b.url, b.label)}</p>`;
        case 'list':
          return `<ul style="margin:0 0 14px;padding-left:20px">${b.items.map((i) => `<li>${escapeHtml(i)}</li>`).join('')}</ul>`;
        case 'caution':
          return (
            `<div style="margin:0 0 14px;padding:10px 12px;border-left:4px solid ${EMBER};background:#fff">` +
            `<p style="margin:0 0 6px;font-weight:600">Take care</p>` +
            b.lines.map((l) => `<p style="margin:0 0 4px">${escapeHtml(l)}</p>`).join('') +
            `</div>`
          );
        case 'item':
          return (
            `<div style="margin:0 0 16px">` +
            `<p style="margin:0 0 4px;font-weight:600">${escapeHtml(b.heading)}</p>` +
            b.lines.map((l) => `<p style="margin:0 0 4px">${escapeHtml(l)}</p>`).join('') +
            (b.link ? `<p style="margin:0">${a(b.link.url, b.link.label)}</p>` : '') +
            `</div>`
          );
      }
    })
    .join('\n');
  const settings = settingsUrl(links);
  return `<!doctype html>
<html lang="en">
<head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${escapeHtml(subject)}</title></head>
<body style="margin:0;padding:0;background:${GROUND};color:${INK};font-family:Inter,Arial,Helvetica,sans-serif;font-size:16px;line-height:1.5">
<div style="max-width:560px;margin:0 auto;padding:24px 20px">
<p style="margin:0 0 18px;font-weight:700;letter-spacing:0.02em">Sowcast</p>
<h1 style="margin:0 0 16px;font-size:20px;line-height:1.3">${escapeHtml(subject)}</h1>
${body}
<hr style="border:0;border-top:1px solid #d9d2c3;margin:24px 0 12px">
<p style="margin:0;font-size:14px">Change what Sowcast sends you: ${a(settings, settings)}</p>
</div>
</body>
</html>
`;
}

export function build(links: LinkBase, subject: string, blocks: Block[], push: PushContent): NotifyMessage {
  const cleanSubject = oneLine(subject);
  return {
    subject: cleanSubject,
    text: renderText(blocks, links),
    html: renderHtml(cleanSubject, blocks, links),
    push: { ...push, title: oneLine(push.title), body: oneLine(push.body) },
  };
}

function place(plotName: string, propertyName?: string | null): string {
  return propertyName ? `${plotName} (${propertyName})` : plotName;
}

// --- the messages ---------------------------------------------------------------------------------------------

export interface KillWaitOverInput extends LinkBase {
  stepId: string;
  plotName: string;
  propertyName: string;
  /** Local date the wait ends (the day this is sent). */
  endsOn: string;
  sprayedOn?: string | null;
  waitDays?: number | null;
  /** The step that follows, e.g. { title: 'Broadcast seed', date: '2027-09-15' }. */
  next?: { title: string; date: string } | null;
}

export function killWaitOver(m: KillWaitOverInput): NotifyMessage {
  const url = stepUrl(m, m.stepId);
  const blocks: Block[] = [
    {
      kind: 'para',
      text: `The kill wait on ${place(m.plotName, m.propertyName)} ends today, ${formatLocalDate(m.endsOn)}.`,
    },
  ];
  if (m.sprayedOn) {
    const days = m.waitDays ? ` and has had its ${m.waitDays} days` : '';
    blocks.push({ kind: 'para', text: `The burndown went on ${formatLocalDate(m.sprayedOn)}${days}.` });
  }
  blocks.push({
    kind: 'para',
    text: 'Seed or till now, while the old cover is down and before new weeds get a start.',
  });
  if (m.next) blocks.push({ kind: 'para', text: `Next step: ${m.next.title}, ${formatLocalDate(m.next.date)}.` });
  blocks.push({ kind: 'link', label: 'Open the step', url });
  return build(m, `The kill wait on ${m.plotName} is over — seed or till now`, blocks, {
    title: `Kill wait over: ${m.plotName}`,
    body: `Seed or till now. ${m.propertyName}`,
    url,
    tag: `kill-wait:${m.stepId}`,
  });
}

export interface StepMove {
  stepId: string;
  stepTitle: string;
  plotName: string;
  propertyName?: string | null;
  from: string; // local date
  to: string; // local date
  reason: string;
}

export interface StepsMovedInput extends LinkBase {
  moves: StepMove[];
}

/** One message for every move of one refresh, soonest new date first. */
export function stepsMoved(m: StepsMovedInput): NotifyMessage {
  if (m.moves.length === 0) throw new Error('stepsMoved needs at least one move');
  const moves = [...m.moves].sort((x, y) => x.to.localeCompare(y.to) || x.plotName.localeCompare(y.plotName));
  const dates = (mv: StepMove) => `${formatLocalDate(mv.from)} → ${formatLocalDate(mv.to)}`;
  const first = moves[0];
  const url = stepUrl(m, first.stepId);
  const tag = `moved:${moves.map((mv) => mv.stepId).sort().join(',')}`;

  const items: Block[] = moves.map((mv) => ({
    kind: 'item',
    heading: `${mv.stepTitle} — ${place(mv.plotName, mv.propertyName)}`,
    lines: [dates(mv), `Why: ${mv.reason}`],
    link: { label: 'Open the step', url: stepUrl(m, mv.stepId) },
  }));

  if (moves.length === 1) {
    return build(
      m,
      `${first.stepTitle} on ${first.plotName} moved to ${formatLocalDate(first.to)}`,
      [{ kind: 'para', text: 'Sowcast moved a step in your plan.' }, ...items],
      { title: `Moved: ${first.stepTitle}, ${first.plotName}`, body: `${dates(first)}. ${first.reason}`, url, tag },
    );
  }
  const plots = [...new Set(moves.map((mv) => mv.plotName))];
  return build(
    m,
    `${moves.length} steps moved: ${plots.join(', ')}`,
    [{ kind: 'para', text: `Sowcast moved ${moves.length} steps in your plan.` }, ...items],
    {
      title: `${moves.length} steps moved`,
      body: moves.map((mv) => `${mv.plotName}: ${mv.stepTitle} ${dates(mv)}`).join('; '),
      url,
      tag,
    },
  );
}

export interface CheckGerminationInput extends LinkBase {
  plotId: string;
  /** The check-germination step; the link opens the check form for it. */
  stepId?: string | null;
  plotName: string;
  propertyName: string;
  date: string; // local date of the check
  seededOn?: string | null;
}

export function checkGermination(m: CheckGerminationInput): NotifyMessage {
  const url = checkUrl(m, m.plotId, m.stepId);
  const blocks: Block[] = [
    {
      kind: 'para',
      text: m.seededOn
        ? `${place(m.plotName, m.propertyName)} was seeded on ${formatLocalDate(m.seededOn)}. Today, ${formatLocalDate(m.date)}, is the day to see what came up.`
        : `Today, ${formatLocalDate(m.date)}, is the day to see what came up on ${place(m.plotName, m.propertyName)}.`,
    },
    {
      kind: 'para',
      text: 'Walk the plot, look close to the ground, and note how even the stand is and where weeds are coming through.',
    },
    { kind: 'link', label: 'Record the check', url },
  ];
  return build(m, `Check germination on ${m.plotName} today`, blocks, {
    title: `Check germination on ${m.plotName} today`,
    body: m.seededOn ? `Seeded ${formatLocalDate(m.seededOn)}. ${m.propertyName}` : m.propertyName,
    url,
    tag: `germination:${m.plotId}`,
  });
}

export interface StepDueInput extends LinkBase {
  when: 'today' | 'tomorrow';
  stepId: string;
  stepTitle: string;
  plotName: string;
  propertyName: string;
  date: string; // local date the step is due
  /** Best local hours, e.g. a spray window. */
  hours?: { start: string; end: string } | null;
  /** What to carry, one line each ("17 lb of seed — 2 bags"). */
  carry?: string[];
  /** The step's cautions (spraying, burning, clearing brush), in the engine's words. */
  cautions?: string[];
  /** Why it sits on this day ("lime now; it needs months to react — …") and the engine's warnings. */
  reason?: string;
  warnings?: string[];
}

export function stepDue(m: StepDueInput): NotifyMessage {
  const url = stepUrl(m, m.stepId);
  const day = m.when === 'today' ? 'today' : 'tomorrow';
  const hours = m.hours ? `, best between ${m.hours.start} and ${m.hours.end}` : '';
  const blocks: Block[] = [
    { kind: 'para', text: `${m.stepTitle} on ${place(m.plotName, m.propertyName)} is due ${day}, ${formatLocalDate(m.date)}${hours}.` },
  ];
  if (m.reason) blocks.push({ kind: 'para', text: `Why this day: ${m.reason}.` });
  if (m.carry && m.carry.length > 0) {
    blocks.push({ kind: 'para', text: 'What to carry:' }, { kind: 'list', items: m.carry });
  }
  const cautions = [...(m.warnings ?? []), ...(m.cautions ?? [])];
  if (cautions.length > 0) blocks.push({ kind: 'caution', lines: cautions });
  blocks.push({ kind: 'link', label: 'Open the step', url });
  const Day = m.when === 'today' ? 'Today' : 'Tomorrow';
  return build(m, `${Day}: ${m.stepTitle} on ${m.plotName}`, blocks, {
    title: `${Day}: ${m.stepTitle}`,
    body: `${m.plotName}, ${m.propertyName}${hours}`,
    url,
    tag: `due:${m.stepId}`,
  });
}

export interface DigestStep {
  stepId: string;
  stepTitle: string;
  plotName: string;
  propertyName: string;
  hours?: { start: string; end: string } | null;
}

export interface MorningDigestInput extends LinkBase {
  date: string; // local date of the digest
  steps: DigestStep[];
}

export function morningDigest(m: MorningDigestInput): NotifyMessage {
  const day = formatLocalDate(m.date);
  const tag = `digest:${m.date}`;
  if (m.steps.length === 0) {
    return build(m, `Nothing due on your plots today, ${day}`, [{ kind: 'para', text: 'No steps are due today. Sowcast will write when that changes.' }], {
      title: 'Nothing due today',
      body: day,
      url: settingsUrl(m),
      tag,
    });
  }
  const line = (s: DigestStep) => `${s.stepTitle} — ${place(s.plotName, s.propertyName)}${s.hours ? `, ${s.hours.start}–${s.hours.end}` : ''}`;
  const items: Block[] = m.steps.map((s) => ({
    kind: 'item',
    heading: line(s),
    lines: [],
    link: { label: 'Open the step', url: stepUrl(m, s.stepId) },
  }));
  const count = m.steps.length === 1 ? '1 step' : `${m.steps.length} steps`;
  return build(m, `Today on your plots, ${day}: ${count}`, [{ kind: 'para', text: `Due today, ${day}:` }, ...items], {
    title: `Today: ${count}`,
    body: m.steps.map((s) => `${s.plotName}: ${s.stepTitle}`).join('; '),
    url: stepUrl(m, m.steps[0].stepId),
    tag,
  });
}

export type InvitedRole = 'owner' | 'manager' | 'member' | 'viewer';

const ROLE_WORDS: Record<InvitedRole, string> = {
  owner: 'as an owner: you can do everything, including managing people',
  manager: 'as a manager: you can plan plots and schedules and assign work',
  member: 'as a member: you can see the plans, complete your steps and log records',
  viewer: 'as a viewer: you can see the plots, plans and records',
};

export interface InvitationInput extends LinkBase {
  propertyName: string;
  inviterName: string;
  role: InvitedRole;
  /** Absolute acceptance link (lib/links.ts `invitationLink`). */
  link: string;
  expiresOn?: string | null; // local date
}

export function invitation(m: InvitationInput): NotifyMessage {
  const blocks: Block[] = [
    { kind: 'para', text: `${m.inviterName} invited you to ${m.propertyName} on Sowcast, ${ROLE_WORDS[m.role]}.` },
    { kind: 'para', text: 'Sowcast keeps the food plots of a property on one plan and tells each person when their work is due.' },
    { kind: 'link', label: 'Accept the invitation', url: m.link },
  ];
  if (m.expiresOn) blocks.push({ kind: 'para', text: `The link works until ${formatLocalDate(m.expiresOn)}.` });
  blocks.push({ kind: 'para', text: 'If you were not expecting this, you can ignore it; nothing happens until the link is used.' });
  return build(m, `${m.inviterName} invited you to ${m.propertyName} on Sowcast`, blocks, {
    title: `Invitation to ${m.propertyName}`,
    body: `From ${m.inviterName}`,
    url: m.link,
    tag: `invitation:${m.link}`,
  });
}
