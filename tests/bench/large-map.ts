/**
 * How long a large room's map takes to open, in Debian's Chromium against running servers:
 * from navigation to the map drawn (every SVG person in the page, or the overview's first frame,
 * then the next frame, so the paint is counted),
 * then "Find a person" to the person shown in the side panel, then one press of "Zoom in" to the
 * frame after it. With BENCH_URL_B as well, the two servers (say, two builds of the client on the
 * same database) are timed in turn, alternating which goes first, and the table puts them side by
 * side with the ratio of medians.
 *
 *   BENCH_URL=http://127.0.0.1:4300 [BENCH_URL_B=http://127.0.0.1:4301] npx tsx tests/bench/large-map.ts
 *   env: BENCH_SIZES (default 3000,20000), BENCH_RUNS (default 5), BENCH_EMAIL / BENCH_PASSWORD
 *
 * Rooms are invented (a ring with a chord to the person 12 places on, twelve units), named
 * "Bench map …", and deleted at the end.
 */
import { performance } from 'node:perf_hooks';
import { chromium, type Browser, type Page } from 'playwright-core';

const A = process.env['BENCH_URL'] ?? `http://127.0.0.1:${process.env['PORT'] ?? 4300}`;
const B = process.env['BENCH_URL_B'];
const SIZES = (process.env['BENCH_SIZES'] ?? '3000,20000').split(',').map(Number);
const RUNS = Math.max(1, Number(process.env['BENCH_RUNS'] ?? 5));
const WHO = {
  email: process.env['BENCH_EMAIL'] ?? 'facilitator@ripplehall.local',
  password: process.env['BENCH_PASSWORD'] ?? 'facilitate-demo-2026',
};
const CHROMIUM_ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-dev-shm-usage', '--disable-background-networking'];

type Step = 'open' | 'find' | 'zoom';
const times = new Map<string, number[]>();
const keep = (key: string, ms: number) => times.set(key, [...(times.get(key) ?? []), ms]);
const median = (xs: readonly number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const mid = Math.floor(s.length / 2);
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2;
};

async function signedIn(browser: Browser, base: string): Promise<Page> {
  const ctx = await browser.newContext({ baseURL: base, viewport: { width: 1366, height: 860 } });
  const page = await ctx.newPage();
  // A large room on a slow map can keep the page busy for long: wait rather than fail.
  page.setDefaultTimeout(300_000);
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(WHO.email);
  await page.getByLabel('Password').fill(WHO.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
  return page;
}

async function call(page: Page, method: string, path: string, data?: unknown): Promise<unknown> {
  const xsrf = (await page.context().cookies()).find((c) => c.name === 'XSRF-TOKEN')?.value ?? '';
  const res = await page.request.fetch(path, { method, data, headers: { 'X-XSRF-TOKEN': decodeURIComponent(xsrf) } });
  if (res.status() >= 300) throw new Error(`${method} ${path}: ${res.status()} ${await res.text()}`);
  return res.status() === 204 ? null : res.json();
}

/** The bench room as a node-link JSON file (a large room is over the JSON body limit, so it is imported). */
function benchRoomFile(n: number): Buffer {
  const nodes = Array.from({ length: n }, (_, i) => ({ id: `w${i}`, name: `Worker ${i + 1}`, group: `Unit ${(i % 12) + 1}` }));
  const links = nodes.flatMap((_, i) => [
    { source: `w${i}`, target: `w${(i + 1) % n}`, strength: 2 },
    { source: `w${i}`, target: `w${(i + 12) % n}`, strength: 1 },
  ]);
  return Buffer.from(JSON.stringify({ directed: false, nodes, links }));
}

async function importRoom(page: Page, n: number): Promise<number> {
  const xsrf = (await page.context().cookies()).find((c) => c.name === 'XSRF-TOKEN')?.value ?? '';
  const res = await page.request.post('/api/rooms/import?dryRun=false', {
    headers: { 'X-XSRF-TOKEN': decodeURIComponent(xsrf) },
    multipart: {
      file: { name: `bench-${n}.json`, mimeType: 'application/json', buffer: benchRoomFile(n) },
      format: 'json',
      name: `Bench map ${n} ${Date.now()}`,
    },
    timeout: 300_000,
  });
  if (res.status() !== 201) throw new Error(`import of ${n} people: ${res.status()} ${await res.text()}`);
  return ((await res.json()) as { roomId: number }).roomId;
}

/** One visit: navigation to drawn, find to shown, zoom press to the next frame. */
async function visit(page: Page, id: number, n: number): Promise<Record<Step, number>> {
  await page.goto('/rooms');
  const t0 = performance.now();
  await page.goto(`/rooms/${id}`);
  await page.waitForFunction(
    (count: number) =>
      document.querySelectorAll('app-room-map g.person').length === count ||
      document.querySelector('app-room-map canvas[aria-busy="false"]') !== null,
    n,
    { polling: 'raf', timeout: 300_000 },
  );
  // The SVG people exist before they are painted: count the frame that paints them too.
  await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
  const open = performance.now() - t0;
  const name = `Worker ${n - 1}`;
  const t1 = performance.now();
  await page.getByLabel('Find a person').fill(name);
  await page.getByRole('option', { name: new RegExp(`^${name}\\b`) }).click();
  await page.waitForFunction((who: string) => document.querySelector('app-map-inspector h3')?.textContent?.trim() === who, name, {
    polling: 'raf',
  });
  const find = performance.now() - t1;
  const zoom = await page.evaluate(async () => {
    const button = document.querySelector<HTMLButtonElement>('button[aria-label="Zoom in"]');
    const t = performance.now();
    button?.click();
    await new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r)));
    return performance.now() - t;
  });
  return { open, find, zoom };
}

async function main(): Promise<void> {
  const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS });
  const servers = B ? [A, B] : [A];
  const pages = await Promise.all(servers.map((s) => signedIn(browser, s)));
  const rooms = new Map<number, number>();
  for (const n of SIZES) rooms.set(n, await importRoom(pages[0]!, n));
  try {
    for (let run = 0; run < RUNS; run++)
      for (const n of SIZES) {
        const order = run % 2 ? [...servers.keys()].reverse() : [...servers.keys()];
        for (const i of order) {
          const t = await visit(pages[i]!, rooms.get(n)!, n);
          for (const step of Object.keys(t) as Step[]) keep(`${n}|${step}|${i}`, t[step]);
          console.error(
            `run ${run + 1} · ${n} people · ${servers[i]}: open ${t.open.toFixed(0)} ms, find ${t.find.toFixed(0)} ms, zoom ${t.zoom.toFixed(0)} ms`,
          );
        }
      }
  } finally {
    for (const id of rooms.values()) await call(pages[0]!, 'DELETE', `/api/rooms/${id}`).catch(() => undefined);
    await browser.close();
  }
  report(servers);
}

function report(servers: readonly string[]): void {
  console.log(`\nmedians of ${RUNS} runs (ms)${servers.length > 1 ? `; A = ${servers[0]}, B = ${servers[1]}` : ''}`);
  console.log(servers.length > 1 ? 'people | step | A | B | A / B' : 'people | step | median');
  for (const n of SIZES)
    for (const step of ['open', 'find', 'zoom'] as Step[]) {
      const m = servers.map((_, i) => median(times.get(`${n}|${step}|${i}`) ?? []));
      const ratio = m.length > 1 ? ` | ${(m[0]! / m[1]!).toFixed(1)}` : '';
      console.log(`${n} | ${step} | ${m.map((x) => x.toFixed(0)).join(' | ')}${ratio}`);
    }
}

await main();
