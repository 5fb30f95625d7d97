import type { Page } from '@playwright/test';
import { DEMO, expect, keepScreenshot, signIn, test } from './fixtures';

/**
 * The map of the 60-person demo room as a facilitator uses it: names never overlap, a new
 * person appears in view and is saved, and every map action has a keyboard path (select,
 * move with the arrow keys, tie from the side panel) with a visible focus ring.
 */
/** A copy of the demo room (its saved layout included), so the tests never change the demo itself. */
async function openDemoRoom(page: Page) {
  await signIn(page, DEMO.facilitator);
  const xsrf = decodeURIComponent((await page.context().cookies()).find((c) => c.name === 'XSRF-TOKEN')?.value ?? '');
  const list = await (await page.request.get('/api/rooms?q=Quillmere')).json();
  const demo = (list.items ?? list.rooms ?? list)[0] as { id: number };
  const copy = await page.request.post(`/api/rooms/${demo.id}/duplicate`, { data: {}, headers: { 'X-XSRF-TOKEN': xsrf } });
  expect(copy.status(), await copy.text()).toBe(201);
  await page.goto(`/rooms/${((await copy.json()) as { id: number }).id}`);
  await expect(page.locator('g.person')).toHaveCount(60, { timeout: 30_000 });
  await page.evaluate(() => document.fonts.ready);
}

type Box = { x: number; y: number; width: number; height: number };
const overlap = (a: Box, b: Box) => a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;

test('names on the demo map do not overlap; a new person is placed in view and saved', async ({ page }) => {
  await openDemoRoom(page);
  const labels = await page.locator('g.person text.label').evaluateAll((els) =>
    els.map((el) => {
      const r = el.getBoundingClientRect();
      return {
        text: el.textContent,
        visible: el.getAttribute('visibility') !== 'hidden',
        x: r.x,
        y: r.y,
        width: r.width,
        height: r.height,
      };
    }),
  );
  expect(labels.filter((l) => !l.visible).map((l) => l.text)).toEqual([]);
  const clashes: string[] = [];
  for (const [i, a] of labels.entries())
    for (const b of labels.slice(i + 1)) if (overlap(a, b)) clashes.push(`"${a.text}" and "${b.text}"`);
  const shapes = await page
    .locator('g.person path.shape')
    .evaluateAll((els) =>
      els.map((el) => ({ name: el.parentElement!.getAttribute('data-name'), ...(el.getBoundingClientRect().toJSON() as Box) })),
    );
  for (const l of labels) for (const s of shapes) if (overlap(l, s)) clashes.push(`"${l.text}" over the shape of ${s.name}`);
  expect(clashes).toEqual([]);
  await keepScreenshot(page, 'map-demo-labels');

  await page.getByRole('button', { name: 'Add person' }).click();
  const added = page.locator('g.person[data-name="New person 61"]');
  await expect(added).toBeVisible();
  const map = (await page.locator('svg.rh-map-svg').boundingBox())!;
  const at = (await added.locator('path.shape').boundingBox())!;
  expect(at.x >= map.x && at.y >= map.y && at.x + at.width <= map.x + map.width && at.y + at.height <= map.y + map.height).toBeTruthy();
  await expect(page.getByRole('region', { name: 'Selected person' })).toContainText('New person 61');
  await expect(page.getByText('All changes saved')).toBeVisible();
  await expect(page.getByTestId('summary-people')).toHaveText('61');
  await expect(page.getByTestId('summary-freshness')).toHaveCount(0);
});

test('keyboard: select a person, move them with the arrow keys, tie them to someone from the side panel', async ({ page }) => {
  await openDemoRoom(page);
  const first = page.locator('g.person').first();
  const name = (await first.getAttribute('data-name'))!;
  // Tab from the last map tool lands on the first person, with a visible focus ring.
  await page.getByRole('button', { name: 'Fit to screen' }).focus();
  await page.keyboard.press('Tab');
  await expect(first).toBeFocused();
  await expect(first.locator('.focus-ring')).toBeVisible();
  await page.keyboard.press('Enter');
  await expect(page.getByRole('region', { name: 'Selected person' })).toContainText(name);
  await expect(first).toHaveAttribute('aria-pressed', 'true');
  await keepScreenshot(page, 'map-keyboard-focus');

  const before = (await first.getAttribute('transform'))!;
  const xy = (t: string) =>
    t
      .match(/translate\(([-\d.]+),([-\d.]+)\)/)!
      .slice(1)
      .map(Number);
  await page.keyboard.press('ArrowRight');
  await page.keyboard.press('Shift+ArrowDown');
  await expect.poll(async () => xy((await first.getAttribute('transform'))!)).toEqual([xy(before)[0] + 10, xy(before)[1] + 50]);
  await expect(page.getByText('All changes saved')).toBeVisible();

  const ties = Number((await page.getByRole('tab', { name: /Ties/ }).textContent())!.match(/\d+/)![0]);
  const tieTo = page.getByTestId('tie-to');
  await tieTo.focus();
  await page.keyboard.type('Zora');
  // As a keyboard user does: wait for the list of matches before moving into it (an arrow key
  // pressed before the panel opens is not a move into the list).
  await expect(page.getByRole('option', { name: /Zora/ }).first()).toBeVisible();
  await page.keyboard.press('ArrowDown');
  await expect(page.getByRole('option', { name: /Zora/ }).first()).toHaveClass(/mat-mdc-option-active/);
  await page.keyboard.press('Enter');
  await expect(page.getByText(new RegExp(`Tie added: ${name} and Zora`))).toBeVisible();
  await expect(page.getByRole('tab', { name: `Ties (${ties + 1})` })).toBeVisible();
  // Undo from the keyboard takes the tie back.
  await page.locator('g.person').first().focus();
  await page.keyboard.press('Control+z');
  await expect(page.getByRole('tab', { name: `Ties (${ties})` })).toBeVisible();
});
