import session from 'express-session';
import MySQLStoreFactory from 'express-mysql-session';
import type { RowDataPacket } from 'mysql2';
import type { AccountRole } from '../../shared/api/accounts';
import { pool } from '../db';

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
 * two. Nothing is cached: every request still reads both rows, so a sign-out, a deactivation or
 * a role change made by any process counts on the next request everywhere.
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
  constructor(schema: { tableName: string; columnNames: { session_id: string; expires: string; data: string } }) {
    // The store's own clean-up timer keeps finished processes alive; the caller runs its own.
    super({ createDatabaseTable: false, clearExpired: false, schema }, pool as never);
  }

  override get(sid: string): Promise<session.SessionData | null>;
  override get(sid: string, callback: (err: unknown, session?: session.SessionData | null) => void): void;
  override get(
    sid: string,
    callback?: (err: unknown, session?: session.SessionData | null) => void,
  ): Promise<session.SessionData | null> | void {
    const read = this.read(sid);
    if (!callback) return read;
    read.then(
      (data) => callback(null, data),
      (err: unknown) => callback(err),
    );
  }

  private async read(sid: string): Promise<session.SessionData | null> {
    const [rows] = await pool.query<Row[]>(READ, [sid]);
    const row = rows[0];
    if (!row || row.data === null || row.expires < Math.round(Date.now() / 1000)) return null;
    const data = JSON.parse(row.data) as session.SessionData;
    readWith.set(
      data,
      row.id === null ? null : { id: Number(row.id), email: row.email, name: row.name, role: row.role, status: row.status },
    );
    return data;
  }

  override createSession(req: SessionRequest, data: session.SessionData): session.Session & session.SessionData {
    const account = readWith.get(data);
    if (account !== undefined) accountOf.set(req, account);
    return super.createSession(req, data);
  }
}
