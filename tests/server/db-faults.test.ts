import assert from 'node:assert/strict';
import { spawn } from 'node:child_process';
import { createServer as createNetServer } from 'node:net';
import { after, describe, it } from 'node:test';
import { drizzle } from 'drizzle-orm/mysql2';
import { sql } from 'drizzle-orm';
import express from 'express';
import mysql from 'mysql2/promise';
import { config } from '../../server/config';
import { errorHandler } from '../../server/core/error-handler';
import { pool } from '../../server/db';
import { TestClient } from '../support/http-client';
import { firstOf, itemAt } from '../../shared/checked';

/** A port nobody listens on: bind one, note it, close it. */
async function closedPort(): Promise<number> {
  const s = createNetServer();
  await new Promise<void>((r) => s.listen(0, '127.0.0.1', () => r()));
  const port = (s.address() as { port: number }).port;
  await new Promise<void>((r) => s.close(() => r()));
  return port;
}

describe('the database stopped or lost', () => {
  after(async () => pool.end());

  it('start-up with the database stopped prints one clear line and exits, no stack or paths', async () => {
    const port = await closedPort();
    const child = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
      env: { ...process.env, DB_PORT: String(port), PORT: String(await closedPort()), NODE_ENV: 'test' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let stderr = '';
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    const code = await new Promise<number | null>((r) => child.on('exit', r));
    assert.equal(code, 1);
    const lines = stderr.trim().split('\n');
    assert.equal(lines.length, 1, stderr);
    assert.match(
      itemAt(lines, 0, 'stderr line'),
      new RegExp(`Cannot reach MariaDB at 127\\.0\\.0\\.1:${port}.*bash scripts/db\\.sh start`),
    );
    assert.doesNotMatch(stderr, /\/work\/|node_modules|Failed query|^\s+at /m);
  });

  it('a connection killed mid-query answers 503 with a clear message, not 500', async () => {
    const conn = await mysql.createConnection({
      host: config.DB_HOST,
      port: config.DB_PORT,
      user: config.DB_USER,
      password: config.DB_PASSWORD,
      database: config.DB_NAME,
    });
    const victim = drizzle(conn);
    const app = express();
    app.get('/slow', async () => {
      await victim.execute(sql`SELECT SLEEP(20)`);
    });
    app.use(errorHandler);
    const server = app.listen(0, '127.0.0.1');
    await new Promise<void>((r) => server.once('listening', () => r()));
    const client = new TestClient(`http://127.0.0.1:${(server.address() as { port: number }).port}`);
    const reply = client.get('/slow');
    // Kill the connection once its query is running (the process list shows it sleeping).
    for (;;) {
      const [rows] = (await pool.query('SELECT COUNT(*) AS n FROM information_schema.PROCESSLIST WHERE ID = ? AND INFO LIKE ?', [
        conn.threadId,
        'SELECT SLEEP%',
      ])) as unknown as [{ n: number }[]];
      if (Number(firstOf(rows, 'process count').n) > 0) break;
      await new Promise((r) => setTimeout(r, 20));
    }
    await pool.query(`KILL CONNECTION ${Number(conn.threadId)}`);
    const answer = await reply;
    server.close();
    conn.destroy();
    assert.equal(answer.status, 503, answer.text);
    assert.equal(answer.body.error.code, 'database_unavailable');
    assert.match(answer.body.error.message, /database is not reachable right now.*try again/);
  });

  it('a request that reaches a pool already closed by a stopping server answers 503, not 500', async () => {
    const closing = mysql.createPool({
      host: config.DB_HOST,
      port: config.DB_PORT,
      user: config.DB_USER,
      password: config.DB_PASSWORD,
      database: config.DB_NAME,
    });
    const gone = drizzle(closing);
    await closing.end();
    const app = express();
    app.get('/late', async () => {
      await gone.execute(sql`SELECT 1`);
    });
    app.use(errorHandler);
    const server = app.listen(0, '127.0.0.1');
    await new Promise<void>((r) => server.once('listening', () => r()));
    const client = new TestClient(`http://127.0.0.1:${(server.address() as { port: number }).port}`);
    const answer = await client.get('/late');
    server.close();
    assert.equal(answer.status, 503, answer.text);
    assert.equal(answer.body.error.code, 'busy');
    assert.match(answer.body.error.message, /restarting.*try again/);
  });
});
