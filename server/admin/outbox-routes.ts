import { Router, type NextFunction, type Request, type Response } from 'express';
import type { OutboxMessage, OutboxRow } from '../../shared/api/accounts';
import type { Page } from '../../shared/api/lists';
import { adminOnly } from '../core/access';
import { notFound } from '../core/http-error';
import { parse } from '../core/validate';
import { mailFakeOn } from '../mail/transport';
import { idParams, pageQuery } from './queries';
import { findOutboxMessage, listOutbox } from './store';

/** The outbox exists only while the local SMTP fake catches mail (MAIL_MODE=fake). */
function fakeOn(_req: Request, _res: Response, next: NextFunction) {
  if (!mailFakeOn()) return next(notFound('The outbox (it exists only while MAIL_MODE=fake)'));
  next();
}

const toRow = (m: { id: number; envelopeTo: string; subject: string | null; createdAt: Date }): OutboxRow => ({
  id: m.id,
  to: m.envelopeTo,
  subject: m.subject,
  createdAt: m.createdAt.toISOString(),
});

export const outboxRouter = Router();

outboxRouter.get('/', adminOnly(), fakeOn, async (req, res) => {
  const q = parse(pageQuery, req.query, 'query');
  const { rows, total } = await listOutbox(q);
  const page: Page<OutboxRow> = { items: rows.map((r) => toRow({ ...r, envelopeTo: r.to })), total, page: q.page, pageSize: q.pageSize };
  res.json(page);
});

outboxRouter.get('/:id', adminOnly(), fakeOn, async (req, res) => {
  const m = await findOutboxMessage(parse(idParams, req.params, 'address').id);
  if (!m) throw notFound('That message');
  const message: OutboxMessage = { ...toRow(m), from: m.envelopeFrom, text: m.textBody, hasHtml: !!m.htmlBody };
  res.json(message);
});

/**
 * The HTML part, for a sandboxed iframe. Its own CSP: no scripts, no network, inline styles
 * only (mail HTML is styled inline), and it may be framed by this app alone.
 */
outboxRouter.get('/:id/html', adminOnly(), fakeOn, async (req, res) => {
  const m = await findOutboxMessage(parse(idParams, req.params, 'address').id);
  if (!m?.htmlBody) throw notFound('The HTML part of that message');
  res
    .set('Content-Security-Policy', "default-src 'none'; style-src 'unsafe-inline'; img-src data:; sandbox; frame-ancestors 'self'")
    .set('X-Frame-Options', 'SAMEORIGIN')
    .set('Cache-Control', 'no-store')
    .type('html')
    .send(m.htmlBody);
});
