import { Kysely, PostgresDialect, type ColumnType, type Generated, type Insertable, type Selectable, type Updateable } from 'kysely';
import pg from 'pg';
import type { KeyFigures } from '@shared/contracts/designs-api';
import type { Role } from '@shared/contracts/user';

type Timestamp = ColumnType<Date, Date | string, Date | string>;
/** A timestamp the database fills in (default now()). */
type GeneratedTimestamp = ColumnType<Date, Date | string | undefined, Date | string>;

export interface UsersTable {
  id: Generated<string>;
  email: string;
  display_name: string;
  password_hash: string;
  role: Role;
  disabled: Generated<boolean>;
  created_at: GeneratedTimestamp;
  updated_at: GeneratedTimestamp;
}

export interface SessionsTable {
  id: Generated<string>;
  user_id: string;
  created_at: GeneratedTimestamp;
  expires_at: Timestamp;
  revoked_at: Timestamp | null;
  user_agent: string | null;
  address: string | null;
}

export interface DesignsTable {
  id: Generated<string>;
  owner_id: string;
  name: string;
  archived: Generated<boolean>;
  latest_version: Generated<number>;
  created_at: GeneratedTimestamp;
  updated_at: GeneratedTimestamp;
}

export interface DesignVersionsTable {
  design_id: string;
  number: number;
  document: ColumnType<Record<string, unknown>, string, string>;
  message: string;
  author_id: string;
  format_version: number;
  engine_version: string;
  figures: ColumnType<KeyFigures, string, string>;
  created_at: GeneratedTimestamp;
}

export interface Database {
  users: UsersTable;
  sessions: SessionsTable;
  designs: DesignsTable;
  design_versions: DesignVersionsTable;
}

export type UserRow = Selectable<UsersTable>;
export type NewUserRow = Insertable<UsersTable>;
export type UserUpdate = Updateable<UsersTable>;
export type SessionRow = Selectable<SessionsTable>;
export type DesignRow = Selectable<DesignsTable>;
export type DesignVersionRow = Selectable<DesignVersionsTable>;

// Timestamps arrive as Date; numeric and bigint columns stay strings unless a column asks otherwise.
export function createDatabase(connectionString: string, options: { max?: number } = {}): Kysely<Database> {
  const pool = new pg.Pool({
    connectionString,
    max: options.max ?? 10,
    connectionTimeoutMillis: 5000,
    idleTimeoutMillis: 30000,
  });
  // An idle client losing its server (database restart) must not crash the process.
  pool.on('error', () => undefined);
  return new Kysely<Database>({ dialect: new PostgresDialect({ pool }) });
}
