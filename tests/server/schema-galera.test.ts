import assert from 'node:assert/strict';
import { after, describe, it } from 'node:test';
import { config } from '../../server/config';
import { pool } from '../../server/db';

/**
 * The migrated schema suits a MariaDB Galera cluster (MariaDB Knowledge Base, "MariaDB Galera
 * Cluster - Known Limitations"): replication covers InnoDB only, and every table needs a primary
 * key (rows without one may be applied in a different order on each node). Read from
 * information_schema of the test database, so a new table that breaks either rule fails here.
 */
describe('schema fit for a Galera cluster', () => {
  after(async () => pool.end());

  const tables = async () => {
    const [rows] = (await pool.query(
      "SELECT TABLE_NAME AS name, ENGINE AS engine FROM information_schema.TABLES WHERE TABLE_SCHEMA = ? AND TABLE_TYPE = 'BASE TABLE' ORDER BY TABLE_NAME",
      [config.DB_NAME],
    )) as unknown as [{ name: string; engine: string }[]];
    return rows;
  };

  it('has the migrated tables, all InnoDB', async () => {
    const all = await tables();
    assert.ok(all.length >= 10, `expected the migrated tables, found ${all.map((t) => t.name).join(', ')}`);
    assert.ok(all.some((t) => t.name === 'rooms') && all.some((t) => t.name === 'sessions'));
    assert.deepEqual(
      all.filter((t) => t.engine !== 'InnoDB').map((t) => `${t.name} (${t.engine})`),
      [],
    );
  });

  it('gives every table a primary key', async () => {
    const [rows] = (await pool.query(
      "SELECT TABLE_NAME AS name FROM information_schema.TABLE_CONSTRAINTS WHERE TABLE_SCHEMA = ? AND CONSTRAINT_TYPE = 'PRIMARY KEY'",
      [config.DB_NAME],
    )) as unknown as [{ name: string }[]];
    const withKey = new Set(rows.map((r) => r.name));
    assert.deepEqual(
      (await tables()).map((t) => t.name).filter((n) => !withKey.has(n)),
      [],
    );
  });
});
