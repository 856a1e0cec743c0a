import { Router, type Request } from 'express';
import type { Kysely } from 'kysely';
import { createDesignSchema, listDesignsQuerySchema, saveVersionSchema, updateDesignSchema, type Version } from '@shared/contracts/designs-api';
import { requireRole } from '../auth/authenticate';
import type { Database } from '../db/database';
import { badRequest, HttpProblem, notFound } from '../http/problem';
import { parseOrThrow } from '../http/validate';
import { appendVersion, findDesign, findVersion, insertDesign, listDesigns, listVersions, updateDesign, type DesignScope, type NewVersion } from './design.repository';
import { newVersion } from './new-version';
import { designPathSchema as designIdSchema, versionPathSchema } from './design-path';


function scopeOf(req: Request): DesignScope {
  const user = req.auth!.user;
  return { userId: user.id, seesAll: user.role === 'admin', seesOwn: user.role === 'designer' || user.role === 'admin' };
}

/** The version to store, or a 400 naming each field of the document that is wrong. */
function prepareVersion(document: unknown, message: string, authorId: string, engineVersion: string): NewVersion {
  const prepared = newVersion(document, message, authorId, engineVersion);
  if (prepared.ok) return prepared.version;
  const errors = prepared.errors.map((error) => ({ path: error.path ? `document.${error.path}` : 'document', message: error.message }));
  throw badRequest(`The design document is not valid: ${errors[0]!.path}: ${errors[0]!.message}.`, errors);
}

const noSuchDesign = () => notFound('No design with this id, or it is not shared with you.');

export function designRouter(db: Kysely<Database>, engineVersion: string): Router {
  const router = Router();
  router.use('/designs', requireRole());

  router.get('/designs', async (req, res) => {
    const query = parseOrThrow(listDesignsQuerySchema, req.query, 'query');
    const { items, total } = await listDesigns(db, scopeOf(req), query);
    res.json({ items, total, page: query.page, pageSize: query.pageSize });
  });

  router.post('/designs', requireRole('designer', 'admin'), async (req, res) => {
    const body = parseOrThrow(createDesignSchema, req.body, 'body');
    const version = prepareVersion(body.document, body.message, req.auth!.user.id, engineVersion);
    const id = await insertDesign(db, req.auth!.user.id, body.name, version);
    const created = await findDesign(db, scopeOf(req), id);
    res.status(201).location(`/api/designs/${id}`).json(created);
  });

  router.get('/designs/:id', async (req, res) => {
    const { id } = parseOrThrow(designIdSchema, req.params, 'path');
    const design = await findDesign(db, scopeOf(req), id);
    if (!design) throw noSuchDesign();
    res.json(design);
  });

  router.patch('/designs/:id', async (req, res) => {
    const { id } = parseOrThrow(designIdSchema, req.params, 'path');
    const body = parseOrThrow(updateDesignSchema, req.body, 'body');
    const scope = scopeOf(req);
    if (!(await findDesign(db, scope, id))) throw noSuchDesign();
    await updateDesign(db, id, req.auth!.user.id, body);
    res.json(await findDesign(db, scope, id));
  });

  router.get('/designs/:id/versions', async (req, res) => {
    const { id } = parseOrThrow(designIdSchema, req.params, 'path');
    if (!(await findDesign(db, scopeOf(req), id))) throw noSuchDesign();
    res.json({ items: await listVersions(db, id) });
  });

  router.post('/designs/:id/versions', async (req, res) => {
    const { id } = parseOrThrow(designIdSchema, req.params, 'path');
    const scope = scopeOf(req);
    const design = await findDesign(db, scope, id);
    if (!design) throw noSuchDesign();
    const body = parseOrThrow(saveVersionSchema, req.body, 'body');
    if (design.archived) throw new HttpProblem(409, 'Design archived', 'This design is archived; restore it before saving a new version.');
    const version = prepareVersion(body.document, body.message, req.auth!.user.id, engineVersion);
    const outcome = await appendVersion(db, id, body.baseVersion, version);
    if (!outcome.saved) {
      res.status(409).type('application/problem+json').json({
        status: 409,
        title: 'Newer version exists',
        detail: `Version ${outcome.latestVersion} was saved after version ${body.baseVersion}, which you edited. Nothing was overwritten: compare with version ${outcome.latestVersion}, then save on top of it.`,
        errors: [{ path: 'baseVersion', message: `The latest version is ${outcome.latestVersion}` }],
        latestVersion: outcome.latestVersion,
      });
      return;
    }
    // The answer is what was stored, built from the statement's result rather than read back.
    const { user } = req.auth!;
    const saved: Version = {
      designId: id,
      number: outcome.number,
      message: version.message,
      author: { id: user.id, displayName: user.displayName, email: user.email },
      createdAt: outcome.createdAt,
      formatVersion: version.formatVersion,
      engineVersion: version.engineVersion,
      figures: version.figures,
      document: version.document,
    };
    res.status(201).location(`/api/designs/${id}/versions/${outcome.number}`).json(saved);
  });

  router.get('/designs/:id/versions/:number', async (req, res) => {
    const { id, number } = parseOrThrow(versionPathSchema, req.params, 'path');
    if (!(await findDesign(db, scopeOf(req), id))) throw noSuchDesign();
    const version = await findVersion(db, id, number);
    if (!version) throw notFound(`This design has no version ${number}.`);
    res.json(version);
  });

  return router;
}
