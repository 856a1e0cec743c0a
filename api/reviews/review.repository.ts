import { sql, type Kysely, type Transaction } from 'kysely';
import type { Review, ReviewComment } from '@shared/contracts/reviews-api';
import type { Database } from '../db/database';

type Db = Kysely<Database> | Transaction<Database>;

function iso(value: Date | string | null): string | null {
  return value === null ? null : new Date(value).toISOString();
}

function reviewQuery(db: Db) {
  return db
    .selectFrom('reviews')
    .innerJoin('designs', 'designs.id', 'reviews.design_id')
    .innerJoin('users as requester', 'requester.id', 'reviews.requested_by')
    .leftJoin('users as reviewer', 'reviewer.id', 'reviews.reviewer_id')
    .select((eb) => [
      'reviews.id',
      'reviews.design_id',
      'reviews.version_number',
      'reviews.reviewer_email',
      'reviews.reviewer_id',
      'reviews.note',
      'reviews.state',
      'reviews.decision_note',
      'reviews.decided_at',
      'reviews.created_at',
      'designs.name as design_name',
      'designs.owner_id',
      'requester.id as requester_id',
      'requester.display_name as requester_name',
      'requester.email as requester_email',
      'reviewer.display_name as reviewer_name',
      'reviewer.email as reviewer_account_email',
      eb
        .exists(eb.selectFrom('outbox').select('outbox.id').whereRef('outbox.review_id', '=', 'reviews.id').where('outbox.sent_at', 'is', null))
        .as('mail_pending'),
    ]);
}

type ReviewRow = Awaited<ReturnType<ReturnType<typeof reviewQuery>['executeTakeFirstOrThrow']>>;

export interface ReviewRecord extends Review {
  ownerId: string;
}

function toReview(row: ReviewRow): ReviewRecord {
  return {
    id: row.id,
    design: { id: row.design_id, name: row.design_name },
    versionNumber: row.version_number,
    requestedBy: { id: row.requester_id, displayName: row.requester_name, email: row.requester_email },
    reviewerEmail: row.reviewer_email,
    reviewer: row.reviewer_id ? { id: row.reviewer_id, displayName: row.reviewer_name ?? '', email: row.reviewer_account_email ?? row.reviewer_email } : null,
    note: row.note,
    state: row.state,
    decisionNote: row.decision_note,
    decidedAt: iso(row.decided_at),
    createdAt: iso(row.created_at)!,
    notification: row.mail_pending ? 'pending' : 'sent',
    ownerId: row.owner_id,
  };
}

/** Public shape of a review (without the owner id used for access checks). */
export function publicReview({ ownerId: _owner, ...review }: ReviewRecord): Review {
  return review;
}

export async function findReview(db: Db, id: string): Promise<ReviewRecord | undefined> {
  const row = await reviewQuery(db).where('reviews.id', '=', id).executeTakeFirst();
  return row ? toReview(row) : undefined;
}

export async function listReviewsAssignedTo(db: Db, userId: string): Promise<ReviewRecord[]> {
  const rows = await reviewQuery(db).where('reviews.reviewer_id', '=', userId).orderBy('reviews.created_at', 'desc').execute();
  return rows.map(toReview);
}

export async function listReviewsOfDesign(db: Db, designId: string): Promise<ReviewRecord[]> {
  const rows = await reviewQuery(db).where('reviews.design_id', '=', designId).orderBy('reviews.created_at', 'desc').execute();
  return rows.map(toReview);
}

export async function insertReview(
  trx: Db,
  review: { designId: string; versionNumber: number; requestedBy: string; reviewerEmail: string; reviewerId: string | null; note: string },
): Promise<string> {
  const row = await trx
    .insertInto('reviews')
    .values({
      design_id: review.designId,
      version_number: review.versionNumber,
      requested_by: review.requestedBy,
      reviewer_email: review.reviewerEmail,
      reviewer_id: review.reviewerId,
      note: review.note,
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  return row.id;
}

/** Records the decision only while the review is pending; false when someone decided first. */
export async function decideReview(trx: Db, id: string, decision: 'approved' | 'changes_requested', note: string): Promise<boolean> {
  const result = await trx
    .updateTable('reviews')
    .set({ state: decision, decision_note: note, decided_at: sql`now()` })
    .where('id', '=', id)
    .where('state', '=', 'pending')
    .executeTakeFirst();
  return Number(result.numUpdatedRows) === 1;
}

/** The newest earlier version of the design that was sent for review, for the comparison. */
export async function previousReviewedVersion(db: Db, designId: string, before: number): Promise<number | null> {
  const row = await db
    .selectFrom('reviews')
    .select((eb) => eb.fn.max('version_number').as('number'))
    .where('design_id', '=', designId)
    .where('version_number', '<', before)
    .executeTakeFirst();
  return row?.number ?? null;
}

function commentQuery(db: Db) {
  return db
    .selectFrom('review_comments')
    .innerJoin('users', 'users.id', 'review_comments.author_id')
    .select([
      'review_comments.id',
      'review_comments.review_id',
      'review_comments.parent_id',
      'review_comments.stage',
      'review_comments.field',
      'review_comments.body',
      'review_comments.resolved',
      'review_comments.created_at',
      'users.id as author_id',
      'users.display_name as author_name',
      'users.email as author_email',
    ]);
}

type CommentRow = Awaited<ReturnType<ReturnType<typeof commentQuery>['executeTakeFirstOrThrow']>>;

function toComment(row: CommentRow): ReviewComment {
  return {
    id: row.id,
    reviewId: row.review_id,
    author: { id: row.author_id, displayName: row.author_name, email: row.author_email },
    parentId: row.parent_id,
    stage: row.stage,
    field: row.field,
    body: row.body,
    resolved: row.resolved,
    createdAt: iso(row.created_at)!,
  };
}

export async function listComments(db: Db, reviewId: string): Promise<ReviewComment[]> {
  const rows = await commentQuery(db).where('review_comments.review_id', '=', reviewId).orderBy('review_comments.created_at').orderBy('review_comments.id').execute();
  return rows.map(toComment);
}

export async function findComment(db: Db, reviewId: string, id: string): Promise<ReviewComment | undefined> {
  const row = await commentQuery(db).where('review_comments.review_id', '=', reviewId).where('review_comments.id', '=', id).executeTakeFirst();
  return row ? toComment(row) : undefined;
}

export async function insertComment(
  trx: Db,
  comment: { reviewId: string; authorId: string; parentId: string | null; stage: string | null; field: string | null; body: string },
): Promise<string> {
  const row = await trx
    .insertInto('review_comments')
    .values({
      review_id: comment.reviewId,
      author_id: comment.authorId,
      parent_id: comment.parentId,
      stage: comment.stage,
      field: comment.field,
      body: comment.body,
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  return row.id;
}

export async function setCommentResolved(db: Db, reviewId: string, id: string, resolved: boolean): Promise<void> {
  await db.updateTable('review_comments').set({ resolved }).where('review_id', '=', reviewId).where('id', '=', id).execute();
}
