import type { Page } from '@playwright/test';
import { DEMO, expect, keepScreenshot, signIn, test } from './fixtures';

/**
 * The projector replay of the 60-person demo room at 1920x1080: every name is drawn, no two
 * names overlap, each name's box really holds drawn text (read back from the canvas pixels),
 * and hop 0 says the message is on its way.
 */
async function call(page: Page, method: 'GET' | 'POST', path: string, data?: unknown) {
  const xsrf = (await page.context().cookies()).find((c) => c.name === 'XSRF-TOKEN')?.value ?? '';
  const res = await page.request.fetch(path, { method, data, headers: { 'X-XSRF-TOKEN': decodeURIComponent(xsrf) } });
  expect(res.status(), `${method} ${path}: ${await res.text()}`).toBeLessThan(300);
  return res.json();
}

test.use({ viewport: { width: 1920, height: 1080 } });

test('the replay of the 60-person demo room names everyone without overlap at 1920x1080', async ({ page }) => {
  await signIn(page, DEMO.facilitator);
  const list = await call(page, 'GET', '/api/rooms?q=Quillmere');
  const roomId = (list.items ?? list.rooms ?? list)[0].id as number;
  const room = await call(page, 'GET', `/api/rooms/${roomId}`);
  const names = (room.people as { name: string }[]).map((p) => p.name).sort();
  expect(names.length).toBe(60);
  const plan = await call(page, 'POST', `/api/rooms/${roomId}/plans`, { k: 3, method: 'greedy' });
  const started = await call(page, 'POST', `/api/plans/${plan.id ?? plan.plan.id}/rehearsals`, { runs: 20, seed: 'projector-e2e' });
  const id = started.rehearsal.id as number;
  await expect.poll(async () => (await call(page, 'GET', `/api/rehearsals/${id}`)).status, { timeout: 60_000 }).toBe('done');

  await page.goto(`/replay/${id}`);
  await expect(page.getByText('The starters have been briefed; the message is on its way.')).toBeVisible();
  await expect(page.getByText(/question/i)).toHaveCount(0);
  const items = page.getByTestId('drawn-names').locator('li');
  await expect(items).toHaveCount(60);

  const drawn = await items.evaluateAll((lis) =>
    lis.map((li) => ({ text: li.textContent!.trim(), box: li.getAttribute('data-box')!.split(' ').map(Number) })),
  );
  // Full names for everyone (no initials needed at this size), exactly the room's names.
  expect(drawn.map((d) => d.text).sort()).toEqual(names);
  const canvas = await page.locator('canvas').boundingBox();
  for (const [i, a] of drawn.entries()) {
    const [x0, y0, x1, y1] = a.box;
    expect(x0 >= 0 && y0 >= 0 && x1 <= canvas!.width && y1 <= canvas!.height, `${a.text} inside the canvas`).toBeTruthy();
    // Large enough to read from the back of the room.
    expect(y1 - y0, `${a.text} height`).toBeGreaterThanOrEqual(20);
    for (const b of drawn.slice(i + 1)) {
      const [u0, v0, u1, v1] = b.box;
      const overlap = x0 < u1 && u0 < x1 && y0 < v1 && v0 < y1;
      expect(overlap, `${a.text} and ${b.text} overlap`).toBeFalsy();
    }
  }
  // The boxes are the drawing's own: each one holds light text pixels on the dark background.
  const lit = await page.locator('canvas').evaluate(
    (el, boxes) => {
      const c = el as HTMLCanvasElement;
      const ratio = c.width / c.getBoundingClientRect().width;
      const ctx = c.getContext('2d')!;
      return boxes.map(([x0, y0, x1, y1]) => {
        const data = ctx.getImageData(x0 * ratio, y0 * ratio, Math.max(1, (x1 - x0) * ratio), Math.max(1, (y1 - y0) * ratio)).data;
        let bright = 0;
        for (let k = 0; k < data.length; k += 4) if (data[k] + data[k + 1] + data[k + 2] > 450) bright++;
        return bright;
      });
    },
    drawn.map((d) => d.box),
  );
  lit.forEach((count, i) => expect(count, `pixels of ${drawn[i].text}`).toBeGreaterThan(20));
  await keepScreenshot(page, 'replay-60-hop-0');

  // A few hops on: the reached set grows and the replay controls answer the keyboard.
  for (let k = 0; k < 3; k++) await page.keyboard.press('ArrowRight');
  await expect(page.getByTestId('hop')).toHaveText('Hop 3');
  await expect(page.getByRole('button', { name: 'Play' })).toBeVisible();
  await keepScreenshot(page, 'replay-60-hop-3');
});
