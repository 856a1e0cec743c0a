import { z } from 'zod';
import { columnMappingSchema, datasetListSchema, datasetPreviewSchema, datasetSchema, datasetSummarySchema, MAX_DATASET_BYTES, previewMappingSchema } from '@shared/contracts/calibration';
import type { Operation } from '../openapi/operation';

const signedIn = 'any' as const;
const multipart = `multipart/form-data: the CSV in the field "file" (at most ${MAX_DATASET_BYTES / (1024 * 1024)} MB, UTF-8, header row) and the ColumnMapping fields`;
const fileDescription = `The bench CSV: UTF-8 text with a header row, at most ${MAX_DATASET_BYTES / (1024 * 1024)} MB`;

export const datasetOperations: Operation[] = [
  {
    method: 'get',
    path: '/api/designs/{id}/datasets',
    summary: 'The bench calibration datasets of a design you may see, newest first',
    tag: 'Calibration',
    access: signedIn,
    pathParameters: ['id'],
    responses: { 200: { description: 'Datasets', schema: datasetListSchema }, 404: { description: 'No such design, or not yours' } },
  },
  {
    method: 'post',
    path: '/api/designs/{id}/datasets/preview',
    summary: `Parse a bench file without storing it: columns, the first rows, and row-level errors for the mapped columns. ${multipart} (any of them)`,
    tag: 'Calibration',
    access: signedIn,
    pathParameters: ['id'],
    multipart: { file: 'file', fileDescription, fields: previewMappingSchema },
    responses: {
      200: { description: 'Preview', schema: datasetPreviewSchema },
      400: { description: 'Not a CSV text file (empty, binary, no header, no rows) or a mapping field not valid' },
      404: { description: 'No such design, or not yours' },
      413: { description: 'File over the size limit' },
    },
  },
  {
    method: 'post',
    path: '/api/designs/{id}/datasets',
    summary: `Store a bench file and its points (SI units); nothing is stored when any row is bad. ${multipart}`,
    tag: 'Calibration',
    access: signedIn,
    pathParameters: ['id'],
    multipart: { file: 'file', fileDescription, fields: columnMappingSchema },
    responses: {
      201: { description: 'Stored', schema: datasetSummarySchema },
      400: { description: 'Not a CSV text file, a mapped column missing, or bad rows (paths like file.rows[214].readout)' },
      404: { description: 'No such design, or not yours' },
      409: { description: 'The design is archived' },
      413: { description: 'File over the size limit' },
    },
  },
  {
    method: 'get',
    path: '/api/designs/{id}/datasets/{datasetId}',
    summary: 'One dataset with its points in file order',
    tag: 'Calibration',
    access: signedIn,
    pathParameters: ['id', 'datasetId'],
    responses: { 200: { description: 'The dataset', schema: datasetSchema }, 404: { description: 'No such design or dataset, or not yours' } },
  },
  {
    method: 'get',
    path: '/api/designs/{id}/datasets/{datasetId}/file',
    summary: 'The original file as uploaded',
    tag: 'Calibration',
    access: signedIn,
    pathParameters: ['id', 'datasetId'],
    responses: { 200: { description: 'The CSV file', schema: z.string(), contentType: 'text/csv' }, 404: { description: 'No such design or dataset, or not yours' } },
  },
  {
    method: 'delete',
    path: '/api/designs/{id}/datasets/{datasetId}',
    summary: 'Delete a dataset with its file and points',
    tag: 'Calibration',
    access: signedIn,
    pathParameters: ['id', 'datasetId'],
    responses: { 204: { description: 'Deleted' }, 404: { description: 'No such design or dataset, or not yours' } },
  },
];
