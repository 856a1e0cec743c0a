import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDatabase } from '../../api/db/database';

// One connection, so every statement below runs in the same server session and
// pg_prepared_statements (PostgreSQL documentation, "System Views") shows what it holds.
const url = process.env.TEST_DATABASE_URL!;
let db: ReturnType<typeof createDatabase>;

beforeAll(() => {
  db = createDatabase(url, { max: 1, prepared: true });
});
afterAll(() => db.destroy());

async function prepared(): Promise<string[]> {
  const { rows } = await sql<{ statement: string }>`select statement from pg_prepared_statements where name like 'qb\\_%' order by prepare_time`.execute(db);
  return rows.map((row) => row.statement);
}

describe('prepared statements', () => {
  it('sends each data statement text as one named prepared statement and reuses it', async () => {
    const first = await db.selectFrom('users').select('email').where('email', '=', 'nobody-1@example.com').execute();
    const second = await db.selectFrom('users').select('email').where('email', '=', 'nobody-2@example.com').execute();
    expect(first).toEqual([]);
    expect(second).toEqual([]);
    const statements = await prepared();
    const usersLookups = statements.filter((text) => text.includes('from "users" where "email" = $1'));
    expect(usersLookups).toHaveLength(1);
  });

  it('passes values as parameters, not as text', async () => {
    const rows = await sql<{ value: string }>`select ${"it's; drop table users"}::text as value`.execute(db);
    expect(rows.rows[0]!.value).toBe("it's; drop table users");
    expect((await prepared()).some((text) => text.includes('drop table'))).toBe(false);
  });

  it('leaves statements that are not plain data statements unprepared', async () => {
    await sql`set local statement_timeout = 4000`.execute(db);
    await sql`create temporary table if not exists prepared_probe (n int)`.execute(db);
    const statements = await prepared();
    expect(statements.some((text) => /^\s*(set|create)/i.test(text))).toBe(false);
  });

  it('works inside transactions and after a failed statement', async () => {
    await expect(sql`select 1 / 0`.execute(db)).rejects.toThrow(/division by zero/);
    const result = await db.transaction().execute(async (trx) => (await sql<{ n: number }>`select 2 as n`.execute(trx)).rows[0]!.n);
    expect(result).toBe(2);
    expect((await sql<{ n: number }>`select 1 / 1 as n`.execute(db)).rows[0]!.n).toBe(1);
  });
});

describe('connections in doubt', () => {
  it('closes a connection whose query got no answer in time, and keeps one after an error the server reported', async () => {
    const impatient = createDatabase(url, { max: 1, prepared: true, queryTimeoutMs: 300 });
    try {
      const pid = async () => (await sql<{ pid: number }>`select pg_backend_pid() as pid`.execute(impatient)).rows[0]!.pid;
      const first = await pid();
      await expect(sql`select 1 / 0`.execute(impatient)).rejects.toThrow(/division by zero/);
      expect(await pid()).toBe(first);
      await expect(sql`select pg_sleep(2)`.execute(impatient)).rejects.toThrow(/Query read timeout/);
      // A new connection answers at once instead of queueing behind the sleep still running on the old one.
      const started = Date.now();
      const next = await pid();
      expect(next).not.toBe(first);
      expect(Date.now() - started).toBeLessThan(1500);
    } finally {
      await impatient.destroy();
    }
  });
});
