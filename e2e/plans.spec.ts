import type { Page } from '@playwright/test';
import { DEMO, expect, keepScreenshot, signIn, test } from './fixtures';

interface RoomItem {
  id: number;
  name: string;
  people: number;
}

/** The demo training workshop room (24 people) of the demo facilitator. */
async function workshopRoom(page: Page): Promise<RoomItem> {
  const res = await page.request.get('/api/rooms?pageSize=100');
  expect(res.ok()).toBeTruthy();
  const rooms = ((await res.json()) as { items: RoomItem[] }).items;
  const room = rooms.find((r) => r.people === 24) ?? rooms.find((r) => r.people >= 10);
  expect(room, 'a demo room with people').toBeTruthy();
  return room!;
}

/** Records every value the rehearsal's progress bar shows, even if the run is over in a blink. */
async function watchProgress(page: Page) {
  await page.evaluate(() => {
    const seen: string[] = [];
    (window as unknown as { rhProgress: string[] }).rhProgress = seen;
    new MutationObserver(() => {
      const bar = document.querySelector('mat-progress-bar[aria-label="Rehearsal progress"]');
      if (bar) seen.push(bar.getAttribute('aria-valuenow') ?? '');
    }).observe(document.body, { subtree: true, childList: true, attributes: true });
  });
}

