import { describe, expect, it } from 'vitest';
import { fitPolynomial } from '../fit/polynomial-fit';
import { cIdentifier, csvText, fitToCHeader, fitToCsv, fitToJson, type FitExport } from './export';

const fit = fitPolynomial([0, 1, 2, 3, 4], [1, 3.1, 8.9, 19.2, 33], { degree: 2 });
const data: FitExport = {
  design: '=HYPERLINK("x") pressure */ design',
  dataset: '6-cell batch\nrun 3',
  cells: ['A', 'B'],
  direction: 'calibration',
  xUnit: 'V',
  yUnit: 'Pa',
  fit,
  createdAt: '2026-12-01T10:00:00.000Z',
};

describe('fit export', () => {
  it('writes JSON with ascending coefficients, direction, degree, units and valid range', () => {
    const parsed = JSON.parse(fitToJson(data));
    expect(parsed).toMatchObject({ format: 'quietbridge.calibration-fit', direction: 'calibration', degree: 2, units: { x: 'V', y: 'Pa' }, validRange: { min: 0, max: 4 } });
    expect(parsed.coefficients).toEqual(fit.coefficients);
  });

  it('guards CSV text cells a spreadsheet would run as formulas (OWASP CSV injection) and keeps numbers numeric', () => {
    expect(csvText('=1+2')).toBe("'=1+2");
    expect(csvText('+cmd')).toBe("'+cmd");
    expect(csvText('-x')).toBe("'-x");
    expect(csvText('@SUM(A1)')).toBe("'@SUM(A1)");
    expect(csvText('a,"b"')).toBe('"a,""b"""');
    const lines = fitToCsv(data).trim().split('\r\n');
    expect(lines).toHaveLength(4);
    expect(lines[1].startsWith(`"'=HYPERLINK(""x"") pressure */ design"`)).toBe(true);
    const lastColumns = lines.slice(1).map((line) => line.split(',').slice(-3).map(Number));
    expect(lastColumns.map((columns) => columns[0])).toEqual([0, 1, 2]);
    expect(lastColumns.map((columns) => columns[1])).toEqual(fit.coefficients);
  });

  it('writes a C header with const arrays whose literals read back exactly, and a safe comment', () => {
    const header = fitToCHeader(data);
    const prefix = cIdentifier('6-cell batch\nrun 3_calibration');
    expect(prefix).toBe('c_6_cell_batch_run_3_calibration');
    expect(header).toContain(`static const double ${prefix}_coefficients[3] = {`);
    expect(header).toContain('#ifndef QB_C_6_CELL_BATCH_RUN_3_CALIBRATION_H');
    const literals = [...header.matchAll(/^ {2}(\S+?),? \/\* x\^\d \*\/$/gm)].map((match) => Number(match[1]));
    expect(literals).toEqual(fit.coefficients);
    const comment = header.slice(0, header.indexOf('*/') + 2);
    expect(comment).toContain('Design: =HYPERLINK("x") pressure * / design.');
    expect(comment).toContain('Dataset: 6-cell batch run 3.');
    expect(comment).toContain('2026-12-01T10:00:00.000Z');
    expect(header.indexOf('*/')).toBe(header.indexOf(' */\n#ifndef') + 1);
  });

  it('makes identifiers from any text', () => {
    expect(cIdentifier('Zelle Ä/1')).toBe('zelle_a_1');
    expect(cIdentifier('***')).toBe('calibration');
  });
});
