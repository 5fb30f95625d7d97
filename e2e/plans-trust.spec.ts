import type { Page } from '@playwright/test';
import { pdfText } from '../tests/support/pdf-text';
import { DEMO, expect, keepScreenshot, signIn, test } from './fixtures';

interface RoomItem {
  id: number;
  name: string;
  people: number;
}

async function roomOf(page: Page, people: number): Promise<RoomItem> {
  const res = await page.request.get('/api/rooms?pageSize=100');
  const room = ((await res.json()) as { items: RoomItem[] }).items.find((r) => r.people === people);
  expect(room, `a demo room of ${people} people`).toBeTruthy();
  return room!;
}

/** Records every value the plan's progress bar shows (events can be quicker than polling). */
async function watchPlanBar(page: Page) {
  await page.evaluate(() => {
    const seen: number[] = [];
    (window as unknown as { rhPlanBar: number[] }).rhPlanBar = seen;
    new MutationObserver(() => {
      const bar = document.querySelector('mat-progress-bar[aria-label="Plan progress"]');
      const v = Number(bar?.getAttribute('aria-valuenow'));
      if (bar && Number.isFinite(v) && v !== seen[seen.length - 1]) seen.push(v);
    }).observe(document.body, { subtree: true, childList: true, attributes: true });
  });
}

async function choose(page: Page, k: number, method: string) {
  await page.getByRole('spinbutton', { name: 'Budget k' }).fill(String(k));
  await page.getByRole('radio', { name: method, exact: true }).check();
  await page.getByRole('button', { name: 'Find the starters' }).click();
}

test('a long search shows a moving, determinate bar over the greyed previous result, and can be cancelled', async ({ page }) => {
  test.setTimeout(120_000);
  await signIn(page, DEMO.facilitator);
  const room = await roomOf(page, 60);
  await page.goto(`/rooms/${room.id}/plans`);
  await choose(page, 3, 'Greedy');
  await expect(page.locator('app-plan-result .starters .starter')).toHaveCount(3);

  await watchPlanBar(page);
  // Fourteen starters out of sixty: far too many groups to finish within the time limit.
  await page.getByRole('spinbutton', { name: 'Budget k' }).fill('14');
  await page.getByRole('radio', { name: 'Exhaustive', exact: true }).check();
  await page.getByRole('spinbutton', { name: 'Search for at most' }).fill('240');
  await page.getByRole('button', { name: 'Find the starters' }).click();
  const bar = page.locator('mat-progress-bar[aria-label="Plan progress"]');
  await expect(bar).toBeVisible();
  await expect(bar).toHaveAttribute('mode', 'determinate');
  await expect(page.locator('.shown.busy')).toBeVisible();
  await expect(page.getByText('The plan below is the previous result')).toBeVisible();
  await expect
    .poll(
      async () => {
        const seen = await page.evaluate(() => (window as unknown as { rhPlanBar: number[] }).rhPlanBar);
        return seen.filter((v) => v > 0).length;
      },
      { timeout: 30_000 },
    )
    .toBeGreaterThanOrEqual(2);
  const seen = await page.evaluate(() => (window as unknown as { rhPlanBar: number[] }).rhPlanBar);
  const moving = seen.filter((v) => v > 0);
  expect(moving[moving.length - 1]).toBeGreaterThan(moving[0]);
  await page.screenshot({ path: 'e2e/artifacts/plans-long-search.png' });
  await page.locator('app-plan-progress').getByRole('button', { name: 'Cancel' }).click();
  await expect(bar).toHaveCount(0);
  await expect(page.getByText('Cancelled: no results were kept.')).toBeVisible();
  await expect(page.locator('.shown.busy')).toHaveCount(0);
});

