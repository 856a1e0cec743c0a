import { Router, type Request } from 'express';
import { rateLimit } from 'express-rate-limit';
import type { Kysely } from 'kysely';
import { z } from 'zod';
import { acceptInvitationSchema, createCommentSchema, decisionSchema, shareVersionSchema, updateCommentSchema } from '@shared/contracts/reviews-api';
import { recordEvent } from '../audit/audit.repository';
import { requireRole } from '../auth/authenticate';
import { passwordProblems } from '../auth/password-policy';
import { setSessionCookies } from '../auth/session-cookies';
import { issueSession } from '../auth/session.service';
import type { Config } from '../config';
import type { Database } from '../db/database';
import { designPathSchema as designPath, versionPathSchema as versionPath } from '../designs/design-path';
import { findDesign, findVersion } from '../designs/design.repository';
import { badRequest, conflict, HttpProblem, notFound } from '../http/problem';
import { parseOrThrow } from '../http/validate';
import { enqueueMail, type Outbox } from '../mail/outbox';
import { decisionMail, invitationMail, reviewRequestedMail } from '../mail/templates';
import { hashPassword } from '../auth/password-hashing';
import { findUserByEmail, insertUser, toUser } from '../users/user.repository';
import { consumeInvitation, createInvitation, lookUpInvitation } from './invitation.service';
import {
  decideReview,
  findComment,
  findReview,
  insertComment,
  insertReview,
  listComments,
  listReviewsAssignedTo,
  listReviewsOfDesign,
  previousReviewedVersion,
  publicReview,
  setCommentResolved,
  type ReviewRecord,
} from './review.repository';

const reviewPath = z.object({ id: z.string().uuid('Review id must be a UUID') });
const commentPath = reviewPath.extend({ commentId: z.string().uuid('Comment id must be a UUID') });
const tokenPath = z.object({ token: z.string().min(20, 'Invitation link is not complete').max(200, 'Invitation link is not valid') });

const usedInvitation = () => new HttpProblem(410, 'Invitation used', 'This invitation link has already been used; sign in instead.');

/** The invitation behind a link, or the problem that says why the link no longer works. */
async function validInvitation(db: Kysely<Database>, token: string) {
  const invitation = await lookUpInvitation(db, token);
  if (invitation.state === 'valid') return invitation;
  if (invitation.state === 'used') throw usedInvitation();
  if (invitation.state === 'expired') throw new HttpProblem(410, 'Invitation expired', 'This invitation link has expired; ask for a new one.');
  throw notFound('This invitation link is not valid.');
}

const noSuchReview = () => notFound('No review with this id, or it is not shared with you.');

/** Who may see a review: its reviewer, the design's owner, and admins; everyone else gets 404. */
function canSee(req: Request, review: ReviewRecord): boolean {
  const user = req.auth!.user;
  return user.role === 'admin' || review.reviewer?.id === user.id || review.ownerId === user.id;
}

