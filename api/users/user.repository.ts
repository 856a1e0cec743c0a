import { sql, type Kysely, type Transaction } from 'kysely';
import type { z } from 'zod';
import type { listUsersQuerySchema, User } from '@shared/contracts/user';
import type { Database, NewUserRow, UserRow, UserUpdate } from '../db/database';

const sortColumns = {
  email: 'email',
  displayName: 'display_name',
  role: 'role',
  disabled: 'disabled',
  createdAt: 'created_at',
} as const;

export function toUser(row: UserRow): User {
  return {
    id: row.id,
    email: row.email,
    displayName: row.display_name,
    role: row.role,
    disabled: row.disabled,
    createdAt: new Date(row.created_at).toISOString(),
    updatedAt: new Date(row.updated_at).toISOString(),
  };
}

export async function findUserByEmail(db: Kysely<Database>, email: string): Promise<UserRow | undefined> {
  return db.selectFrom('users').selectAll().where(sql<string>`lower(email)`, '=', email.toLowerCase()).executeTakeFirst();
}

export async function findUserById(db: Kysely<Database>, id: string): Promise<UserRow | undefined> {
  return db.selectFrom('users').selectAll().where('id', '=', id).executeTakeFirst();
}

export async function insertUser(db: Kysely<Database> | Transaction<Database>, user: NewUserRow): Promise<UserRow> {
  return db.insertInto('users').values(user).returningAll().executeTakeFirstOrThrow();
}

export async function updateUser(db: Kysely<Database>, id: string, changes: UserUpdate): Promise<UserRow | undefined> {
  return db
    .updateTable('users')
    .set({ ...changes, updated_at: sql`now()` })
    .where('id', '=', id)
    .returningAll()
    .executeTakeFirst();
}

export async function countEnabledAdmins(db: Kysely<Database>, exceptId: string): Promise<number> {
  const row = await db
    .selectFrom('users')
    .select((eb) => eb.fn.countAll<string>().as('count'))
    .where('role', '=', 'admin')
    .where('disabled', '=', false)
    .where('id', '!=', exceptId)
    .executeTakeFirstOrThrow();
  return Number(row.count);
}

export async function listUsers(
  db: Kysely<Database>,
  query: z.output<typeof listUsersQuerySchema>,
): Promise<{ rows: UserRow[]; total: number }> {
  let base = db.selectFrom('users');
  if (query.q) {
    const pattern = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    base = base.where((eb) => eb.or([eb('email', 'ilike', pattern), eb('display_name', 'ilike', pattern)]));
  }
  const [rows, total] = await Promise.all([
    base
      .selectAll()
      .orderBy(sortColumns[query.sort], query.order)
      .orderBy('id')
      .limit(query.pageSize)
      .offset(query.page * query.pageSize)
      .execute(),
    base.select((eb) => eb.fn.countAll<string>().as('count')).executeTakeFirstOrThrow(),
  ]);
  return { rows, total: Number(total.count) };
}