test('a facilitator plans, compares, rehearses, reproduces and prints the briefing sheet', async ({ page }) => {
  test.setTimeout(180_000);
  page.on('dialog', (d) => d.accept());
  await signIn(page, DEMO.facilitator);
  const room = await workshopRoom(page);
  // Open the room from the rooms list, then its plan screen.
  await page.goto('/rooms');
  await page.getByRole('link', { name: room.name, exact: true }).click();
  await expect(page).toHaveURL(new RegExp(`/rooms/${room.id}$`));
  await page.getByRole('link', { name: 'Plan', exact: true }).click();
  await expect(page.getByRole('heading', { name: 'Whom to brief first' })).toBeVisible();

  // The budget's bounds come from the room size and are explained in the field.
  const k = page.getByRole('spinbutton', { name: 'Budget k' });
  await k.fill('0');
  await k.blur();
  await expect(page.getByText(`Brief at least 1 person: the budget is 1 to ${room.people - 1}.`)).toBeVisible();
  await k.fill(String(room.people));
  await k.blur();
  await expect(page.getByText(`At most ${room.people - 1} in a room of ${room.people}`)).toBeVisible();
  await k.fill('4');

  // Plan k = 4 with the automatic method (it may run as a background job with a progress bar).
  await page.getByRole('button', { name: 'Find the starters' }).click();
  const starters = page.locator('app-plan-result .starters .starter');
  await expect(starters).toHaveCount(4, { timeout: 60_000 });
  await expect(page.getByText(/90% will have heard within about \d+ minutes/)).toBeVisible();
  await expect(page.locator('app-plan-scores')).toContainText('Quality rank');
  await expect(page.getByText('A planning aid, not a verdict.')).toBeVisible();
  await expect(page.locator('app-plan-map svg .person.starter')).toHaveCount(4);
  await expect(page.getByRole('table', { name: 'Expected time to hear per person' }).getByRole('row')).toHaveCount(11);
  await keepScreenshot(page, 'plans-result-k4');
  const autoPlanUrl = page.url();
  const saved = page.getByRole('table', { name: 'Saved plans' });
  const autoName = (await page.locator('.result-head h2').textContent())!.trim();

  // How much each extra starter helps, by method and against the two baselines.
  await page.getByRole('button', { name: 'Compare methods' }).click();
  await expect(page.locator('app-sweep-chart canvas')).toBeVisible({ timeout: 30_000 });
  await expect(page.locator('app-sweep-panel')).toContainText('Most ties: the k people with the most tie strength');
  await page.locator('app-sweep-panel').scrollIntoViewIfNeeded();
  await keepScreenshot(page, 'plans-sweep');

  // The same budget with plain greedy, then both side by side.
  await page.getByRole('radio', { name: 'Greedy', exact: true }).check();
  await page.getByRole('button', { name: 'Find the starters' }).click();
  await expect(page.locator('app-plan-result .starters .starter')).toHaveCount(4);
  await expect(page.locator('app-plan-scores')).toContainText('Greedy');
  // Newest first: the greedy plan, then the automatic one.
  await expect(saved.locator('tbody tr').first()).toContainText('Greedy');
  await expect(saved.locator('tbody tr').nth(1)).toContainText(autoName);
  await saved.getByRole('checkbox').nth(0).check();
  await saved.getByRole('checkbox').nth(1).check();
  await page.getByRole('link', { name: 'Compare the two' }).click();
  await expect(page.getByRole('heading', { name: 'Two plans side by side' })).toBeVisible();
  await expect(page.getByRole('table', { name: 'Scores of the two plans' })).toContainText('Room average');
  await expect(page.locator('app-reach-chart canvas')).toBeVisible();
  await keepScreenshot(page, 'plans-compare');

  // Mark the automatic plan as chosen and rehearse it.
  await page.goto(autoPlanUrl);
  await page.getByRole('button', { name: 'Mark as chosen', exact: true }).click();
  await expect(page.locator('.result-head .badge.chosen')).toBeVisible();
  await page.getByRole('link', { name: 'Rehearse', exact: true }).click();
  await expect(page.getByRole('heading', { name: 'Rehearse a plan' })).toBeVisible();
  await expect(page.getByText(/Up to [\d,]+ \(server limit\)/)).toBeVisible();
  await page.getByRole('textbox', { name: 'Seed' }).fill('has space');
  await page.getByRole('textbox', { name: 'Seed' }).blur();
  await expect(page.getByText('A seed is 1 to 64 letters, digits, "-" or "_" (for example 2026-allhands), no spaces.')).toBeVisible();
  await expect(page.getByRole('button', { name: 'Start rehearsal' })).toBeDisabled();
  await page.getByRole('textbox', { name: 'Seed' }).fill('allhands-2026');
  await page.getByRole('spinbutton', { name: 'Cascades' }).fill('5000');
  await watchProgress(page);
  await page.getByRole('button', { name: 'Start rehearsal' }).click();
  const verdict = page.locator('app-rehearsal-result .verdict .line');
  await expect(verdict).toBeVisible({ timeout: 60_000 });
  await expect(verdict).toHaveText(/agree|disagree|differ/i);
  const progressSeen = await page.evaluate(() => (window as unknown as { rhProgress: string[] }).rhProgress);
  expect(progressSeen.length, 'the progress bar was shown').toBeGreaterThan(0);
  await expect(page.locator('app-interval-chart .plot')).toBeVisible();
  await expect(page.locator('app-rehearsal-result app-reach-chart canvas')).toBeVisible();
  const facts = page.locator('app-rehearsal-result .facts');
  await expect(facts).toContainText('5,000 · allhands-2026');
  const firstAverage = await facts.locator('div').first().locator('dd').textContent();
  await expect(page.getByRole('link', { name: 'Replay a sample cascade' })).toHaveAttribute('href', /^\/replay\/\d+$/);
  await keepScreenshot(page, 'plans-rehearsal');

  // Re-run from the seed: the very same numbers.
  await page.getByRole('button', { name: 'Re-run from seed' }).click();
  await expect(page.locator('app-rehearsal-result .match')).toContainText(/Identical to rehearsal #\d+/, { timeout: 60_000 });
  await expect(facts.locator('div').first().locator('dd')).toHaveText(firstAverage!);
  const history = page.getByRole('table', { name: 'Rehearsals of this room' });
  await expect(history.locator('tbody tr').first()).toContainText('allhands-2026');
  await expect(history.locator('tbody tr').nth(1)).toContainText('allhands-2026');
  const finished = await history.locator('tbody tr').count();
  await page.getByRole('combobox', { name: 'Status' }).click();
  await page.getByRole('option', { name: 'cancelled' }).click();
  await expect(history).toContainText('No rehearsals match.');
  await expect(page.getByRole('listbox')).toBeHidden();
  await page.getByRole('combobox', { name: 'Status' }).click();
  await page.getByRole('option', { name: 'finished' }).click();
  await expect(history.locator('tbody tr')).toHaveCount(finished);
  await keepScreenshot(page, 'plans-rehearsal-rerun');

  // The briefing sheet, on screen and in print.
  await page.goto(autoPlanUrl);
  await page.getByRole('link', { name: 'Briefing sheet' }).first().click();
  const sheet = page.getByRole('article', { name: 'Briefing sheet' });
  await expect(sheet.locator('table.who tbody tr')).toHaveCount(4);
  await expect(sheet).toContainText(/90%.* will have heard within \d+ minutes/);
  await expect(sheet).toContainText('not what they are worth');
  await expect(sheet).toContainText('planning aid');
  await page.getByLabel('Time the message goes out').fill('08:30');
  await expect(sheet.locator('.clock')).toContainText(/will have heard by about \d\d:\d\d/);
  await keepScreenshot(page, 'plans-briefing');
  const pdfHref = await page.getByRole('link', { name: 'Download PDF' }).getAttribute('href');
  const pdf = await page.request.get(pdfHref!);
  expect(pdf.headers()['content-type']).toContain('application/pdf');
  expect((await pdf.body()).subarray(0, 5).toString()).toBe('%PDF-');
  const csvHref = await page.getByRole('link', { name: 'Download CSV' }).getAttribute('href');
  const csv = await page.request.get(csvHref!);
  expect(csv.headers()['content-type']).toContain('text/csv');
  expect((await csv.text()).split('\n').filter((l) => l.trim()).length).toBeGreaterThan(4);
  await page.emulateMedia({ media: 'print' });
  await expect(page.getByRole('button', { name: 'Print' })).toBeHidden();
  await expect(page.locator('mat-toolbar')).toBeHidden();
  await expect(sheet).toBeVisible();
  await keepScreenshot(page, 'plans-briefing-print');
});

test('a hand-made plan gets the same scores as a computed one', async ({ page }) => {
  await signIn(page, DEMO.facilitator);
  const room = await workshopRoom(page);
  await page.goto(`/rooms/${room.id}/plans`);
  await page.getByRole('radio', { name: 'Pick them myself' }).click();
  await expect(page.getByText('Pick at least one starter.')).toHaveCount(0);
  await expect(page.getByRole('button', { name: 'Score my starters' })).toBeDisabled();
  await expect(page.getByText('Pick at least one starter to continue.')).toBeVisible();
  const pick = page.getByLabel('Starters: search people');
  for (let i = 0; i < 2; i++) {
    await pick.click();
    await page
      .getByRole('option')
      .nth(i * 3)
      .click();
  }
  await page.getByRole('button', { name: 'Score my starters' }).click();
  await expect(page.locator('app-plan-result .starters .starter')).toHaveCount(2);
  await expect(page.locator('app-plan-scores')).toContainText('Hand-made');
  await expect(page.locator('app-plan-scores')).toContainText('Quality rank');
  await keepScreenshot(page, 'plans-hand-made');

  // Editing the room afterwards marks the plan as made on an older version.
  const current = await (await page.request.get(`/api/rooms/${room.id}`)).json();
  const xsrf = (await page.context().cookies()).find((c) => c.name === 'XSRF-TOKEN')!.value;
  const patched = await page.request.patch(`/api/rooms/${room.id}`, {
    headers: { 'X-XSRF-TOKEN': decodeURIComponent(xsrf) },
    data: { version: current.version, settings: { minutesPerHop: current.settings.minutesPerHop + 1 } },
  });
  expect(patched.ok()).toBeTruthy();
  await page.reload();
  await expect(page.locator('.result-head .badge.stale')).toContainText('The room changed since this plan');
  await expect(page.getByRole('table', { name: 'Saved plans' }).locator('.badge.stale').first()).toBeVisible();
});

test('the plan form explains conflicting constraints before anything is sent', async ({ page }) => {
  await signIn(page, DEMO.facilitator);
  const room = await workshopRoom(page);
  await page.goto(`/rooms/${room.id}/plans`);
  await page.getByRole('spinbutton', { name: 'Budget k' }).fill('1');
  const must = page.getByLabel('Must be briefed: search people');
  await must.click();
  await page.getByRole('option').nth(0).click();
  await must.click();
  await page.getByRole('option').nth(0).click();
  await expect(page.getByText('2 people must be briefed but the budget is 1')).toBeVisible();
  let posted = false;
  page.on('request', (r) => {
    if (r.method() === 'POST' && r.url().endsWith('/plans')) posted = true;
  });
  await expect(page.getByRole('button', { name: 'Find the starters' })).toBeDisabled();
  expect(posted).toBe(false);
});
