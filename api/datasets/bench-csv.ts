/**
 * Reads a bench file: checks that it is UTF-8 text, parses it with papaparse (delimiter detected),
 * and turns each row into a point with the column mapping, collecting row-level errors that name
 * the row as a spreadsheet numbers it (the header is row 1).
 */
import Papa from 'papaparse';
import { MAX_DATASET_ROWS, readoutUnits, referenceUnits, type BenchPoint, type ColumnMapping } from '@shared/contracts/calibration';
import type { FieldError } from '@shared/contracts/problem';
import { badRequest } from '../http/problem';

/** Row-level errors reported at most; the count says how many there were. */
const MAX_REPORTED_ERRORS = 100;

const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

export interface ParsedBenchFile {
  columns: string[];
  delimiter: string;
  rows: Record<string, string>[];
}

/** The file as text rows, or a 400 saying why it is not a CSV file. */
export function readBenchFile(content: Buffer): ParsedBenchFile {
  if (content.length === 0) throw badRequest('The file is empty: upload a CSV file with a header row and one row per point.', [{ path: 'file', message: 'The file is empty' }]);
  const nul = content.indexOf(0);
  if (nul >= 0) {
    throw badRequest(`The file holds binary data (a zero byte at offset ${nul}); upload the bench runs as a CSV text file.`, [{ path: 'file', message: 'Binary data, not a CSV text file' }]);
  }
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(content);
  } catch {
    throw badRequest('The file is not UTF-8 text; save the CSV as UTF-8 and upload it again.', [{ path: 'file', message: 'Not UTF-8 text' }]);
  }
  const parsed = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ''), {
    header: true,
    skipEmptyLines: 'greedy',
    transformHeader: (name) => name.trim(),
  });
  const columns = (parsed.meta.fields ?? []).filter((name) => name !== '');
  if (columns.length === 0) throw badRequest('The file has no header row: the first line must name the columns.', [{ path: 'file', message: 'No header row' }]);
  if (parsed.data.length === 0) throw badRequest('The file has a header row but no data rows.', [{ path: 'file', message: 'No data rows' }]);
  if (parsed.data.length > MAX_DATASET_ROWS) {
    throw badRequest(`The file has ${parsed.data.length} data rows; at most ${MAX_DATASET_ROWS} fit in one dataset.`, [{ path: 'file', message: `More than ${MAX_DATASET_ROWS} rows` }]);
  }
  return { columns, delimiter: parsed.meta.delimiter, rows: parsed.data };
}

/** Errors for mapped columns that the file does not have, with the field that names them. */
export function missingColumns(columns: readonly string[], mapping: Partial<ColumnMapping>): FieldError[] {
  const mapped = ['referenceColumn', 'readoutColumn', 'cellColumn', 'runColumn', 'directionColumn', 'timeColumn'] as const;
  const errors: FieldError[] = [];
  for (const field of mapped) {
    const name = mapping[field];
    if (name !== undefined && !columns.includes(name)) errors.push({ path: field, message: `Column "${name}" is not in the file (columns: ${columns.join(', ')})` });
  }
  return errors;
}

const directions: Record<string, 'up' | 'down'> = { up: 'up', u: 'up', down: 'down', d: 'down' };

/**
 * Reads every row with a complete mapping.
 * @returns the points in file order and the row-level errors (at most MAX_REPORTED_ERRORS, with the total).
 */
export function readPoints(file: ParsedBenchFile, mapping: ColumnMapping): { points: BenchPoint[]; errors: FieldError[]; errorCount: number } {
  const referenceScale = referenceUnits[mapping.referenceUnit].scale;
  const readoutScale = readoutUnits[mapping.readoutUnit].scale;
  // With ';' between fields, a comma is the decimal separator (spreadsheets in many locales write so).
  const decimalComma = file.delimiter === ';';
  const points: BenchPoint[] = [];
  const errors: FieldError[] = [];
  let errorCount = 0;
  const report = (row: number, field: string, message: string) => {
    errorCount++;
    if (errors.length < MAX_REPORTED_ERRORS) errors.push({ path: `file.rows[${row}].${field}`, message: `row ${row}: ${message}` });
  };
  file.rows.forEach((record, index) => {
    const row = index + 2;
    const cellText = (column: string) => (record[column] ?? '').trim();
    const number = (field: string, label: string, column: string): number | null => {
      const text = cellText(column);
      const normalised = decimalComma ? text.replace(',', '.') : text;
      if (text === '') report(row, field, `${label} is empty (column "${column}")`);
      else if (!DECIMAL.test(normalised)) report(row, field, `${label} is not a number ("${text}" in column "${column}")`);
      else return Number(normalised);
      return null;
    };
    const reference = number('reference', 'reference', mapping.referenceColumn);
    const readout = number('readout', 'readout', mapping.readoutColumn);
    const time = mapping.timeColumn === undefined || cellText(mapping.timeColumn) === '' ? null : number('time', 'time', mapping.timeColumn);
    const cell = cellText(mapping.cellColumn);
    const run = cellText(mapping.runColumn);
    const directionText = cellText(mapping.directionColumn);
    const direction = directions[directionText.toLowerCase()];
    if (cell === '') report(row, 'cell', `cell id is empty (column "${mapping.cellColumn}")`);
    if (run === '') report(row, 'run', `run id is empty (column "${mapping.runColumn}")`);
    if (direction === undefined) report(row, 'direction', `direction must be up or down ("${directionText}" in column "${mapping.directionColumn}")`);
    if (reference === null || readout === null || cell === '' || run === '' || direction === undefined) return;
    if (mapping.timeColumn !== undefined && cellText(mapping.timeColumn) !== '' && time === null) return;
    points.push({ reference: reference * referenceScale, readout: readout * readoutScale, cell, run, direction, time, row });
  });
  return { points, errors, errorCount };
}
