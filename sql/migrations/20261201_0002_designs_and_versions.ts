import { sql, type Kysely } from 'kysely';

// Designs and their immutable versions. latest_version on the design row is the lock point that
// keeps version numbers unique and gapless under concurrent saves.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('designs')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('owner_id', 'uuid', (col) => col.notNull().references('users.id').onDelete('restrict'))
    .addColumn('name', 'text', (col) => col.notNull())
    .addColumn('archived', 'boolean', (col) => col.notNull().defaultTo(false))
    .addColumn('latest_version', 'integer', (col) => col.notNull().defaultTo(0))
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('designs_owner_id_idx').on('designs').column('owner_id').execute();

  await db.schema
    .createTable('design_versions')
    .addColumn('design_id', 'uuid', (col) => col.notNull().references('designs.id').onDelete('cascade'))
    .addColumn('number', 'integer', (col) => col.notNull().check(sql`number >= 1`))
    .addColumn('document', 'jsonb', (col) => col.notNull())
    .addColumn('message', 'text', (col) => col.notNull())
    .addColumn('author_id', 'uuid', (col) => col.notNull().references('users.id').onDelete('restrict'))
    .addColumn('format_version', 'integer', (col) => col.notNull())
    .addColumn('engine_version', 'text', (col) => col.notNull())
    .addColumn('figures', 'jsonb', (col) => col.notNull())
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint('design_versions_pkey', ['design_id', 'number'])
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('design_versions').execute();
  await db.schema.dropTable('designs').execute();
}
