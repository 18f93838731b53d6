// The pages under their Content Security Policy in Chromium: the policy has a fresh nonce per request (W3C
// CSP Level 3 §2.3.1 nonce-source; Next.js CSP guide: the proxy sets it, Next puts it on its scripts), and
// the main pages — landing, sign-in, dashboard, season calendar (FullCalendar), plot page (recharts),
// My steps (service worker), settings — load and work with no violation reported, neither as a
// `securitypolicyviolation` event (CSP3 §5.3) nor as a console message.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import demoUsers from '@/db/demo-users.json';
import { baseUrl, DESKTOP, launchBrowser, loadDemoData, screenshot, signIn } from './browser';

let browser: Browser;
const person = (role: string) => demoUsers.users.find((u) => u.role === role)!;

beforeAll(async () => {
  await loadDemoData();
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

/** A context whose pages record every CSP violation, from the event and from the console. */
async function watchedContext(): Promise<{ context: BrowserContext; violations: string[]; page: Page }> {
  const context = await browser.newContext({ viewport: DESKTOP });
  await context.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      console.error(`CSP violation: ${e.violatedDirective} blocked ${e.blockedURI || 'inline'} (${e.sourceFile}:${e.lineNumber})`);
    });
  });
  const violations: string[] = [];
  const page = await context.newPage();
  page.on('console', (message) => {
    if (/Content Security Policy|CSP violation|Refused to (load|execute|apply|connect|frame)/i.test(message.text())) violations.push(message.text());
  });
  return { context, violations, page };
}

const nonceOf = (policy: string | null) => /'nonce-([A-Za-z0-9+/=]+)'/.exec(policy ?? '')?.[1];

describe('Content Security Policy on pages', () => {
  it('sends a fresh nonce per request and puts it on the page’s scripts; framing and plugins are refused', async () => {
    const [a, b] = await Promise.all([fetch(`${baseUrl()}/sign-in`), fetch(`${baseUrl()}/sign-in`)]);
    const policy = a.headers.get('content-security-policy');
    expect(policy).toMatch(/script-src 'self' 'nonce-[^']+' 'strict-dynamic'/);
    expect(policy).toContain("frame-ancestors 'none'");
    expect(policy).toContain("object-src 'none'");
    expect(policy).not.toContain('unsafe-eval');
    const nonce = nonceOf(policy)!;
    expect(nonce.length).toBeGreaterThanOrEqual(22); // 16 random bytes, base64
    expect(nonceOf(b.headers.get('content-security-policy'))).not.toBe(nonce);
    const html = await a.text();
    const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
    expect(scripts.length).toBeGreaterThan(0);
    for (const tag of scripts) expect(tag, tag).toContain(`nonce="${nonce}"`);
    expect(a.headers.get('x-content-type-options')).toBe('nosniff');
    expect(a.headers.get('referrer-policy')).toBe('strict-origin-when-cross-origin');
    expect(a.headers.get('permissions-policy')).toContain('camera=()');
    expect(a.headers.get('strict-transport-security')).toBeNull();
  });

  it('the main pages load and work with no CSP violation', async () => {
    const { context, violations, page } = await watchedContext();
    await page.goto(`${baseUrl()}/`);
    await page.waitForLoadState('networkidle');

    await signIn(page, person('manager').email, person('manager').password);
    // Dashboard: rendered in the client after hydration, so the scripts ran.
    await page.getByRole('heading', { name: 'Today' }).first().waitFor();
    await page.waitForLoadState('networkidle');

    // Season calendar: FullCalendar draws its grid with inline styles after hydration.
    await page.goto(`${baseUrl()}/calendar`);
    await page.locator('.fc-daygrid, .fc-list').first().waitFor({ timeout: 20_000 });
    await page.waitForLoadState('networkidle');
    await screenshot(page, 'csp-calendar');

    // Plot page: the planner, the weather panel (recharts) and the plot's pictures from our API.
    await page.goto(`${baseUrl()}/properties`);
    await page.getByRole('link', { name: /Foxglove Hollow Lease/ }).first().click();
    await page.waitForURL(/\/properties\/[0-9a-f-]{36}$/);
    await page.getByRole('link', { name: 'Old lane', exact: true }).click();
    await page.getByRole('heading', { name: 'Old lane', level: 1 }).waitFor();
    await page.waitForLoadState('networkidle');
    await screenshot(page, 'csp-plot');

    // My steps registers the service worker that keeps the list for offline use.
    await page.goto(`${baseUrl()}/my-steps`);
    await page.waitForLoadState('networkidle');
    await expect.poll(() => page.evaluate(async () => Boolean(await navigator.serviceWorker.getRegistration('/')))).toBe(true);

    await page.goto(`${baseUrl()}/settings`);
    await page.waitForLoadState('networkidle');

    expect(violations).toEqual([]);
    await context.close();
  });

  it('a violation would be seen: an inline script slipped into the page without the nonce is blocked and reported', async () => {
    // Proves the watch above can fail. The page's HTML is changed on its way to the browser, as a stored
    // injection would change it; the policy header stays the server's.
    const { context, violations, page } = await watchedContext();
    await page.route(`${baseUrl()}/sign-in`, async (route) => {
      const response = await route.fetch();
      const html = (await response.text()).replace('</body>', '<script>window.__injected = true</script></body>');
      await route.fulfill({ response, body: html });
    });
    await page.goto(`${baseUrl()}/sign-in`);
    await page.getByLabel('E-mail').waitFor();
    await expect.poll(() => violations.length).toBeGreaterThan(0);
    expect(violations.join('\n')).toMatch(/script-src/);
    expect(await page.evaluate(() => (window as unknown as { __injected?: boolean }).__injected)).toBeUndefined();
    await context.close();
  });
});
