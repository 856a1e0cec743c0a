import { Router } from 'express';
import type { Kysely } from 'kysely';
import { requireRole } from '../auth/authenticate';
import type { Database } from '../db/database';
import { findDesign } from '../designs/design.repository';
import { notFound } from '../http/problem';
import { parseOrThrow } from '../http/validate';
import { listEvents } from './audit.repository';
import { designPathSchema as designPath } from '../designs/design-path';


/** The design's audit trail, oldest first: its owner and admins. */
export function auditRouter(db: Kysely<Database>): Router {
  const router = Router();
  router.get('/designs/:id/audit', requireRole('designer', 'admin'), async (req, res) => {
    const { id } = parseOrThrow(designPath, req.params, 'path');
    const user = req.auth!.user;
    if (!(await findDesign(db, { userId: user.id, seesAll: user.role === 'admin', seesOwn: true }, id))) {
      throw notFound('No design with this id, or it is not shared with you.');
    }
    res.json({ items: await listEvents(db, id) });
  });
  return router;
}
