import type { Logger } from 'pino';
import type { AccountRole } from '../shared/api/accounts';

export interface SignedInUser {
  id: number;
  email: string;
  name: string;
  role: AccountRole;
}

declare global {
  namespace Express {
    interface Request {
      /** The signed-in account, read with its session (at most SESSION_CACHE_MS old, see server/core/session-cache.ts). */
      user?: SignedInUser;
      id: string | number | object;
      /** This request's logger (server/core/logging.ts). */
      log?: Logger;
    }
  }
}

declare module 'express-session' {
  interface SessionData {
    userId?: number;
    /** Epoch ms of sign-in, for the absolute session lifetime. */
    signedInAt?: number;
  }
}
