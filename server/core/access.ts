import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { forbidden, unauthorized } from './http-error';
import type { AccountRole } from '../../shared/api/accounts';

/**
 * Every API route starts with exactly one access policy handler (deny by default):
 * the route-table test walks the router and fails on any route without one.
 *   publicAccess   - anyone (sign-in, accept invitation, health)
 *   participantAccess - a participant link token in the URL; the route checks the token itself
 *   roles('admin') / roles('facilitator', 'admin') - a signed-in account with one of the roles
 */
export type AccessPolicy = { kind: 'public' } | { kind: 'participant' } | { kind: 'roles'; roles: readonly AccountRole[] };

export const policyOf = Symbol('ripplehall.accessPolicy');
export type PolicyHandler = RequestHandler & { [policyOf]: AccessPolicy };

function tag(handler: RequestHandler, policy: AccessPolicy): PolicyHandler {
  return Object.assign(handler, { [policyOf]: policy });
}

export const publicAccess: PolicyHandler = tag((_req, _res, next) => next(), { kind: 'public' });

export const participantAccess: PolicyHandler = tag((_req, _res, next) => next(), { kind: 'participant' });

export function roles(...allowed: AccountRole[]): PolicyHandler {
  return tag(
    (req: Request, _res: Response, next: NextFunction) => {
      const user = req.user;
      if (!user) return next(unauthorized());
      if (!allowed.includes(user.role)) return next(forbidden());
      next();
    },
    { kind: 'roles', roles: allowed },
  );
}

/** Signed-in facilitators and admins (admins can do everything a facilitator can). */
export const signedIn = () => roles('facilitator', 'admin');
export const adminOnly = () => roles('admin');
