/**
 * Routine steps as a facilitator and a participant feel them: click (or address) to result, in
 * Debian's Chromium against a running server; a result counts as shown on the first animation
 * frame that has it (onScreen). Prints one table: median and 95th percentile of
 * each step over RUNS repetitions (the goal is every step under 500 ms at p95 on a quiet machine;
 * signing in includes the password hash, which keeps its deliberate cost).
 *
 *   npm start (or any running server), then: BENCH_URL=http://127.0.0.1:4300 npm run bench:ui
 *   env: BENCH_URL (default http://127.0.0.1:$PORT or :4300), BENCH_RUNS (default 9),
 *        BENCH_EMAIL / BENCH_PASSWORD (default the demo facilitator), BENCH_JSON=file to keep figures,
 *        BENCH_ONLY=phone to time only the participant's phone page (more runs in the same time),
 *        BENCH_URL_B=http://… a second server on the same database (another build, say): each round
 *        then also opens the phone page there, alternating, and the table has a "[B]" row for it.
 *
 * It creates its own room, workshop and plan (named "Bench …") and deletes them at the end.
 */
import { writeFileSync } from 'node:fs';
import { performance } from 'node:perf_hooks';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

const BASE = process.env['BENCH_URL'] ?? `http://127.0.0.1:${process.env['PORT'] ?? 4300}`;
const RUNS = Math.max(3, Number(process.env['BENCH_RUNS'] ?? 9));
const PHONE_ONLY = process.env['BENCH_ONLY'] === 'phone';
const BASE_B = process.env['BENCH_URL_B'];
const WHO = {
  email: process.env['BENCH_EMAIL'] ?? 'facilitator@ripplehall.local',
  password: process.env['BENCH_PASSWORD'] ?? 'facilitate-demo-2026',
};
const CHROMIUM_ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-dev-shm-usage', '--disable-background-networking'];

const times = new Map<string, number[]>();

/** Times one step: `act` starts it, `done` resolves when its result is on the screen. */
async function step(name: string, act: () => Promise<unknown>, done: () => Promise<unknown>): Promise<void> {
  const t0 = performance.now();
  await act();
  await done();
  const ms = performance.now() - t0;
  times.set(name, [...(times.get(name) ?? []), ms]);
}

/**
 * Resolves on the first animation frame where `test` holds in the page. Playwright's own waits
 * poll with a growing pause (up to half a second), which would count time after the result was
 * already on the screen.
 */
async function onScreen<A extends string | number>(page: Page, test: (arg: A) => boolean, arg?: A): Promise<void> {
  // The test runs in the page with `arg` as its one argument (a string or a number crosses as it is).
  const inPage = test as unknown as Parameters<Page['waitForFunction']>[0];
  await page.waitForFunction(inPage, arg, { polling: 'raf', timeout: 60_000 });
}

const quantile = (xs: number[], q: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.ceil(q * s.length) - 1)];
};

async function api(page: Page, method: string, path: string, data?: unknown) {
  const xsrf = (await page.context().cookies()).find((c) => c.name === 'XSRF-TOKEN')?.value ?? '';
  const res = await page.request.fetch(`${BASE}${path}`, { method, data, headers: { 'X-XSRF-TOKEN': decodeURIComponent(xsrf) } });
  if (res.status() >= 300) throw new Error(`${method} ${path}: ${res.status()} ${await res.text()}`);
  return res.status() === 204 ? null : res.json();
}

/** A small invented room (a ring of twelve with a few cross ties) to plan, rehearse and edit. */
function benchRoom() {
  const people = Array.from({ length: 12 }, (_, i) => ({ key: `b${i}`, name: `Bench person ${i + 1}`, group: `Table ${(i % 3) + 1}` }));
  const ties = people.map((_, i) => ({ source: `b${i}`, target: `b${(i + 1) % 12}`, strength: 2 }));
  ties.push({ source: 'b0', target: 'b6', strength: 1 }, { source: 'b3', target: 'b9', strength: 1 });
  return { name: `Bench room ${Date.now()}`, people, ties };
}

