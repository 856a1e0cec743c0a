import { sql, type Kysely, type Transaction } from 'kysely';
import type { z } from 'zod';
import type { DesignSummary, KeyFigures, listDesignsQuerySchema, Version, VersionSummary } from '@shared/contracts/designs-api';
import { recordEvent } from '../audit/audit.repository';
import type { Database, ReviewState } from '../db/database';

type Db = Kysely<Database> | Transaction<Database>;

/** Who may see which designs: admins all, designers their own, everyone else none (yet). */
export interface DesignScope {
  userId: string;
  seesAll: boolean;
  seesOwn: boolean;
}

const sortColumns = {
  name: 'designs.name',
  updatedAt: 'designs.updated_at',
  createdAt: 'designs.created_at',
  latestVersion: 'designs.latest_version',
} as const;
/** The same columns as the page subquery of the list names them. */
const pageSortColumns = {
  name: 'page.name',
  updatedAt: 'page.updated_at',
  createdAt: 'page.created_at',
  latestVersion: 'page.latest_version',
} as const;

function iso(value: Date | string): string {
  return new Date(value).toISOString();
}

/** Designs joined with their owner and their latest version's summary and author. */
function summaries(db: Db) {
  return db
    .selectFrom('designs')
    .innerJoin('users as owner', 'owner.id', 'designs.owner_id')
    .innerJoin('design_versions as latest', (join) =>
      join.onRef('latest.design_id', '=', 'designs.id').onRef('latest.number', '=', 'designs.latest_version'),
    )
    .innerJoin('users as author', 'author.id', 'latest.author_id')
    .select([
      'designs.id',
      'designs.name',
      'designs.archived',
      'designs.latest_version',
      'designs.created_at',
      'designs.updated_at',
      'owner.id as owner_id',
      'owner.display_name as owner_name',
      'owner.email as owner_email',
      'latest.message',
      'latest.created_at as version_created_at',
      'latest.format_version',
      'latest.engine_version',
      'latest.figures',
      'author.id as author_id',
      'author.display_name as author_name',
      'author.email as author_email',
    ]);
}

type SummaryRow = Awaited<ReturnType<ReturnType<typeof summaries>['executeTakeFirstOrThrow']>> & {
  review_state: ReviewState | null;
  review_version: number | null;
};

/** The most recent review request of the design whose id is `designId` (any version): one index lookup. */
function latestReviewOf(db: Db, designId: 'designs.id' | 'page.id') {
  return db
    .selectFrom('reviews')
    .select(['reviews.state as review_state', 'reviews.version_number as review_version'])
    .where('reviews.design_id', '=', sql.ref<string>(designId))
    .orderBy('reviews.created_at', 'desc')
    .orderBy('reviews.id', 'desc')
    .limit(1)
    .as('latest_review');
}

function toSummary(row: SummaryRow): DesignSummary {
  return {
    id: row.id,
    name: row.name,
    owner: { id: row.owner_id, displayName: row.owner_name, email: row.owner_email },
    archived: row.archived,
    latestVersion: row.latest_version,
    createdAt: iso(row.created_at),
    updatedAt: iso(row.updated_at),
    latest: {
      number: row.latest_version,
      message: row.message,
      author: { id: row.author_id, displayName: row.author_name, email: row.author_email },
      createdAt: iso(row.version_created_at),
      formatVersion: row.format_version,
      engineVersion: row.engine_version,
      figures: row.figures,
    },
    latestReview: row.review_state !== null && row.review_version !== null ? { state: row.review_state, versionNumber: row.review_version } : null,
  };
}

function scoped(query: ReturnType<typeof summaries>, scope: DesignScope) {
  if (scope.seesAll) return query;
  if (scope.seesOwn) return query.where('designs.owner_id', '=', scope.userId);
  return query.where(sql<boolean>`false`);
}

export async function listDesigns(db: Db, scope: DesignScope, query: z.output<typeof listDesignsQuerySchema>) {
  let base = scoped(summaries(db), scope);
  if (query.archived !== 'all') base = base.where('designs.archived', '=', query.archived === 'true');
  if (query.q) {
    const pattern = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    base = base.where('designs.name', 'ilike', pattern);
  }
  // The total comes with the page (one query, not two); only a page past the end needs a count of its
  // own. The latest review is looked up for the rows of the page only, after the limit.
  const page = base
    .select(sql<string>`count(*) over ()`.as('total'))
    .orderBy(sortColumns[query.sort], query.order)
    .orderBy('designs.id')
    .limit(query.pageSize)
    .offset(query.page * query.pageSize)
    .as('page');
  const rows = await db
    .selectFrom(page)
    .leftJoinLateral(latestReviewOf(db, 'page.id'), (join) => join.onTrue())
    .selectAll('page')
    .select(['latest_review.review_state', 'latest_review.review_version'])
    .orderBy(pageSortColumns[query.sort], query.order)
    .orderBy('page.id')
    .execute();
  const total = rows.length > 0 ? rows[0]!.total : (await base.clearSelect().select((eb) => eb.fn.countAll<string>().as('total')).executeTakeFirstOrThrow()).total;
  return { items: rows.map(toSummary), total: Number(total) };
}

export async function findDesign(db: Db, scope: DesignScope, id: string): Promise<DesignSummary | undefined> {
  const row = await scoped(summaries(db), scope)
    .leftJoinLateral(latestReviewOf(db, 'designs.id'), (join) => join.onTrue())
    .select(['latest_review.review_state', 'latest_review.review_version'])
    .where('designs.id', '=', id)
    .executeTakeFirst();
  return row ? toSummary(row) : undefined;
}

