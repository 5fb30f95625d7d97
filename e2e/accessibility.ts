import AxeBuilder from '@axe-core/playwright';
import type { BrowserContext, Page } from '@playwright/test';

/**
 * axe-core (Deque's accessibility rules engine) on every page a test visits, in every browser
 * context it opens (the facilitator's, a participant's phone), against the WCAG 2.1 A and AA
 * rules; any serious or critical violation fails the test. Each distinct page (its path with ids
 * and link tokens folded, at phone or desktop width) is checked once per run.
 *
 * axe runs on the page's own main thread, so it never runs beside the test's steps: a page
 * reached with `page.goto` is checked right after it loads (the test waits), and a page reached
 * by a click is opened again in the same context when the test ends (or before the test closes
 * that context) and checked then.
 */
const checked = new Set<string>();
const BLOCKING = new Set(['serious', 'critical']);
/** axe's tags for the WCAG 2.0 / 2.1 A and AA rules. */
const WCAG_AA = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];
const QUIET_MS = 300;
const SETTLE_LIMIT_MS = 5000;

/** axe's serious and critical findings on the page as it is now, one line (and up to four places) each. */
export async function blockingViolations(page: Page): Promise<string[]> {
  const result = await new AxeBuilder({ page }).withTags(WCAG_AA).options({ iframes: false }).exclude('iframe').analyze();
  return result.violations
    .filter((x) => BLOCKING.has(x.impact ?? ''))
    .map((v) => {
      const where = v.nodes
        .slice(0, 4)
        .map((n) => `      ${n.target.join(' ')}: ${n.failureSummary?.split('\n').slice(1, 2).join('').trim() ?? ''}`)
        .join('\n');
      return `[${v.impact}] ${v.id}: ${v.help} (${v.nodes.length} places)\n${where}`;
    });
}

export const pageKey = (url: string, width: number) => {
  const path = new URL(url).pathname.replace(/\/[A-Za-z0-9_-]{43}(?=\/|$)/g, '/:token').replace(/\/\d+(?=\/|$)/g, '/:id');
  return `${path} @${width <= 600 ? 'phone' : 'desktop'}`;
};

type Goto = Page['goto'];

export class AxeWatch {
  readonly violations: string[] = [];
  /** Pages reached by a click, to check before their context closes: context -> url by key. */
  private readonly later = new Map<BrowserContext, Map<string, string>>();
  private readonly quiet = new WeakMap<Page, () => Promise<void>>();

  /** `spent(ms)` is told how long each check took, so the test's own time budget can grow by it. */
  constructor(private readonly spent: (ms: number) => void = () => undefined) {}

  watchContext(ctx: BrowserContext): void {
    ctx.pages().forEach((p) => this.watch(p));
    ctx.on('page', (p) => this.watch(p));
    const close = ctx.close.bind(ctx);
    ctx.close = async (...args: Parameters<BrowserContext['close']>) => {
      await this.checkLater(ctx);
      return close(...args);
    };
  }

  private watch(page: Page): void {
    this.quiet.set(page, settleWatcher(page));
    const goto: Goto = page.goto.bind(page);
    page.goto = async (...args: Parameters<Goto>) => {
      const response = await goto(...args);
      await this.check(page);
      return response;
    };
    page.on('framenavigated', (frame) => {
      if (frame !== page.mainFrame() || !frame.url().startsWith('http')) return;
      const key = this.keyOf(page, frame.url());
      if (checked.has(key)) return;
      const queue = this.later.get(page.context()) ?? new Map<string, string>();
      queue.set(key, frame.url());
      this.later.set(page.context(), queue);
    });
  }

  private keyOf(page: Page, url: string): string {
    return pageKey(url, page.viewportSize()?.width ?? 1366);
  }

  /** Checks the page as it is now, once its requests have settled. */
  private async check(page: Page): Promise<void> {
    const url = page.url();
    if (!url.startsWith('http')) return;
    const key = this.keyOf(page, url);
    if (checked.has(key)) return;
    await this.quiet.get(page)?.();
    if (page.isClosed() || this.keyOf(page, page.url()) !== key) return;
    checked.add(key);
    const started = Date.now();
    try {
      // Frames are left out: the outbox's sandboxed mail preview runs no script, so axe could
      // never answer from inside it (the message itself is generated mail, not one of our pages).
      this.violations.push(...(await blockingViolations(page)).map((v) => `${key}: ${v}`));
    } finally {
      this.spent(Date.now() - started);
    }
  }

  /** Opens each page reached by a click (and not checked yet) again in its context, and checks it. */
  private async checkLater(ctx: BrowserContext): Promise<void> {
    const queue = this.later.get(ctx);
    this.later.delete(ctx);
    for (const [key, url] of queue ?? []) {
      if (checked.has(key)) continue;
      const page = await ctx.newPage();
      try {
        await page.goto(url);
      } finally {
        await page.close();
      }
    }
  }

  /** At the end of the test: the pages still waiting in every context that is still open. */
  async finish(contexts: BrowserContext[]): Promise<void> {
    for (const ctx of contexts) if (this.later.has(ctx)) await this.checkLater(ctx);
  }
}

/** A function that resolves once no request has been in flight for QUIET_MS (at most SETTLE_LIMIT_MS). */
function settleWatcher(page: Page): () => Promise<void> {
  let inflight = 0;
  const waiters = new Set<() => void>();
  const poke = () => waiters.forEach((w) => w());
  const counts = (r: { resourceType(): string }) => r.resourceType() !== 'eventsource';
  page.on('request', (r) => {
    if (counts(r)) inflight++;
    poke();
  });
  const done = (r: { resourceType(): string }) => {
    if (counts(r)) inflight = Math.max(0, inflight - 1);
    poke();
  };
  page.on('requestfinished', done);
  page.on('requestfailed', done);
  return () =>
    new Promise<void>((resolve) => {
      let quiet: ReturnType<typeof setTimeout> | undefined;
      const limit = setTimeout(finish, SETTLE_LIMIT_MS);
      function finish() {
        clearTimeout(limit);
        clearTimeout(quiet);
        waiters.delete(check);
        resolve();
      }
      function check() {
        clearTimeout(quiet);
        if (inflight === 0) quiet = setTimeout(finish, QUIET_MS);
      }
      waiters.add(check);
      check();
    });
}
