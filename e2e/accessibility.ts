import AxeBuilder from '@axe-core/playwright';
import type { Page } from '@playwright/test';

/**
 * axe-core (Deque's accessibility rules engine) on every page a test visits, in every browser
 * context it opens (the facilitator's, a participant's phone). Each distinct page (its path with
 * ids and link tokens folded, at its viewport width) is checked once per run, once its requests
 * have settled; the check fails the test on any serious or critical violation.
 */
const checked = new Set<string>();
const BLOCKING = new Set(['serious', 'critical']);
/** The WCAG 2.1 A and AA rules (axe's tags for them). */
const WCAG_AA = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];
const QUIET_MS = 300;
const SETTLE_LIMIT_MS = 5000;

export const pageKey = (url: string, width: number) => {
  const path = new URL(url).pathname.replace(/\/[A-Za-z0-9_-]{43}(?=\/|$)/g, '/:token').replace(/\/\d+(?=\/|$)/g, '/:id');
  return `${path} @${width <= 600 ? 'phone' : 'desktop'}`;
};

export class AxeWatch {
  readonly violations: string[] = [];
  private readonly pending = new Set<Promise<void>>();

  /** `spent(ms)` is told how long each check took, so the test's own time budget can grow by it. */
  constructor(private readonly spent: (ms: number) => void = () => undefined) {}

  watch(page: Page): void {
    let inflight = 0;
    const waiters = new Set<() => void>();
    const poke = () => waiters.forEach((w) => w());
    page.on('request', (r) => {
      if (r.resourceType() !== 'eventsource') inflight++;
      poke();
    });
    const done = (r: { resourceType(): string }) => {
      if (r.resourceType() !== 'eventsource') inflight = Math.max(0, inflight - 1);
      poke();
    };
    page.on('requestfinished', done);
    page.on('requestfailed', done);
    /** Resolves once no request has been in flight for QUIET_MS (or after SETTLE_LIMIT_MS). */
    const settled = () =>
      new Promise<void>((resolve) => {
        const limit = setTimeout(finish, SETTLE_LIMIT_MS);
        let quiet: ReturnType<typeof setTimeout> | undefined;
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
    page.on('framenavigated', (frame) => {
      if (frame !== page.mainFrame() || !frame.url().startsWith('http')) return;
      const run = this.check(page, frame.url(), settled);
      this.pending.add(run);
      void run.finally(() => this.pending.delete(run));
    });
  }

  private async check(page: Page, url: string, settled: () => Promise<void>): Promise<void> {
    const key = pageKey(url, page.viewportSize()?.width ?? 1366);
    if (checked.has(key)) return;
    await settled();
    if (page.isClosed() || page.url() !== url || checked.has(key)) return;
    checked.add(key);
    const started = Date.now();
    try {
      // Frames are left out: the outbox's sandboxed mail preview runs no script, so axe could never
      // answer from inside it (the message itself is plain generated mail, not a page of ours).
      const result = await new AxeBuilder({ page }).withTags(WCAG_AA).options({ iframes: false }).exclude('iframe').analyze();
      for (const v of result.violations.filter((x) => BLOCKING.has(x.impact ?? ''))) {
        const where = v.nodes
          .slice(0, 4)
          .map((n) => `      ${n.target.join(' ')}: ${n.failureSummary?.split('\n').slice(1, 2).join('').trim() ?? ''}`)
          .join('\n');
        this.violations.push(`${key}: [${v.impact}] ${v.id}: ${v.help} (${v.nodes.length} places)\n${where}`);
      }
      this.spent(Date.now() - started);
    } catch (err) {
      this.spent(Date.now() - started);
      // The test moved on (navigation, closed page) while axe ran: check this page on its next visit.
      checked.delete(key);
      if (!/closed|destroyed|navigat/i.test(String(err))) throw err;
    }
  }

  /** Waits for the checks still running, then checks each open page not checked yet as it is now. */
  async finish(pages: Page[]): Promise<void> {
    await Promise.all([...this.pending]);
    for (const page of pages) {
      if (!page.isClosed() && page.url().startsWith('http')) await this.check(page, page.url(), () => Promise.resolve());
    }
  }
}
