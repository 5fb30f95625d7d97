import { randomUUID } from 'node:crypto';
import { createServer, type Server } from 'node:http';
import { after, before } from 'node:test';
import type { AddressInfo } from 'node:net';
import { users } from '../../db/schema/accounts';
import type { AccountRole } from '../../shared/api/accounts';
import { createApp } from '../../server/app';
import { hashPassword } from '../../server/auth/passwords';
import { db, pool } from '../../server/db';
import { closeLimiterStore } from '../../server/auth/limiter-store';
import { startJobs, stopJobs } from '../../server/jobs/index';
import { startMail, stopMail } from '../../server/mail/transport';
import { TestClient } from './http-client';

/**
 * Starts the real app (real MariaDB, real mail fake over SMTP) on a loopback port.
 * The database is the one named by DB_NAME, reset and migrated by scripts/test.sh; jobs run in
 * this process on the Redis of REDIS_URL / REDIS_PORT (scripts/redis.sh).
 */
export interface TestServer {
  url: string;
  client(): TestClient;
  stop(): Promise<void>;
}

export async function startTestServer(): Promise<TestServer> {
  if (process.env['NODE_ENV'] !== 'test') throw new Error('Run server tests with NODE_ENV=test (npm run test:server does).');
  await startMail();
  startJobs(true);
  const server: Server = createServer(createApp());
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  return {
    url,
    client: () => new TestClient(url),
    stop: async () => {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      // Jobs first: nothing may still write once the pool is closed.
      await stopJobs();
      await closeLimiterStore();
      await stopMail();
      await pool.end();
      // Safety net: a handle left open by a library must not hang the suite after its tests passed.
      setTimeout(() => {
        console.error('test server: handles still open 3 s after stop; exiting the test process');
        process.exit(process.exitCode ?? 0);
      }, 3000).unref();
    },
  };
}

export interface TestAccount {
  id: number;
  email: string;
  password: string;
  role: AccountRole;
}

/** Hashing at full strength is slow (~0.2 s): reuse one hash for every test account. */
let sharedHash: Promise<string> | undefined;
const TEST_PASSWORD = 'correct-horse-battery';

export async function createAccount(
  role: AccountRole = 'facilitator',
  status: 'active' | 'invited' | 'deactivated' = 'active',
): Promise<TestAccount> {
  sharedHash ??= hashPassword(TEST_PASSWORD);
  const email = `${role}-${randomUUID().slice(0, 8)}@test.ripplehall.local`;
  const [inserted] = await db
    .insert(users)
    .values({ email, name: `Test ${role}`, role, status, passwordHash: await sharedHash })
    .$returningId();
  if (!inserted) throw new Error(`creating the test account ${email} returned no id`);
  return { id: inserted.id, email, password: TEST_PASSWORD, role };
}

/** A client already signed in as a fresh account of the given role. */
export async function signedInClient(server: TestServer, role: AccountRole = 'facilitator') {
  const account = await createAccount(role);
  const client = server.client();
  await client.signIn(account.email, account.password);
  return { client, account };
}

/**
 * A test server and a signed-in facilitator for the tests of one describe block: started before
 * them and stopped after them. Read `server` and `client` inside the tests (once `before` ran).
 */
export function signedInSuite(): { readonly server: TestServer; readonly client: TestClient } {
  let server: TestServer | undefined;
  let client: TestClient | undefined;
  before(async () => {
    server = await startTestServer();
    ({ client } = await signedInClient(server));
  });
  after(async () => server?.stop());
  const started = <T>(value: T | undefined, what: string): T => {
    if (value === undefined) throw new Error(`${what} is not started yet: read it inside a test`);
    return value;
  };
  return {
    get server() {
      return started(server, 'the test server');
    },
    get client() {
      return started(client, 'the signed-in client');
    },
  };
}

/**
 * A web process may answer from its copy of a session for SESSION_CACHE_MS (server/core/session-cache.ts):
 * a change made elsewhere must show within that, plus this much for the requests themselves on a
 * busy machine.
 */
export const SESSION_BOUND_SLACK_MS = 1000;

/**
 * Asks `status()` every 50 ms until it answers `want`, and returns how long that took from the call
 * (counting the first request). Fails once `giveUpMs` passed without that answer.
 */
export async function msUntilStatus(status: () => Promise<number>, want: number, giveUpMs = 8000): Promise<number> {
  const started = Date.now();
  let last = 0;
  while (Date.now() - started < giveUpMs) {
    last = await status();
    if (last === want) return Date.now() - started;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`still ${last} instead of ${want} after ${giveUpMs} ms`);
}
