// The season calendar (/calendar) in Debian's headless Chromium through playwright-core: from navigation to
// the first rendered event (an `.fc-event` box with a size), and the JavaScript bytes the page transferred
// (CDP Network: encodedDataLength of every Script resource). Each run has a fresh context, so an empty cache.
import { chromium } from 'playwright-core';
import { median } from './support';
import type { BenchClub, Web } from './web';

export interface PageRow {
  club: BenchClub['name'];
  runs: number;
  firstEventMs: number;
  firstEventMsEach: number[];
  events: number;
  scriptBytes: number;
  scripts: number;
}

/** Marks the first moment an event box has a size, from inside the page (performance.now() is relative to navigation start). */
const FIRST_EVENT_PROBE = `
  (() => {
    const check = () => {
      if (window.__firstEventMs !== undefined) return;
      const el = document.querySelector('.fc-event');
      if (el && el.getBoundingClientRect().width > 0) window.__firstEventMs = performance.now();
    };
    new MutationObserver(check).observe(document, { childList: true, subtree: true, attributes: true });
  })();
`;

export async function runPageBenchmark(web: Web, o: { runs?: number } = {}): Promise<PageRow[]> {
  const runs = o.runs ?? 5;
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  const rows: PageRow[] = [];
  try {
    // The demo club only: the 1,000-plot club's calendar showed no event within 30 s on the 2-core machine
    // (its events route answers in seconds there, see the API table), which would only measure that timeout.
    for (const club of web.clubs.filter((c) => c.name === 'demo')) {
      const times: number[] = [];
      const bytes: number[] = [];
      const files: number[] = [];
      let events = 0;
      for (let run = 0; run < runs + 1; run++) {
        const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
        const [name, value] = club.cookie.split('=');
        await context.addCookies([{ name, value, url: web.baseUrl, httpOnly: true, sameSite: 'Lax' }]);
        await context.addInitScript(FIRST_EVENT_PROBE);
        const page = await context.newPage();
        const cdp = await context.newCDPSession(page);
        await cdp.send('Network.enable');
        const scripts = new Set<string>();
        let scriptBytes = 0;
        let scriptCount = 0;
        cdp.on('Network.responseReceived', (e: { requestId: string; type: string }) => {
          if (e.type === 'Script') scripts.add(e.requestId);
        });
        cdp.on('Network.loadingFinished', (e: { requestId: string; encodedDataLength: number }) => {
          if (!scripts.has(e.requestId)) return;
          scriptBytes += e.encodedDataLength;
          scriptCount++;
        });
        await page.goto(`${web.baseUrl}/calendar`);
        await page.locator('.fc-event').first().waitFor({ state: 'visible', timeout: 30_000 }).catch(async (error: Error) => {
          const text = (await page.locator('main').innerText().catch(() => '')).slice(0, 300);
          throw new Error(`no event on ${page.url()} for the ${club.name} club: ${error.message.split('\n')[0]}\n${text}`);
        });
        await page.waitForLoadState('networkidle');
        const firstEventMs = await page.evaluate(() => (window as unknown as { __firstEventMs?: number }).__firstEventMs ?? NaN);
        events = await page.locator('.fc-event').count();
        await context.close();
        // The first run warms the server's caches (a cold server is not what a person meets); it is not counted.
        if (run === 0) continue;
        times.push(firstEventMs);
        bytes.push(scriptBytes);
        files.push(scriptCount);
      }
      rows.push({ club: club.name, runs, firstEventMs: median(times), firstEventMsEach: times.map(Math.round), events, scriptBytes: median(bytes), scripts: median(files) });
    }
  } finally {
    await browser.close();
  }
  return rows;
}
