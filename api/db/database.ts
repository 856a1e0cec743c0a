import { Kysely, PostgresDialect, type ColumnType, type PostgresPool, type PostgresPoolClient, type Generated, type Insertable, type Selectable, type Updateable } from 'kysely';
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

export type ReviewState = 'pending' | 'approved' | 'changes_requested';

export interface ReviewsTable {
  id: Generated<string>;
  design_id: string;
  version_number: number;
  requested_by: string;
  reviewer_email: string;
  reviewer_id: string | null;
  note: Generated<string>;
  state: ColumnType<ReviewState, ReviewState | undefined, ReviewState>;
  decision_note: string | null;
  decided_at: Timestamp | null;
  created_at: GeneratedTimestamp;
}

export interface InvitationsTable {
  id: Generated<string>;
  token_hash: string;
  email: string;
  invited_by: string;
  expires_at: Timestamp;
  used_at: Timestamp | null;
  created_at: GeneratedTimestamp;
}

export interface ReviewCommentsTable {
  id: Generated<string>;
  review_id: string;
  author_id: string;
  parent_id: string | null;
  stage: string | null;
  field: string | null;
  body: string;
  resolved: Generated<boolean>;
  created_at: GeneratedTimestamp;
}

export interface OutboxTable {
  id: Generated<string>;
  to_address: string;
  subject: string;
  text_body: string;
  html_body: string;
  review_id: string | null;
  attempts: Generated<number>;
  last_error: string | null;
  next_attempt_at: GeneratedTimestamp;
  sent_at: Timestamp | null;
  created_at: GeneratedTimestamp;
}

export interface MailboxMessagesTable {
  id: Generated<string>;
  envelope_from: string;
  recipients: string[];
  subject: string;
  text_body: string;
  html_body: string;
  raw: string;
  received_at: GeneratedTimestamp;
}

export interface AuditEventsTable {
  id: Generated<string>;
  design_id: string;
  version_number: number | null;
  actor_id: string | null;
  action: string;
  detail: ColumnType<Record<string, unknown>, string | undefined, never>;
  created_at: GeneratedTimestamp;
}

export interface CalibrationDatasetsTable {
  id: Generated<string>;
  design_id: string;
  name: string;
  notes: Generated<string>;
  file_name: string;
  file_content: Buffer;
  mapping: ColumnType<Record<string, string>, string, string>;
  reference_unit: string;
  reference_display_unit: string;
  readout_unit: string;
  readout_display_unit: string;
  point_count: number;
  created_by: string;
  created_at: GeneratedTimestamp;
}

export interface CalibrationPointsTable {
  dataset_id: string;
  position: number;
  source_row: number;
  cell: string;
  run: string;
  direction: 'up' | 'down';
  reference: number;
  readout: number;
  time_s: number | null;
}

export interface Database {
  users: UsersTable;
  sessions: SessionsTable;
  designs: DesignsTable;
  design_versions: DesignVersionsTable;
  reviews: ReviewsTable;
  invitations: InvitationsTable;
  review_comments: ReviewCommentsTable;
  outbox: OutboxTable;
  mailbox_messages: MailboxMessagesTable;
  audit_events: AuditEventsTable;
  calibration_datasets: CalibrationDatasetsTable;
  calibration_points: CalibrationPointsTable;
}

export type UserRow = Selectable<UsersTable>;
export type NewUserRow = Insertable<UsersTable>;
export type UserUpdate = Updateable<UsersTable>;
export type SessionRow = Selectable<SessionsTable>;
export type DesignRow = Selectable<DesignsTable>;
export type DesignVersionRow = Selectable<DesignVersionsTable>;

/** Statements worth keeping prepared: one data statement each (never the DDL of a migration). */
const PREPARABLE = /^\s*(select|insert|update|delete|with)\b/i;
/** More distinct statement texts than the code has query shapes means something builds SQL per value. */
const MAX_PREPARED_NAMES = 2000;

/**
 * The pool as Kysely sees it, with two additions.
 * - Prepared statements (when asked for): each data statement goes as a named prepared statement, so
 *   the server parses and plans a statement text once per connection instead of on every request
 *   (planning the designs list costs about as much as running it). Names come from the text, so one
 *   text has one name on every connection; the values still travel as parameters.
 * - A connection whose query failed without an answer from the server (no reply within
 *   query_timeout, the link reset) is closed on release instead of going back to the pool, where a
 *   late reply could still arrive on it.
 */
function guardedPool(pool: pg.Pool, prepared: boolean): PostgresPool {
  const names = new Map<string, string>();
  const nameOf = (text: string): string | undefined => {
    let name = names.get(text);
    if (name === undefined && names.size < MAX_PREPARED_NAMES) {
      name = `qb_${names.size.toString(36)}`;
      names.set(text, name);
    }
    return name;
  };
  return {
    async connect() {
      const client = await pool.connect();
      let broken = false;
      const watch = <T>(result: Promise<T>): Promise<T> =>
        result.catch((error: unknown) => {
          // Errors the server reports carry a severity; any other leaves the connection in doubt.
          if (!(error && typeof error === 'object' && 'severity' in error)) broken = true;
          throw error;
        });
      return {
        query: ((textOrCursor: unknown, values?: unknown[]) => {
          if (typeof textOrCursor !== 'string') return client.query(textOrCursor as never);
          const name = prepared && PREPARABLE.test(textOrCursor) ? nameOf(textOrCursor) : undefined;
          return watch(name ? client.query({ name, text: textOrCursor, values: values as unknown[] }) : client.query(textOrCursor, values as unknown[]));
        }) as unknown as PostgresPoolClient['query'],
        release: (destroy?: boolean) => client.release(destroy || broken),
      };
    },
    end: () => pool.end(),
  };
}

// Timestamps arrive as Date; numeric and bigint columns stay strings unless a column asks otherwise.
export interface DatabaseOptions {
  max?: number;
  /** Named prepared statements (the API uses them; scripts and migrations need not). */
  prepared?: boolean;
  /** How long the client waits for any answer to a query [ms] (6 s; tests shorten it). */
  queryTimeoutMs?: number;
}

export function createDatabase(connectionString: string, options: DatabaseOptions = {}): Kysely<Database> {
  const pool = new pg.Pool({
    connectionString,
    max: options.max ?? 10,
    connectionTimeoutMillis: 5000,
    idleTimeoutMillis: 30000,
    // No request waits on the database for long: the server cancels a statement after 5 s (a lock
    // wait included), and the client gives up on one that gets no answer at all (a server that
    // froze or a link that died with the connection open) a second later.
    statement_timeout: 5000,
    query_timeout: options.queryTimeoutMs ?? 6000,
  });
  // A client losing its server (database restart) must not crash the process: the pool covers idle
  // clients, the listener below those checked out between two queries (inside a transaction, say).
  // The query in progress, if any, still fails, and the pool drops the client when it is released.
  pool.on('error', () => undefined);
  pool.on('connect', (client) => client.on('error', () => undefined));
  return new Kysely<Database>({ dialect: new PostgresDialect({ pool: guardedPool(pool, options.prepared ?? false) }) });
}
