import { Router } from 'express';
import type { Kysely } from 'kysely';
import { loadDesign } from '@shared/contracts/design-loader';
import { evaluateBudget } from '@shared/engine/budget/evaluate';
import { requireRole } from '../auth/authenticate';
import type { Database } from '../db/database';
import { findDesign, findVersion } from '../designs/design.repository';
import { HttpProblem, notFound } from '../http/problem';
import { parseOrThrow } from '../http/validate';
import { listReviewsOfDesign } from '../reviews/review.repository';
import { renderDesignReport } from './design-report';
import { simulateReportSpectrum } from './report-workers';
import { versionPathSchema as versionPath } from '../designs/design-path';

function fileName(name: string, number: number): string {
  const safe = name.replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 80) || 'design';
  return `${safe}-v${number}-report.pdf`;
}

/** GET /api/designs/:id/versions/:number/report: the PDF for the owner, admins and the version's reviewers. */
export function reportRouter(db: Kysely<Database>, engineVersion: string): Router {
  const router = Router();
  router.get('/designs/:id/versions/:number/report', requireRole(), async (req, res) => {
    const { id, number } = parseOrThrow(versionPath, req.params, 'path');
    const user = req.auth!.user;
    const reviews = await listReviewsOfDesign(db, id);
    const owned = await findDesign(db, { userId: user.id, seesAll: user.role === 'admin', seesOwn: user.role !== 'reviewer' }, id);
    const reviewsThisVersion = reviews.some((r) => r.reviewer?.id === user.id && r.versionNumber === number);
    if (!owned && !reviewsThisVersion) throw notFound('No design with this id, or it is not shared with you.');
    const version = await findVersion(db, id, number);
    if (!version) throw notFound(`This design has no version ${number}.`);
    const loaded = loadDesign(version.document);
    if (!loaded.ok) throw new HttpProblem(422, 'Stored document not readable', 'This version’s document no longer passes validation; open it in the workbench to see why.', loaded.errors);
    const designName = owned?.name ?? reviews[0]!.design.name;
    // A report without its spectrum beats no report: the PDF says the simulation did not run.
    const spectrum = await simulateReportSpectrum(loaded.design).catch((error: unknown) => {
      req.log?.warn({ err: error }, 'the report spectrum simulation failed');
      return null;
    });
    const pdf = await renderDesignReport({
      designName,
      version,
      budget: evaluateBudget(loaded.design),
      reviews: reviews.map(({ ownerId: _owner, ...review }) => review),
      spectrum,
      generatedAt: new Date(),
      generatedBy: user.displayName,
      engineVersion,
    });
    res.type('application/pdf').setHeader('Content-Disposition', `attachment; filename="${fileName(designName, number)}"`);
    res.send(pdf);
  });
  return router;
}