async function signInStep(browser: Browser): Promise<{ ctx: BrowserContext; page: Page }> {
  const ctx = await browser.newContext({ baseURL: BASE, viewport: { width: 1366, height: 860 } });
  const page = await ctx.newPage();
  await page.goto('/sign-in');
  // A person takes a few seconds to type: by then the page has fetched the other pages' code in
  // the background (the preloading), which is not part of signing in.
  await page.waitForLoadState('networkidle');
  await page.getByLabel('E-mail').fill(WHO.email);
  await page.getByLabel('Password').fill(WHO.password);
  const answered = page.waitForResponse((r) => r.url().endsWith('/api/auth/sign-in'));
  await step(
    'sign in (includes the password hash)',
    () => page.getByRole('button', { name: 'Sign in' }).click(),
    () => onScreen(page, () => [...document.querySelectorAll('h1, h2')].some((h) => h.textContent?.trim() === 'Rooms')),
  );
  // The same click less the hash the server reports (Server-Timing): what everything else adds.
  const hash = /hash;dur=([\d.]+)/.exec((await answered).headers()['server-timing'] ?? '')?.[1];
  const all = times.get('sign in (includes the password hash)')!;
  if (hash)
    times.set('sign in, less the password hash', [...(times.get('sign in, less the password hash') ?? []), all.at(-1)! - Number(hash)]);
  return { ctx, page };
}

async function facilitatorRound(page: Page, ids: { room: number; roomName: string; workshop: number; rehearsal: number }, i: number) {
  await page.goto(`/workshops/${ids.workshop}`);
  await page.getByRole('heading', { name: /Bench workshop/ }).waitFor();
  await step(
    'add participant',
    async () => {
      const name = page.getByLabel('Name', { exact: true });
      await name.fill(`Bench participant ${i + 1}`);
      await name.press('Enter');
    },
    () =>
      onScreen(
        page,
        (name) => [...document.querySelectorAll('td, [role="cell"]')].some((c) => c.textContent?.trim() === name),
        `Bench participant ${i + 1}`,
      ),
  );
  await step(
    'open rooms',
    () => page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: /Rooms/ }).click(),
    () => onScreen(page, (name) => [...document.querySelectorAll('a')].some((a) => a.textContent?.trim() === name), ids.roomName),
  );
  await step(
    'open a room',
    () => page.getByRole('link', { name: ids.roomName, exact: true }).click(),
    () => onScreen(page, () => !!document.querySelector('g.person')),
  );
  const before = await page.locator('g.person').count();
  await step(
    'add person (until saved)',
    () => page.getByRole('button', { name: 'Add person' }).click(),
    () =>
      onScreen(
        page,
        (n) => document.querySelectorAll('g.person').length > n && (document.body.textContent ?? '').includes('All changes saved'),
        before,
      ),
  );
  // The new person has no ties: take them out again, or the room would gain a closed group per round.
  const room = (await api(page, 'GET', `/api/rooms/${ids.room}`)) as { version: number; people: { id: number; key: string }[] };
  const added = room.people.filter((p) => !p.key.startsWith('b'));
  if (added.length)
    await api(page, 'POST', `/api/rooms/${ids.room}/edits`, {
      version: room.version,
      ops: added.map((p) => ({ op: 'deletePerson', id: p.id })),
    });
  await page.goto(`/rooms/${ids.room}/plans`);
  await page.getByRole('heading', { name: 'Whom to brief first' }).waitFor();
  const k = 2 + (i % 3);
  await page.getByRole('spinbutton', { name: 'Budget k' }).fill(String(k));
  const shownBefore = new URL(page.url()).searchParams.get('plan');
  await step(
    'make a plan',
    () => page.getByRole('button', { name: 'Find the starters' }).click(),
    async () => {
      // The new plan's own result: the address names another plan and it lists exactly k starters.
      await page.waitForURL((u) => (u.searchParams.get('plan') ?? shownBefore) !== shownBefore, { timeout: 60_000 });
      await onScreen(page, (n) => document.querySelectorAll('app-plan-result .starters .starter').length >= n, k);
    },
  );
  await step(
    'open briefing sheet',
    () => page.getByRole('link', { name: 'Briefing sheet' }).first().click(),
    () => onScreen(page, () => !!document.querySelector('article[aria-label="Briefing sheet"] h1')),
  );
  await page.goto(`/rooms/${ids.room}/plans`);
  await page.getByRole('heading', { name: 'Whom to brief first' }).waitFor();
  await step(
    'open replay',
    () => page.goto(`/replay/${ids.rehearsal}`, { waitUntil: 'commit' }),
    () => onScreen(page, () => !!document.querySelector('[data-testid="seed"]')),
  );
}