export function reviewRouter(db: Kysely<Database>, config: Config, outbox: Outbox | null): Router {
  const router = Router();
  const wake = () => outbox?.wake();
  const invitationLimit = rateLimit({
    windowMs: 15 * 60_000,
    limit: 20,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    handler: (_req, _res, next) => next(new HttpProblem(429, 'Too many attempts', 'Too many invitation attempts from this address; try again in a few minutes.', [], { 'Retry-After': '60' })),
  });

  router.post('/designs/:id/versions/:number/reviews', requireRole('designer', 'admin'), async (req, res) => {
    const { id, number } = parseOrThrow(versionPath, req.params, 'path');
    const user = req.auth!.user;
    const design = await findDesign(db, { userId: user.id, seesAll: user.role === 'admin', seesOwn: true }, id);
    if (!design) throw notFound('No design with this id, or it is not shared with you.');
    if (!(await findVersion(db, id, number))) throw notFound(`This design has no version ${number}.`);
    const body = parseOrThrow(shareVersionSchema, req.body, 'body');
    if (body.reviewerEmail === design.owner.email) {
      throw badRequest('The design’s owner cannot review it; choose a colleague.', [{ path: 'reviewerEmail', message: 'Choose someone other than the owner' }]);
    }
    const reviewer = await findUserByEmail(db, body.reviewerEmail);
    if (reviewer?.disabled) throw conflict('That account is disabled; ask an administrator or choose another reviewer.', [{ path: 'reviewerEmail', message: 'Account disabled' }]);

    const reviewId = await db.transaction().execute(async (trx) => {
      const newId = await insertReview(trx, {
        designId: id,
        versionNumber: number,
        requestedBy: user.id,
        reviewerEmail: body.reviewerEmail,
        reviewerId: reviewer?.id ?? null,
        note: body.note,
      });
      const common = { to: body.reviewerEmail, requester: user.displayName, designName: design.name, versionNumber: number, note: body.note, reviewId: newId };
      if (reviewer) {
        await enqueueMail(trx, reviewRequestedMail({ ...common, link: `${config.publicUrl}/reviews/${newId}` }));
      } else {
        const invitation = await createInvitation(trx, body.reviewerEmail, user.id, config.invitationTtlMs);
        await enqueueMail(trx, invitationMail({ ...common, link: `${config.publicUrl}/sign-up?token=${invitation.token}`, expiresAt: invitation.expiresAt }));
        await recordEvent(trx, { designId: id, versionNumber: number, actorId: user.id, action: 'invited', detail: { email: body.reviewerEmail } });
      }
      await recordEvent(trx, { designId: id, versionNumber: number, actorId: user.id, action: 'shared', detail: { reviewerEmail: body.reviewerEmail, reviewId: newId } });
      return newId;
    });
    wake();
    res.status(201).location(`/api/reviews/${reviewId}`).json(publicReview((await findReview(db, reviewId))!));
  });

  router.get('/designs/:id/reviews', requireRole(), async (req, res) => {
    const { id } = parseOrThrow(designPath, req.params, 'path');
    const user = req.auth!.user;
    const design = await findDesign(db, { userId: user.id, seesAll: user.role === 'admin', seesOwn: user.role !== 'reviewer' }, id);
    if (!design) throw notFound('No design with this id, or it is not shared with you.');
    res.json({ items: (await listReviewsOfDesign(db, id)).map(publicReview) });
  });

  router.get('/reviews', requireRole(), async (req, res) => {
    res.json({ items: (await listReviewsAssignedTo(db, req.auth!.user.id)).map(publicReview) });
  });

  router.get('/reviews/:id', requireRole(), async (req, res) => {
    const { id } = parseOrThrow(reviewPath, req.params, 'path');
    const review = await findReview(db, id);
    if (!review || !canSee(req, review)) throw noSuchReview();
    const [version, comments, previous] = await Promise.all([
      findVersion(db, review.design.id, review.versionNumber),
      listComments(db, id),
      previousReviewedVersion(db, review.design.id, review.versionNumber),
    ]);
    res.json({ review: publicReview(review), version, comments, previousReviewedVersion: previous });
  });

  router.post('/reviews/:id/comments', requireRole(), async (req, res) => {
    const { id } = parseOrThrow(reviewPath, req.params, 'path');
    const review = await findReview(db, id);
    if (!review || !canSee(req, review)) throw noSuchReview();
    const body = parseOrThrow(createCommentSchema, req.body, 'body');
    if (body.parentId && !(await findComment(db, id, body.parentId))) {
      throw badRequest('The comment replied to is not part of this review.', [{ path: 'parentId', message: 'No such comment in this review' }]);
    }
    const commentId = await db.transaction().execute(async (trx) => {
      const newId = await insertComment(trx, {
        reviewId: id,
        authorId: req.auth!.user.id,
        parentId: body.parentId ?? null,
        stage: body.stage ?? null,
        field: body.field ?? null,
        body: body.body,
      });
      await recordEvent(trx, {
        designId: review.design.id,
        versionNumber: review.versionNumber,
        actorId: req.auth!.user.id,
        action: 'commented',
        detail: { reviewId: id, commentId: newId, stage: body.stage ?? null, field: body.field ?? null },
      });
      return newId;
    });
    res.status(201).json(await findComment(db, id, commentId));
  });

  router.patch('/reviews/:id/comments/:commentId', requireRole(), async (req, res) => {
    const { id, commentId } = parseOrThrow(commentPath, req.params, 'path');
    const review = await findReview(db, id);
    if (!review || !canSee(req, review)) throw noSuchReview();
    const body = parseOrThrow(updateCommentSchema, req.body, 'body');
    if (!(await findComment(db, id, commentId))) throw notFound('No such comment in this review.');
    await setCommentResolved(db, id, commentId, body.resolved);
    res.json(await findComment(db, id, commentId));
  });

  router.post('/reviews/:id/decision', requireRole(), async (req, res) => {
    const { id } = parseOrThrow(reviewPath, req.params, 'path');
    const review = await findReview(db, id);
    if (!review || !canSee(req, review)) throw noSuchReview();
    if (review.reviewer?.id !== req.auth!.user.id) throw new HttpProblem(403, 'Forbidden', 'Only the reviewer asked for this review can decide it.');
    const body = parseOrThrow(decisionSchema, req.body, 'body');
    const decided = await db.transaction().execute(async (trx) => {
      if (!(await decideReview(trx, id, body.decision, body.note))) return false;
      await enqueueMail(
        trx,
        decisionMail({
          to: review.requestedBy.email,
          reviewer: req.auth!.user.displayName,
          designName: review.design.name,
          versionNumber: review.versionNumber,
          decision: body.decision,
          note: body.note,
          link: `${config.publicUrl}/reviews/${id}`,
          reviewId: id,
        }),
      );
      await recordEvent(trx, {
        designId: review.design.id,
        versionNumber: review.versionNumber,
        actorId: req.auth!.user.id,
        action: 'decided',
        detail: { reviewId: id, decision: body.decision, note: body.note },
      });
      return true;
    });
    if (!decided) throw conflict('This review has already been decided.', [{ path: 'decision', message: 'Already decided' }]);
    wake();
    res.json(publicReview((await findReview(db, id))!));
  });

  router.get('/invitations/:token', invitationLimit, async (req, res) => {
    const { token } = parseOrThrow(tokenPath, req.params, 'path');
    const invitation = await validInvitation(db, token);
    res.json({ email: invitation.email, expiresAt: invitation.expiresAt.toISOString(), invitedBy: invitation.invitedBy });
  });

  router.post('/invitations/:token/accept', invitationLimit, async (req, res) => {
    const { token } = parseOrThrow(tokenPath, req.params, 'path');
    const body = parseOrThrow(acceptInvitationSchema, req.body, 'body');
    const invitation = await validInvitation(db, token);
    const problems = passwordProblems(body.password, invitation.email);
    if (problems.length > 0) throw badRequest(`The password is not accepted: ${problems[0]!.message}.`, problems);
    if (await findUserByEmail(db, invitation.email)) throw conflict('An account with this e-mail already exists; sign in instead.', [{ path: 'email', message: 'Already has an account' }]);
    const passwordHash = await hashPassword(body.password, config.bcryptCost);
    const user = await db.transaction().execute(async (trx) => {
      if (!(await consumeInvitation(trx, invitation.id))) return null;
      const created = await insertUser(trx, { email: invitation.email, display_name: body.displayName, role: 'reviewer', password_hash: passwordHash });
      await trx.updateTable('reviews').set({ reviewer_id: created.id }).where('reviewer_email', '=', invitation.email).where('reviewer_id', 'is', null).execute();
      return created;
    });
    if (!user) throw usedInvitation();
    const session = await issueSession(db, config, user, { userAgent: req.get('user-agent') ?? null, address: req.ip ?? null });
    setSessionCookies(res, config, session);
    res.status(201).json({ user: toUser(user), token: session.token, expiresAt: session.expiresAt.toISOString() });
  });

  return router;
}
