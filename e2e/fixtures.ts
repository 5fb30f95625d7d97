import { mkdirSync } from 'node:fs';
import { test as base, expect, type BrowserContext, type Page } from '@playwright/test';
import { AxeWatch } from './accessibility';

/**
 * Every page in every test is watched: a Content-Security-Policy violation or a request to
 * any host other than the app's fails the test (nothing may load from outside the machine),
 * and so does a serious or critical accessibility violation on any page visited, in any
 * browser context the test opens (see accessibility.ts).
 */
export const test = base.extend<{ guard: void; axe: void }>({
  axe: [
    async ({ context, browser }, use, testInfo) => {
      // The time the checks take is added to the test's timeout, not taken from it.
      const watch = new AxeWatch((ms) => testInfo.setTimeout(testInfo.timeout + ms));
      const contexts: BrowserContext[] = [context];
      watch.watchContext(context);
      const newContext = browser.newContext.bind(browser);
      browser.newContext = async (...args: Parameters<typeof newContext>) => {
        const ctx = await newContext(...args);
        contexts.push(ctx);
        watch.watchContext(ctx);
        return ctx;
      };
      await use();
      browser.newContext = newContext;
      await watch.finish(contexts);
      expect(watch.violations, `accessibility (axe-core), serious or critical:\n${watch.violations.join('\n')}`).toEqual([]);
    },
    { auto: true, timeout: 180_000 },
  ],
  guard: [
    async ({ page, baseURL }, use) => {
      const problems: string[] = [];
      const origin = new URL(baseURL!).origin;
      page.on('console', (msg) => {
        const text = msg.text();
        if (/Content Security Policy|Refused to (load|apply|execute|connect)/i.test(text)) problems.push(`CSP: ${text}`);
      });
      page.on('request', (req) => {
        const url = req.url();
        if (!url.startsWith(origin) && !url.startsWith('data:') && !url.startsWith('blob:')) problems.push(`external request: ${url}`);
      });
      await use();
      expect(problems, problems.join('\n')).toEqual([]);
    },
    { auto: true },
  ],
});

export { expect };

export const DEMO = {
  admin: { email: 'admin@ripplehall.local', password: 'admin-demo-2026' },
  facilitator: { email: 'facilitator@ripplehall.local', password: 'facilitate-demo-2026' },
};

export async function signIn(page: Page, who: { email: string; password: string }) {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(who.email);
  await page.getByLabel('Password').fill(who.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

/** Screenshots kept as test artifacts (e2e/artifacts/, git-ignored). */
export async function keepScreenshot(page: Page, name: string) {
  mkdirSync('e2e/artifacts', { recursive: true });
  await page.screenshot({ path: `e2e/artifacts/${name}.png`, fullPage: true });
}
