import { sql, type Kysely } from 'kysely';

// Every change to an account or a session is announced on the channel qb_auth_changes (payload:
// the account's id, or * after a TRUNCATE), so each API process's session cache forgets it at once
// (api/auth/session-cache.ts). New rows need no notice: nothing about them is cached yet.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    create function qb_announce_auth_change() returns trigger language plpgsql as $$
    begin
      if tg_op = 'TRUNCATE' then
        perform pg_notify('qb_auth_changes', '*');
      elsif tg_table_name = 'users' then
        perform pg_notify('qb_auth_changes', (case when tg_op = 'DELETE' then old.id else new.id end)::text);
        if tg_op = 'UPDATE' and old.id <> new.id then
          perform pg_notify('qb_auth_changes', old.id::text);
        end if;
      else
        perform pg_notify('qb_auth_changes', (case when tg_op = 'DELETE' then old.user_id else new.user_id end)::text);
        if tg_op = 'UPDATE' and old.user_id <> new.user_id then
          perform pg_notify('qb_auth_changes', old.user_id::text);
        end if;
      end if;
      return null;
    end
    $$`.execute(db);
  for (const table of ['users', 'sessions']) {
    await sql`create trigger ${sql.raw(`${table}_announce_change`)} after update or delete on ${sql.table(table)} for each row execute function qb_announce_auth_change()`.execute(db);
    await sql`create trigger ${sql.raw(`${table}_announce_truncate`)} after truncate on ${sql.table(table)} for each statement execute function qb_announce_auth_change()`.execute(db);
  }
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of ['users', 'sessions']) {
    await sql`drop trigger if exists ${sql.raw(`${table}_announce_change`)} on ${sql.table(table)}`.execute(db);
    await sql`drop trigger if exists ${sql.raw(`${table}_announce_truncate`)} on ${sql.table(table)}`.execute(db);
  }
  await sql`drop function if exists qb_announce_auth_change()`.execute(db);
}
