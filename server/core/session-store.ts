import session from 'express-session';
import MySQLStoreFactory from 'express-mysql-session';
import type { RowDataPacket } from 'mysql2';
import type { AccountRole } from '../../shared/api/accounts';
import { config } from '../config';
import { pool } from '../db';
import { SessionCache, type CachedSession } from './session-cache';

/** The signed-in account as read together with its session row. */
export interface SessionAccount {
  id: number;
  email: string;
  name: string;
  role: AccountRole;
  status: string;
}

const MySQLStore = MySQLStoreFactory(session as never);
/** The request express-session hands to `createSession` (its own type: this file speaks no HTTP). */
type SessionRequest = Parameters<session.Store['createSession']>[0];

/**
 * Read one session row and its account in one statement (the session's `userId` joined to
 * `users`), so a signed-in request makes one database round trip before its route instead of
 * two, and none while this process's copy is fresh (`SessionCache`, at most `SESSION_CACHE_MS`):
 * a sign-out, a deactivation or a role change made by this process counts on its next request,
 * one made by any other process within that time.
 */
const READ = `SELECT s.data AS data, s.expires AS expires, u.id AS id, u.email AS email, u.name AS name, u.role AS role, u.status AS status
  FROM sessions s LEFT JOIN users u ON u.id = CAST(JSON_VALUE(s.data, '$.userId') AS UNSIGNED)
  WHERE s.session_id = ?`;

type Row = RowDataPacket & { data: string | null; expires: number; id: number | null } & Omit<SessionAccount, 'id'>;

/** Session data object (as handed to express-session) -> the account read with it. */
const readWith = new WeakMap<object, SessionAccount | null>();
/** Request -> the account read with its session (set when express-session inflates it). */
const accountOf = new WeakMap<SessionRequest, SessionAccount | null>();

/** The account read with this request's session, or undefined when the session was not read from the store. */
export function sessionAccount(req: SessionRequest): SessionAccount | null | undefined {
  return accountOf.get(req);
}

export class SessionStore extends MySQLStore {
  /** This process's copies of the sessions it read (one cache per store). */
  readonly cache: SessionCache;

  constructor(
    schema: { tableName: string; columnNames: { session_id: string; expires: string; data: string } },
    cacheMs = config.SESSION_CACHE_MS,
  ) {
    // The store's own clean-up timer keeps finished processes alive; the caller runs its own.
    super({ createDatabaseTable: false, clearExpired: false, schema }, pool as never);
    this.cache = new SessionCache(cacheMs);
  }

  override get(sid: string): Promise<session.SessionData | null>;
  override get(sid: string, callback: (err: unknown, session?: session.SessionData | null) => void): void;
  override get(
    sid: string,
    callback?: (err: unknown, session?: session.SessionData | null) => void,
  ): Promise<session.SessionData | null> | void {
    return settle(this.read(sid), callback);
  }

  /** Saved (sign-in): copies of the old contents are forgotten before and after the write. */
  override set(sid: string, data: session.SessionData): Promise<void>;
  override set(sid: string, data: session.SessionData, callback: (err: unknown) => void): void;
  override set(sid: string, data: session.SessionData, callback?: (err: unknown) => void): Promise<void> | void {
    this.cache.forget(sid);
    return settle(
      super.set(sid, data).finally(() => this.cache.forget(sid)),
      callback,
    );
  }

  /** Destroyed (sign-out, lifetime over, account gone): no copy outlives the delete. */
  override destroy(sid: string): Promise<void>;
  override destroy(sid: string, callback: (err: unknown) => void): void;
  override destroy(sid: string, callback?: (err: unknown) => void): Promise<void> | void {
    this.cache.forget(sid);
    return settle(
      super.destroy(sid).finally(() => this.cache.forget(sid)),
      callback,
    );
  }

  private async read(sid: string): Promise<session.SessionData | null> {
    const row = await this.cache.read(sid, () => load(sid));
    if (!row || row.expires < Math.round(Date.now() / 1000)) return null;
    const data = JSON.parse(row.data) as session.SessionData;
    readWith.set(data, row.account);
    return data;
  }

  override createSession(req: SessionRequest, data: session.SessionData): session.Session & session.SessionData {
    const account = readWith.get(data);
    if (account !== undefined) accountOf.set(req, account);
    return super.createSession(req, data);
  }
}

async function load(sid: string): Promise<CachedSession | null> {
  const [rows] = await pool.query<Row[]>(READ, [sid]);
  const row = rows[0];
  if (!row || row.data === null) return null;
  const account =
    row.id === null ? null : Object.freeze({ id: Number(row.id), email: row.email, name: row.name, role: row.role, status: row.status });
  return { data: row.data, expires: Number(row.expires), account };
}

/** A promise handed back, or to express-session's callback when it gave one. */
function settle<T>(work: Promise<T>, callback?: (err: unknown, value?: T) => void): Promise<T> | void {
  if (!callback) return work;
  work.then(
    (value) => callback(null, value),
    (err: unknown) => callback(err),
  );
}