export interface NewVersion {
  document: Record<string, unknown>;
  message: string;
  authorId: string;
  formatVersion: number;
  engineVersion: string;
  figures: KeyFigures;
}

export async function insertDesign(db: Kysely<Database>, ownerId: string, name: string, first: NewVersion): Promise<string> {
  return db.transaction().execute(async (trx) => {
    const design = await trx
      .insertInto('designs')
      .values({ owner_id: ownerId, name, latest_version: 1 })
      .returning('id')
      .executeTakeFirstOrThrow();
    await insertVersionRow(trx, design.id, 1, first);
    await recordEvent(trx, { designId: design.id, versionNumber: 1, actorId: first.authorId, action: 'created', detail: { name, message: first.message } });
    return design.id;
  });
}

async function insertVersionRow(trx: Transaction<Database>, designId: string, number: number, version: NewVersion) {
  await trx
    .insertInto('design_versions')
    .values({
      design_id: designId,
      number,
      document: JSON.stringify(version.document),
      message: version.message,
      author_id: version.authorId,
      format_version: version.formatVersion,
      engine_version: version.engineVersion,
      figures: JSON.stringify(version.figures),
    })
    .execute();
}

export type SaveOutcome = { saved: true; number: number; createdAt: string } | { saved: false; latestVersion: number };

/**
 * Appends a version when `baseVersion` is still the latest, in one statement: the update of the
 * design row bumps its latest number only where it still equals the base, and the version and its
 * audit event are inserted from that update's result. Concurrent saves on the same base queue on
 * the row lock, and each one after the first finds the number moved on and inserts nothing
 * (PostgreSQL re-checks an UPDATE's condition on the newest row version after a lock wait, in READ
 * COMMITTED; PostgreSQL documentation, "Transaction Isolation"): exactly one winner, gapless numbers.
 */
export async function appendVersion(db: Kysely<Database>, designId: string, baseVersion: number, version: NewVersion): Promise<SaveOutcome> {
  const { rows } = await sql<{ number: number; created_at: Date }>`
    with bumped as (
      update designs set latest_version = latest_version + 1, updated_at = now()
       where id = ${designId} and latest_version = ${baseVersion}
      returning id, latest_version
    ), inserted as (
      insert into design_versions (design_id, number, document, message, author_id, format_version, engine_version, figures)
      select id, latest_version, ${JSON.stringify(version.document)}::jsonb, ${version.message}::text, ${version.authorId}::uuid,
             ${version.formatVersion}::integer, ${version.engineVersion}::text, ${JSON.stringify(version.figures)}::jsonb
        from bumped
      returning design_id, number, created_at
    ), audited as (
      insert into audit_events (design_id, version_number, actor_id, action, detail)
      select design_id, number, ${version.authorId}::uuid, 'saved', ${JSON.stringify({ message: version.message, baseVersion })}::jsonb
        from inserted
    )
    select number, created_at from inserted`.execute(db);
  const saved = rows[0];
  if (saved) return { saved: true, number: saved.number, createdAt: iso(saved.created_at) };
  const design = await db.selectFrom('designs').select('latest_version').where('id', '=', designId).executeTakeFirstOrThrow();
  return { saved: false, latestVersion: design.latest_version };
}

export async function updateDesign(db: Kysely<Database>, id: string, actorId: string, changes: { name?: string; archived?: boolean }): Promise<void> {
  await db.transaction().execute(async (trx) => {
    const before = await trx.selectFrom('designs').select(['name', 'archived']).where('id', '=', id).forUpdate().executeTakeFirstOrThrow();
    await trx
      .updateTable('designs')
      .set({ ...changes, updated_at: sql`now()` })
      .where('id', '=', id)
      .execute();
    if (changes.name !== undefined && changes.name !== before.name) {
      await recordEvent(trx, { designId: id, actorId, action: 'renamed', detail: { from: before.name, to: changes.name } });
    }
    if (changes.archived !== undefined && changes.archived !== before.archived) {
      await recordEvent(trx, { designId: id, actorId, action: changes.archived ? 'archived' : 'restored' });
    }
  });
}

function versionQuery(db: Db, designId: string) {
  return db
    .selectFrom('design_versions')
    .innerJoin('users as author', 'author.id', 'design_versions.author_id')
    .where('design_versions.design_id', '=', designId)
    .select([
      'design_versions.number',
      'design_versions.message',
      'design_versions.created_at',
      'design_versions.format_version',
      'design_versions.engine_version',
      'design_versions.figures',
      'author.id as author_id',
      'author.display_name as author_name',
      'author.email as author_email',
    ]);
}

type VersionRow = Awaited<ReturnType<ReturnType<typeof versionQuery>['executeTakeFirstOrThrow']>>;

function toVersionSummary(row: VersionRow): VersionSummary {
  return {
    number: row.number,
    message: row.message,
    author: { id: row.author_id, displayName: row.author_name, email: row.author_email },
    createdAt: iso(row.created_at),
    formatVersion: row.format_version,
    engineVersion: row.engine_version,
    figures: row.figures,
  };
}

export async function listVersions(db: Db, designId: string): Promise<VersionSummary[]> {
  const rows = await versionQuery(db, designId).orderBy('design_versions.number', 'desc').execute();
  return rows.map(toVersionSummary);
}

export async function findVersion(db: Db, designId: string, number: number): Promise<Version | undefined> {
  const row = await versionQuery(db, designId)
    .select('design_versions.document')
    .where('design_versions.number', '=', number)
    .executeTakeFirst();
  return row ? { ...toVersionSummary(row), designId, document: row.document } : undefined;
}
