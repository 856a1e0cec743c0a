import { Router, type Request, type RequestHandler } from 'express';
import type { Kysely } from 'kysely';
import multer from 'multer';
import { z } from 'zod';
import {
  columnMappingSchema,
  MAX_DATASET_BYTES,
  previewMappingSchema,
  readoutUnits,
  referenceUnits,
  type DatasetPreview,
} from '@shared/contracts/calibration';
import { requireRole } from '../auth/authenticate';
import type { Database } from '../db/database';
import { findDesign, type DesignScope } from '../designs/design.repository';
import { badRequest, HttpProblem, notFound } from '../http/problem';
import { parseOrThrow } from '../http/validate';
import { missingColumns, readBenchFile, readPoints } from './bench-csv';
import { deleteDataset, findDataset, findDatasetFile, findDatasetSummary, insertDataset, listDatasets } from './dataset.repository';
import { designPathSchema as designIdSchema } from '../designs/design-path';

const datasetPathSchema = designIdSchema.extend({ datasetId: z.string().uuid('Dataset id must be a UUID') });

/** Rows the preview returns. */
const PREVIEW_ROWS = 20;
const megabytes = `${MAX_DATASET_BYTES / (1024 * 1024)} MB`;

function scopeOf(req: Request): DesignScope {
  const user = req.auth!.user;
  return { userId: user.id, seesAll: user.role === 'admin', seesOwn: user.role === 'designer' || user.role === 'admin' };
}

const noSuchDesign = () => notFound('No design with this id, or it is not shared with you.');
const noSuchDataset = () => notFound('This design has no dataset with this id.');

/** One file in memory under the size limit; multer's own errors become problems naming the field. */
function singleFile(): RequestHandler {
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: MAX_DATASET_BYTES, files: 1, fields: 20, fieldSize: 4096 } }).single('file');
  return (req, res, next) => {
    upload(req, res, (error: unknown) => {
      if (error instanceof multer.MulterError) {
        if (error.code === 'LIMIT_FILE_SIZE') {
          next(new HttpProblem(413, 'File too large', `The file is larger than ${megabytes}; split the runs into several files of at most ${megabytes} each.`, [{ path: 'file', message: `Larger than ${megabytes}` }]));
        } else if (error.code === 'LIMIT_UNEXPECTED_FILE') {
          next(badRequest(`Send one file, in the multipart field "file" (got "${error.field}").`, [{ path: error.field ?? 'file', message: 'Unexpected file field' }]));
        } else {
          next(badRequest(`The upload could not be read: ${error.message}.`, [{ path: error.field ?? 'file', message: error.message }]));
        }
        return;
      }
      if (error) {
        next(badRequest('The upload is not a readable multipart form.', [{ path: 'file', message: 'Not a readable multipart form' }]));
        return;
      }
      next();
    });
  };
}

function uploadedFile(req: Request): Express.Multer.File {
  if (!req.file) throw badRequest('Attach the CSV file as the multipart form field "file".', [{ path: 'file', message: 'No file attached' }]);
  return req.file;
}

/** The original name as the browser sent it: multer reads it as latin1, browsers send UTF-8. */
function fileNameOf(file: Express.Multer.File): string {
  return Buffer.from(file.originalname, 'latin1').toString('utf8').slice(0, 200) || 'bench.csv';
}

export function datasetRouter(db: Kysely<Database>): Router {
  const router = Router();
  router.use('/designs/:id/datasets', requireRole());

  async function visibleDesign(req: Request) {
    const { id } = parseOrThrow(designIdSchema, req.params, 'path');
    const design = await findDesign(db, scopeOf(req), id);
    if (!design) throw noSuchDesign();
    return design;
  }

  router.get('/designs/:id/datasets', async (req, res) => {
    const design = await visibleDesign(req);
    res.json({ items: await listDatasets(db, design.id) });
  });

  router.post('/designs/:id/datasets/preview', singleFile(), async (req, res) => {
    await visibleDesign(req);
    const file = uploadedFile(req);
    const mapping = parseOrThrow(previewMappingSchema, req.body ?? {}, 'body');
    const parsed = readBenchFile(file.buffer);
    const columnErrors = missingColumns(parsed.columns, mapping);
    const full = columnMappingSchema.safeParse(req.body);
    const complete = columnErrors.length === 0 && full.success;
    const read = complete && full.success ? readPoints(parsed, full.data) : { points: [], errors: columnErrors, errorCount: columnErrors.length };
    const preview: DatasetPreview = {
      fileName: fileNameOf(file),
      columns: parsed.columns,
      delimiter: parsed.delimiter,
      rowCount: parsed.rows.length,
      rows: parsed.rows.slice(0, PREVIEW_ROWS),
      points: read.points.slice(0, PREVIEW_ROWS),
      errors: read.errors,
      errorCount: read.errorCount,
      complete,
    };
    res.json(preview);
  });

  router.post('/designs/:id/datasets', singleFile(), async (req, res) => {
    const design = await visibleDesign(req);
    if (design.archived) throw new HttpProblem(409, 'Design archived', 'This design is archived; restore it before adding bench data.');
    const file = uploadedFile(req);
    const mapping = parseOrThrow(columnMappingSchema, req.body ?? {}, 'body');
    const parsed = readBenchFile(file.buffer);
    const columnErrors = missingColumns(parsed.columns, mapping);
    if (columnErrors.length > 0) throw badRequest(`The column mapping does not fit the file: ${columnErrors[0].message}.`, columnErrors);
    const { points, errors, errorCount } = readPoints(parsed, mapping);
    if (errorCount > 0) {
      throw badRequest(`${errorCount} row${errorCount === 1 ? '' : 's'} could not be read, so nothing was stored; the first: ${errors[0].message}.`, errors);
    }
    const fileName = fileNameOf(file);
    const { name, notes, ...columns } = mapping;
    const id = await insertDataset(db, {
      designId: design.id,
      name: name ?? fileName,
      notes: notes ?? '',
      fileName,
      fileContent: file.buffer,
      mapping: Object.fromEntries(Object.entries(columns).filter((entry): entry is [string, string] => entry[1] !== undefined)),
      units: {
        reference: referenceUnits[mapping.referenceUnit].si,
        referenceDisplay: mapping.referenceUnit,
        readout: readoutUnits[mapping.readoutUnit].si,
        readoutDisplay: mapping.readoutUnit,
      },
      createdBy: req.auth!.user.id,
      points,
    });
    res.status(201).location(`/api/designs/${design.id}/datasets/${id}`).json(await findDatasetSummary(db, design.id, id));
  });

  router.get('/designs/:id/datasets/:datasetId', async (req, res) => {
    const { datasetId } = parseOrThrow(datasetPathSchema, req.params, 'path');
    const design = await visibleDesign(req);
    const dataset = await findDataset(db, design.id, datasetId);
    if (!dataset) throw noSuchDataset();
    res.json(dataset);
  });

  router.get('/designs/:id/datasets/:datasetId/file', async (req, res) => {
    const { datasetId } = parseOrThrow(datasetPathSchema, req.params, 'path');
    const design = await visibleDesign(req);
    const file = await findDatasetFile(db, design.id, datasetId);
    if (!file) throw noSuchDataset();
    res.attachment(file.fileName).type('text/csv').send(file.content);
  });

  router.delete('/designs/:id/datasets/:datasetId', async (req, res) => {
    const { datasetId } = parseOrThrow(datasetPathSchema, req.params, 'path');
    const design = await visibleDesign(req);
    if (!(await deleteDataset(db, design.id, datasetId))) throw noSuchDataset();
    res.status(204).end();
  });

  return router;
}
