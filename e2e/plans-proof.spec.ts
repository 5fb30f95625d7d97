import { DEMO, expect, keepScreenshot, signIn, test } from './fixtures';

test('an automatic plan stopped early by its time limit is proven best in the background, without a click', async ({ page }) => {
  test.setTimeout(150_000);
  await signIn(page, DEMO.facilitator);
  const res = await page.request.get('/api/rooms?pageSize=100');
  const room = ((await res.json()) as { items: { id: number; people: number }[] }).items.find((r) => r.people === 60);
  expect(room, 'the demo all-hands room').toBeTruthy();
  await page.goto(`/rooms/${room!.id}/plans`);
  // Ten starters of sixty with a one-second search: the search stops well before it can prove anything.
  await page.getByRole('spinbutton', { name: 'Budget k' }).fill('10');
  await page.getByRole('radio', { name: 'Automatic', exact: true }).check();
  await page.getByRole('spinbutton', { name: 'Search for at most' }).fill('1');
  await page.getByRole('button', { name: 'Find the starters' }).click();

  const gap = page.locator('app-plan-scores [data-score="gap"]');
  await expect(gap).toContainText(/at most [\d.]+ ?% to gain/, { timeout: 60_000 });
  const shownId = new URL(page.url()).searchParams.get('plan');
  await expect(page.getByRole('progressbar', { name: 'Proving in the background' })).toBeVisible();
  await expect(page.getByText('Still proving in the background')).toBeVisible();

  await expect(page.getByText('Proven best: the background search checked every possible group of this size.')).toBeVisible({
    timeout: 90_000,
  });
  await expect(gap).toContainText('proven best');
  await expect(page.getByRole('progressbar', { name: 'Proving in the background' })).toHaveCount(0);
  expect(new URL(page.url()).searchParams.get('plan'), 'the shown plan stays the one made').toBe(shownId);
  await keepScreenshot(page, 'plans-proven-in-background');
});
