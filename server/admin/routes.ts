import { Router } from 'express';
import { z } from 'zod';
import { ACCOUNT_ROLES, accountSortKeys, EMAIL_MAX, NAME_MAX, type AdminSettings, type AuditRow } from '../../shared/api/accounts';
import { adminOnly } from '../core/access';
import { auditFor } from '../core/audit';
import { parse } from '../core/validate';
import { accountPage, changeRole, invite, resendInvitation, revokeInvitation, sendResetLink, setStatus } from './service';
import { listAudit } from './store';
import { outboxRouter } from './outbox-routes';
import { idParams, pageFields } from './queries';
import { LIST_LIMITS, pageQueryFields, type Page } from '../../shared/api/lists';
import { mailFakeOn } from '../mail/transport';

const accountsQuery = z.strictObject(
  pageQueryFields({ ...LIST_LIMITS.admin, sorts: accountSortKeys, sort: 'createdAt', direction: 'desc' }),
);
const auditQuery = z.strictObject(pageFields);
const inviteBody = z.strictObject({
  email: z.string().trim().toLowerCase().email('Enter an e-mail address.').max(EMAIL_MAX),
  name: z.string().trim().max(NAME_MAX).default(''),
  role: z.enum(ACCOUNT_ROLES).default('facilitator'),
});
const roleBody = z.strictObject({ role: z.enum(ACCOUNT_ROLES) });

/** The admin console API: every route is admin-only. */
export const adminRouter = Router();

adminRouter.get('/settings', adminOnly(), (_req, res) => {
  const settings: AdminSettings = { mailFake: mailFakeOn() };
  res.json(settings);
});

adminRouter.get('/accounts', adminOnly(), async (req, res) => {
  res.json(await accountPage(parse(accountsQuery, req.query, 'query')));
});

adminRouter.post('/invitations', adminOnly(), async (req, res) => {
  const body = parse(inviteBody, req.body);
  res.status(201).json(await invite(req.user!, body.email, body.name, body.role, auditFor(req)));
});

adminRouter.post('/accounts/:id/invitation', adminOnly(), async (req, res) => {
  const { id } = parse(idParams, req.params, 'address');
  parse(z.strictObject({}), req.body ?? {});
  await resendInvitation(req.user!, id, auditFor(req));
  res.status(204).end();
});

adminRouter.delete('/accounts/:id/invitation', adminOnly(), async (req, res) => {
  await revokeInvitation(parse(idParams, req.params, 'address').id, auditFor(req));
  res.status(204).end();
});

adminRouter.post('/accounts/:id/deactivate', adminOnly(), async (req, res) => {
  await setStatus(req.user!, parse(idParams, req.params, 'address').id, 'deactivated', auditFor(req));
  res.status(204).end();
});

adminRouter.post('/accounts/:id/reactivate', adminOnly(), async (req, res) => {
  await setStatus(req.user!, parse(idParams, req.params, 'address').id, 'active', auditFor(req));
  res.status(204).end();
});

adminRouter.put('/accounts/:id/role', adminOnly(), async (req, res) => {
  const { id } = parse(idParams, req.params, 'address');
  await changeRole(id, parse(roleBody, req.body).role, auditFor(req));
  res.status(204).end();
});

adminRouter.post('/accounts/:id/password-reset', adminOnly(), async (req, res) => {
  await sendResetLink(parse(idParams, req.params, 'address').id, auditFor(req));
  res.status(204).end();
});

adminRouter.get('/audit', adminOnly(), async (req, res) => {
  const q = parse(auditQuery, req.query, 'query');
  const { rows, total } = await listAudit(q);
  const page: Page<AuditRow> = {
    items: rows.map((r) => ({ ...r, detail: r.detail as AuditRow['detail'], createdAt: r.createdAt.toISOString() })),
    total,
    page: q.page,
    pageSize: q.pageSize,
  };
  res.json(page);
});

adminRouter.use('/outbox', outboxRouter);
