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
      /** The signed-in account, loaded fresh from the database on every request. */
      user?: SignedInUser;
      id: string | number | object;
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