async function phoneRound(browser: Browser, path: string, base = BASE, label = '') {
  const phone = await browser.newContext({ baseURL: base, viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
  const p = await phone.newPage();
  await step(
    `open phone survey (cold page)${label}`,
    // Until the greeting is on a frame; the load event (fonts, icons) may come later and is not waited for.
    () => p.goto(path, { waitUntil: 'commit' }),
    () => onScreen(p, () => [...document.querySelectorAll('h1')].some((h) => h.textContent?.trim().startsWith('Hello, '))),
  );
  await phone.close();
  // What any address costs here before the page has a say: a fresh phone opens the icon (an SVG) from
  // the same server (same headers, so the same new renderer process Chromium starts for a page
  // that isolates itself from its opener) to its first frame. Not a step; it says how much of the
  // phone's time is the page's own.
  const floor = await browser.newContext({ baseURL: base, viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
  const f = await floor.newPage();
  await step(
    `  floor: the icon file, first frame${label}`,
    () => f.goto('/favicon.svg', { waitUntil: 'commit' }),
    () => onScreen(f, () => true),
  );
  await floor.close();
}

async function setUp(page: Page) {
  const room = benchRoom();
  const created = await api(page, 'POST', '/api/rooms', room);
  const plan = await api(page, 'POST', `/api/rooms/${created.id}/plans`, { k: 2, method: 'greedy' });
  const planId = plan.id ?? plan.plan.id;
  const started = await api(page, 'POST', `/api/plans/${planId}/rehearsals`, { runs: 200, seed: 'bench-ui' });
  const rehearsal = started.rehearsal.id as number;
  for (let t = 0; t < 300; t++) {
    if ((await api(page, 'GET', `/api/rehearsals/${rehearsal}`)).status === 'done') break;
    await page.waitForTimeout(200);
  }
  const w = await api(page, 'POST', '/api/workshops', { title: `Bench workshop ${Date.now()}`, sessionDate: '2026-12-03', roomId: null });
  await api(page, 'POST', `/api/workshops/${w.id}/participants`, { people: [{ name: 'Bench reader A' }, { name: 'Bench reader B' }] });
  await api(page, 'POST', `/api/workshops/${w.id}/status`, { to: 'collecting' });
  const links = (await api(page, 'POST', `/api/workshops/${w.id}/links/sheet`, {})) as { url: string }[];
  return {
    room: created.id as number,
    roomName: room.name,
    workshop: w.id as number,
    rehearsal,
    phonePath: new URL(links[0].url).pathname,
  };
}

async function main() {
  const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', headless: true, args: CHROMIUM_ARGS });
  let cleanup: (() => Promise<void>) | undefined;
  try {
    const first = await signInStep(browser);
    const ids = await setUp(first.page);
    cleanup = async () => {
      await api(first.page, 'DELETE', `/api/workshops/${ids.workshop}`).catch(() => undefined);
      await api(first.page, 'DELETE', `/api/rooms/${ids.room}`).catch(() => undefined);
      await first.ctx.close();
    };
    for (let i = 0; i < RUNS; i++) {
      if (!PHONE_ONLY) {
        if (i > 0) await (await signInStep(browser)).ctx.close();
        await facilitatorRound(first.page, ids, i).catch(async (err: unknown) => {
          const shot = process.env['BENCH_FAIL_PNG'] ?? 'bench-ui-failure.png';
          await first.page.screenshot({ path: shot, fullPage: true }).catch(() => undefined);
          console.error(`Round ${i + 1} failed on ${first.page.url()}; the page is in ${shot}`);
          throw err;
        });
      }
      await phoneRound(browser, ids.phonePath);
      if (BASE_B) await phoneRound(browser, ids.phonePath, BASE_B, ' [B]');
    }
  } finally {
    await cleanup?.();
    await browser.close();
  }
  const rows = [...times].map(([name, xs]) => ({ name, runs: xs.length, median: quantile(xs, 0.5), p95: quantile(xs, 0.95) }));
  console.log(`\nRoutine steps against ${BASE} (${RUNS} runs each; click to result, ms)\n`);
  console.log(`${'step'.padEnd(38)} ${'runs'.padStart(4)} ${'median'.padStart(8)} ${'p95'.padStart(8)}  goal < 500 ms p95`);
  for (const r of rows) {
    const flag = r.name.includes('floor:')
      ? 'not a step'
      : r.p95 < 500
        ? 'ok'
        : r.name.includes('includes the password hash')
          ? 'hash'
          : 'SLOW';
    console.log(
      `${r.name.padEnd(38)} ${String(r.runs).padStart(4)} ${r.median.toFixed(0).padStart(8)} ${r.p95.toFixed(0).padStart(8)}  ${flag}`,
    );
  }
  if (process.env['BENCH_JSON']) writeFileSync(process.env['BENCH_JSON'], JSON.stringify(rows, null, 2));
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