test('a widened plan equal to the certified optimum shows "proven best"', async ({ page }) => {
  test.setTimeout(120_000);
  await signIn(page, DEMO.facilitator);
  const room = await roomOf(page, 24);
  await page.goto(`/rooms/${room.id}/plans`);
  await choose(page, 3, 'Widened greedy');
  await expect(page.locator('app-plan-result .starters .starter')).toHaveCount(3);
  const gap = page.locator('app-plan-scores [data-score="gap"]');
  await expect(gap).toContainText(/at most [\d.]+ ?% to gain/);
  const widenedUrl = page.url();
  const widenedId = Number(new URL(widenedUrl).searchParams.get('plan'));

  await page.getByRole('button', { name: 'Prove or improve' }).click();
  await expect(gap).toContainText('proven best', { timeout: 90_000 });
  await expect(gap).toContainText('proven by a search of every possible group');
  expect(Number(new URL(page.url()).searchParams.get('plan'))).toBe(widenedId);
  // The premise, checked against the stored plans: the full search certified the same total.
  const plans = (await (await page.request.get(`/api/rooms/${room.id}/plans`)).json()) as {
    id: number;
    k: number;
    methodUsed: string;
    total: number;
    certified: boolean;
  }[];
  const widened = plans.find((p) => p.id === widenedId)!;
  const search = plans.find((p) => p.k === 3 && p.methodUsed === 'exhaustive')!;
  expect(search.certified).toBe(true);
  expect(Math.abs(widened.total - search.total)).toBeLessThanOrEqual(1e-9 * search.total);
  expect(widened.certified).toBe(true);
  await keepScreenshot(page, 'plans-proven-best');
});

test('the briefing PDF carries the clock-time section for the chosen 24-hour start', async ({ page }) => {
  await signIn(page, DEMO.facilitator);
  const room = await roomOf(page, 24);
  await page.goto(`/rooms/${room.id}/plans`);
  await choose(page, 2, 'Greedy');
  await expect(page.locator('app-plan-result .starters .starter')).toHaveCount(2);
  await page.getByRole('link', { name: 'Briefing sheet' }).first().click();
  const sheet = page.getByRole('article', { name: 'Briefing sheet' });
  const time = page.getByLabel('Time the message goes out');
  await time.fill('2:30 PM');
  await time.blur();
  await expect(page.getByText('Enter a 24-hour time such as 09:00 or 14:30.')).toBeVisible();
  await time.fill('14:30');
  await expect(page.getByText('Enter a 24-hour time such as 09:00 or 14:30.')).toHaveCount(0);
  const onScreen = (await sheet.locator('.clock li').allTextContents()).map((t) => t.replace(/\s+/g, ' ').trim());
  expect(onScreen.length).toBeGreaterThan(0);
  const href = await page.getByRole('link', { name: 'Download PDF' }).getAttribute('href');
  expect(href).toContain('start=14%3A30');
  const text = (await pdfText(await (await page.request.get(href!)).body())).replace(/\s+/g, ' ');
  expect(text).toContain('Briefed at');
  expect(text).toContain('Clock times if the message goes out at 14:30');
  for (const line of onScreen) expect(text).toContain(line);
  expect(text).not.toMatch(/\b(AM|PM)\b/);
});

test('plan page at phone and projector widths', async ({ page }) => {
  await signIn(page, DEMO.facilitator);
  const room = await roomOf(page, 60);
  for (const width of [390, 1920]) {
    await page.setViewportSize({ width, height: 900 });
    await page.goto(`/rooms/${room.id}/plans`);
    await choose(page, 5, 'Swap polish');
    await expect(page.locator('app-plan-result .starters .starter')).toHaveCount(5);
    // Nothing of the plan page reaches past the window (wide tables scroll inside their own box).
    const outside = await page.evaluate(() => {
      const w = document.documentElement.clientWidth;
      const out: string[] = [];
      for (const box of document.querySelectorAll('app-plan-page .layout, app-plan-page .layout > *, app-plan-page section.card')) {
        const r = box.getBoundingClientRect();
        if (r.right > w + 1 || r.left < -1) out.push(`${box.tagName.toLowerCase()}.${box.className}`);
      }
      return out;
    });
    expect(outside, `plan page parts wider than ${width} px`).toEqual([]);
    await keepScreenshot(page, `plans-page-${width}`);
  }
});
