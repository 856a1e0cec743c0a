import { sql, type Kysely } from 'kysely';

// Review of a version by a colleague, the invitations that bring in new reviewers, comments,
// the outgoing mail queue, the local mail catcher's store, and the append-only audit trail.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('reviews')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('design_id', 'uuid', (col) => col.notNull())
    .addColumn('version_number', 'integer', (col) => col.notNull())
    .addColumn('requested_by', 'uuid', (col) => col.notNull().references('users.id').onDelete('restrict'))
    .addColumn('reviewer_email', 'text', (col) => col.notNull())
    .addColumn('reviewer_id', 'uuid', (col) => col.references('users.id').onDelete('restrict'))
    .addColumn('note', 'text', (col) => col.notNull().defaultTo(''))
    .addColumn('state', 'text', (col) => col.notNull().defaultTo('pending').check(sql`state in ('pending', 'approved', 'changes_requested')`))
    .addColumn('decision_note', 'text')
    .addColumn('decided_at', 'timestamptz')
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addForeignKeyConstraint('reviews_version_fkey', ['design_id', 'version_number'], 'design_versions', ['design_id', 'number'], (fk) => fk.onDelete('cascade'))
    .execute();
  await db.schema.createIndex('reviews_reviewer_id_idx').on('reviews').column('reviewer_id').execute();
  await db.schema.createIndex('reviews_design_idx').on('reviews').columns(['design_id', 'version_number']).execute();

  await db.schema
    .createTable('invitations')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('token_hash', 'text', (col) => col.notNull().unique())
    .addColumn('email', 'text', (col) => col.notNull())
    .addColumn('invited_by', 'uuid', (col) => col.notNull().references('users.id').onDelete('restrict'))
    .addColumn('expires_at', 'timestamptz', (col) => col.notNull())
    .addColumn('used_at', 'timestamptz')
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable('review_comments')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('review_id', 'uuid', (col) => col.notNull().references('reviews.id').onDelete('cascade'))
    .addColumn('author_id', 'uuid', (col) => col.notNull().references('users.id').onDelete('restrict'))
    .addColumn('parent_id', 'uuid', (col) => col.references('review_comments.id').onDelete('cascade'))
    .addColumn('stage', 'text')
    .addColumn('field', 'text')
    .addColumn('body', 'text', (col) => col.notNull())
    .addColumn('resolved', 'boolean', (col) => col.notNull().defaultTo(false))
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('review_comments_review_idx').on('review_comments').column('review_id').execute();

  await db.schema
    .createTable('outbox')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('to_address', 'text', (col) => col.notNull())
    .addColumn('subject', 'text', (col) => col.notNull())
    .addColumn('text_body', 'text', (col) => col.notNull())
    .addColumn('html_body', 'text', (col) => col.notNull())
    .addColumn('review_id', 'uuid', (col) => col.references('reviews.id').onDelete('set null'))
    .addColumn('attempts', 'integer', (col) => col.notNull().defaultTo(0))
    .addColumn('last_error', 'text')
    .addColumn('next_attempt_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('sent_at', 'timestamptz')
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .execute();
  await sql`create index outbox_pending_idx on outbox (next_attempt_at) where sent_at is null`.execute(db);

  await db.schema
    .createTable('mailbox_messages')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('envelope_from', 'text', (col) => col.notNull())
    .addColumn('recipients', sql`text[]`, (col) => col.notNull())
    .addColumn('subject', 'text', (col) => col.notNull())
    .addColumn('text_body', 'text', (col) => col.notNull())
    .addColumn('html_body', 'text', (col) => col.notNull())
    .addColumn('raw', 'text', (col) => col.notNull())
    .addColumn('received_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable('audit_events')
    .addColumn('id', 'bigserial', (col) => col.primaryKey())
    .addColumn('design_id', 'uuid', (col) => col.notNull())
    .addColumn('version_number', 'integer')
    .addColumn('actor_id', 'uuid', (col) => col.references('users.id').onDelete('restrict'))
    .addColumn('action', 'text', (col) => col.notNull())
    .addColumn('detail', 'jsonb', (col) => col.notNull().defaultTo(sql`'{}'::jsonb`))
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('audit_events_design_idx').on('audit_events').columns(['design_id', 'id']).execute();
  // Append-only: the trail is evidence, so the database itself refuses to change or remove it.
  await sql`
    create function audit_events_append_only() returns trigger language plpgsql as $$
    begin
      raise exception 'audit events are append-only';
    end $$`.execute(db);
  await sql`
    create trigger audit_events_no_change before update or delete on audit_events
    for each row execute function audit_events_append_only()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`drop trigger if exists audit_events_no_change on audit_events`.execute(db);
  await sql`drop function if exists audit_events_append_only()`.execute(db);
  for (const table of ['audit_events', 'mailbox_messages', 'outbox', 'review_comments', 'invitations', 'reviews']) {
    await db.schema.dropTable(table).execute();
  }
}
