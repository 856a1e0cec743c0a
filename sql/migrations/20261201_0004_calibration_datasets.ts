import { sql, type Kysely } from 'kysely';

// Bench calibration datasets of a design: the original file as uploaded and its parsed points
// (SI units). Both go when the dataset or its design is deleted.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('calibration_datasets')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('design_id', 'uuid', (col) => col.notNull().references('designs.id').onDelete('cascade'))
    .addColumn('name', 'text', (col) => col.notNull())
    .addColumn('notes', 'text', (col) => col.notNull().defaultTo(''))
    .addColumn('file_name', 'text', (col) => col.notNull())
    .addColumn('file_content', 'bytea', (col) => col.notNull())
    .addColumn('mapping', 'jsonb', (col) => col.notNull())
    .addColumn('reference_unit', 'text', (col) => col.notNull())
    .addColumn('reference_display_unit', 'text', (col) => col.notNull())
    .addColumn('readout_unit', 'text', (col) => col.notNull())
    .addColumn('readout_display_unit', 'text', (col) => col.notNull())
    .addColumn('point_count', 'integer', (col) => col.notNull())
    .addColumn('created_by', 'uuid', (col) => col.notNull().references('users.id').onDelete('restrict'))
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('calibration_datasets_design_id_idx').on('calibration_datasets').column('design_id').execute();

  await db.schema
    .createTable('calibration_points')
    .addColumn('dataset_id', 'uuid', (col) => col.notNull().references('calibration_datasets.id').onDelete('cascade'))
    .addColumn('position', 'integer', (col) => col.notNull())
    .addColumn('source_row', 'integer', (col) => col.notNull())
    .addColumn('cell', 'text', (col) => col.notNull())
    .addColumn('run', 'text', (col) => col.notNull())
    .addColumn('direction', 'text', (col) => col.notNull().check(sql`direction in ('up', 'down')`))
    .addColumn('reference', 'float8', (col) => col.notNull())
    .addColumn('readout', 'float8', (col) => col.notNull())
    .addColumn('time_s', 'float8')
    .addPrimaryKeyConstraint('calibration_points_pkey', ['dataset_id', 'position'])
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('calibration_points').execute();
  await db.schema.dropTable('calibration_datasets').execute();
}
