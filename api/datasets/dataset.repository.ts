import { sql, type Kysely, type Transaction } from 'kysely';
import type { BenchPoint, Dataset, DatasetSummary } from '@shared/contracts/calibration';
import type { Database } from '../db/database';

type Db = Kysely<Database> | Transaction<Database>;

/** Points per INSERT statement: 9 parameters each stays far below PostgreSQL's 65535. */
const INSERT_CHUNK = 5000;

export interface NewDataset {
  designId: string;
  name: string;
  notes: string;
  fileName: string;
  fileContent: Buffer;
  mapping: Record<string, string>;
  units: DatasetSummary['units'];
  createdBy: string;
  points: BenchPoint[];
}

function summaries(db: Db) {
  return db
    .selectFrom('calibration_datasets as d')
    .innerJoin('users as u', 'u.id', 'd.created_by')
    .select((eb) => [
      'd.id',
      'd.design_id',
      'd.name',
      'd.notes',
      'd.file_name',
      'd.mapping',
      'd.reference_unit',
      'd.reference_display_unit',
      'd.readout_unit',
      'd.readout_display_unit',
      'd.point_count',
      'd.created_at',
      'u.id as creator_id',
      'u.display_name as creator_name',
      eb.fn<number>('octet_length', ['d.file_content']).as('file_size'),
      // One pass over the dataset's points for its range, cells and runs.
      sql<{ min: number; max: number; cells: string[]; runs: string[] }>`(select json_build_object('min', min(p.reference), 'max', max(p.reference), 'cells', array_agg(distinct p.cell), 'runs', array_agg(distinct p.run)) from calibration_points p where p.dataset_id = d.id)`.as(
        'point_facts',
      ),
    ]);
}

type SummaryRow = Awaited<ReturnType<ReturnType<typeof summaries>['executeTakeFirstOrThrow']>>;

const natural = (a: string, b: string) => a.localeCompare(b, 'en', { numeric: true });

function toSummary(row: SummaryRow): DatasetSummary {
  return {
    id: row.id,
    designId: row.design_id,
    name: row.name,
    notes: row.notes,
    fileName: row.file_name,
    fileSize: Number(row.file_size),
    pointCount: row.point_count,
    cells: [...(row.point_facts.cells ?? [])].sort(natural),
    runs: [...(row.point_facts.runs ?? [])].sort(natural),
    units: { reference: row.reference_unit, referenceDisplay: row.reference_display_unit, readout: row.readout_unit, readoutDisplay: row.readout_display_unit },
    referenceRange: { min: Number(row.point_facts.min), max: Number(row.point_facts.max) },
    mapping: row.mapping,
    createdBy: { id: row.creator_id, displayName: row.creator_name },
    createdAt: new Date(row.created_at).toISOString(),
  };
}

export async function listDatasets(db: Db, designId: string): Promise<DatasetSummary[]> {
  const rows = await summaries(db).where('d.design_id', '=', designId).orderBy('d.created_at', 'desc').execute();
  return rows.map(toSummary);
}

export async function findDatasetSummary(db: Db, designId: string, datasetId: string): Promise<DatasetSummary | undefined> {
  const row = await summaries(db).where('d.design_id', '=', designId).where('d.id', '=', datasetId).executeTakeFirst();
  return row ? toSummary(row) : undefined;
}

export async function findDataset(db: Db, designId: string, datasetId: string): Promise<Dataset | undefined> {
  const summary = await findDatasetSummary(db, designId, datasetId);
  if (!summary) return undefined;
  const rows = await db
    .selectFrom('calibration_points')
    .select(['source_row', 'cell', 'run', 'direction', 'reference', 'readout', 'time_s'])
    .where('dataset_id', '=', datasetId)
    .orderBy('position')
    .execute();
  return {
    ...summary,
    points: rows.map((row) => ({ reference: row.reference, readout: row.readout, cell: row.cell, run: row.run, direction: row.direction, time: row.time_s, row: row.source_row })),
  };
}

export async function findDatasetFile(db: Db, designId: string, datasetId: string): Promise<{ fileName: string; content: Buffer } | undefined> {
  const row = await db
    .selectFrom('calibration_datasets')
    .select(['file_name', 'file_content'])
    .where('design_id', '=', designId)
    .where('id', '=', datasetId)
    .executeTakeFirst();
  return row ? { fileName: row.file_name, content: row.file_content } : undefined;
}

/** Stores the file and its points in one transaction: either both are kept or neither. */
export async function insertDataset(db: Kysely<Database>, dataset: NewDataset): Promise<string> {
  return db.transaction().execute(async (trx) => {
    const { id } = await trx
      .insertInto('calibration_datasets')
      .values({
        design_id: dataset.designId,
        name: dataset.name,
        notes: dataset.notes,
        file_name: dataset.fileName,
        file_content: dataset.fileContent,
        mapping: JSON.stringify(dataset.mapping),
        reference_unit: dataset.units.reference,
        reference_display_unit: dataset.units.referenceDisplay,
        readout_unit: dataset.units.readout,
        readout_display_unit: dataset.units.readoutDisplay,
        point_count: dataset.points.length,
        created_by: dataset.createdBy,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    for (let start = 0; start < dataset.points.length; start += INSERT_CHUNK) {
      await trx
        .insertInto('calibration_points')
        .values(
          dataset.points.slice(start, start + INSERT_CHUNK).map((point, offset) => ({
            dataset_id: id,
            position: start + offset,
            source_row: point.row,
            cell: point.cell,
            run: point.run,
            direction: point.direction,
            reference: point.reference,
            readout: point.readout,
            time_s: point.time,
          })),
        )
        .execute();
    }
    return id;
  });
}

export async function deleteDataset(db: Db, designId: string, datasetId: string): Promise<boolean> {
  const result = await db.deleteFrom('calibration_datasets').where('design_id', '=', designId).where('id', '=', datasetId).executeTakeFirst();
  return result.numDeletedRows > 0n;
}
