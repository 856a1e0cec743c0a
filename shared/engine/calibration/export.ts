/**
 * A chosen fit as a file: JSON, CSV (one row per coefficient, the metadata repeated so each row
 * stands alone) and a C header a firmware engineer can include. Pure: the caller passes the date.
 */
import type { PolynomialFit } from '../fit/polynomial-fit';
import type { FitDirection } from './points';

export interface FitExport {
  readonly design: string;
  readonly dataset: string;
  /** The cells whose points the fit was made on. */
  readonly cells: string[];
  readonly direction: FitDirection;
  /** Units of the independent (x) and dependent (y) values, as the coefficients use them. */
  readonly xUnit: string;
  readonly yUnit: string;
  readonly fit: PolynomialFit;
  /** ISO 8601 time the export was made. */
  readonly createdAt: string;
}

const directionWords: Record<FitDirection, string> = {
  characteristic: 'characteristic: readout = f(reference)',
  calibration: 'calibration curve: reference = g(readout)',
};

/** The export as a JSON document (format "quietbridge.calibration-fit", version 1). */
export function fitToJson(data: FitExport): string {
  const { fit } = data;
  return `${JSON.stringify(
    {
      format: 'quietbridge.calibration-fit',
      version: 1,
      design: data.design,
      dataset: data.dataset,
      cells: data.cells,
      direction: data.direction,
      degree: fit.degree,
      throughOrigin: fit.throughOrigin,
      coefficients: fit.coefficients,
      standardErrors: fit.standardErrors,
      residualSd: fit.residualSd,
      r2: fit.r2,
      units: { x: data.xUnit, y: data.yUnit },
      validRange: { min: fit.xMin, max: fit.xMax },
      createdAt: data.createdAt,
    },
    null,
    2,
  )}\n`;
}

/**
 * A text cell that a spreadsheet would run as a formula (= + - @, tab, carriage return first) gets a
 * leading apostrophe (OWASP, CSV injection); numbers are written as numbers.
 */
export function csvText(value: string): string {
  const guarded = /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(guarded) ? `"${guarded.replaceAll('"', '""')}"` : guarded;
}

export function fitToCsv(data: FitExport): string {
  const { fit } = data;
  const header = 'design,dataset,cells,direction,degree,through_origin,x_unit,y_unit,valid_min,valid_max,power,coefficient,standard_error';
  const rows = fit.coefficients.map((coefficient, power) =>
    [
      csvText(data.design),
      csvText(data.dataset),
      csvText(data.cells.join(' ')),
      data.direction,
      fit.degree,
      fit.throughOrigin,
      csvText(data.xUnit),
      csvText(data.yUnit),
      fit.xMin,
      fit.xMax,
      power,
      coefficient,
      fit.standardErrors[power],
    ].join(','),
  );
  return `${[header, ...rows].join('\r\n')}\r\n`;
}

/** A C identifier from free text: letters, digits and underscores, not starting with a digit. */
export function cIdentifier(text: string): string {
  const cleaned = text
    .normalize('NFKD')
    .replace(/[^A-Za-z0-9]+/g, '_')
    .replace(/^_+|_+$/g, '')
    .toLowerCase();
  const name = cleaned === '' ? 'calibration' : cleaned;
  return /^[0-9]/.test(name) ? `c_${name}` : name;
}

/** Text safe inside a C block comment: one line, no comment terminator. */
function commentText(text: string): string {
  return text.replace(/[\r\n]+/g, ' ').replaceAll('*/', '* /');
}

/** A double literal that reads back to the same value. */
function cDouble(value: number): string {
  const text = value.toPrecision(17);
  return /[.e]/.test(text) ? text : `${text}.0`;
}

export function fitToCHeader(data: FitExport): string {
  const { fit } = data;
  const prefix = cIdentifier(`${data.dataset}_${data.direction}`);
  const guard = `QB_${prefix.toUpperCase()}_H`;
  const variable = data.direction === 'characteristic' ? 'reference' : 'readout';
  return [
    '/*',
    ` * ${commentText(directionWords[data.direction])}, degree ${fit.degree}${fit.throughOrigin ? ', through the origin' : ''}.`,
    ` * y = c[0] + c[1] x + ... + c[${fit.degree}] x^${fit.degree}, x the ${variable} in ${commentText(data.xUnit)}, y in ${commentText(data.yUnit)}.`,
    ` * Valid for x from ${cDouble(fit.xMin)} to ${cDouble(fit.xMax)} ${commentText(data.xUnit)}.`,
    ` * Residual standard deviation ${cDouble(fit.residualSd)} ${commentText(data.yUnit)}; R^2 ${fit.r2 === null ? 'undefined' : cDouble(fit.r2)}.`,
    ` * Design: ${commentText(data.design)}. Dataset: ${commentText(data.dataset)}. Cells: ${commentText(data.cells.join(', '))}.`,
    ` * Exported by Quietbridge on ${commentText(data.createdAt)}.`,
    ' * Figures are engineering estimates to be verified on hardware.',
    ' */',
    `#ifndef ${guard}`,
    `#define ${guard}`,
    '',
    `#define ${prefix.toUpperCase()}_DEGREE ${fit.degree}`,
    '',
    `static const double ${prefix}_coefficients[${fit.degree + 1}] = {`,
    ...fit.coefficients.map((coefficient, power) => `  ${cDouble(coefficient)}${power < fit.degree ? ',' : ''} /* x^${power} */`),
    '};',
    `static const double ${prefix}_x_min = ${cDouble(fit.xMin)};`,
    `static const double ${prefix}_x_max = ${cDouble(fit.xMax)};`,
    '',
    '/* Horner evaluation of the curve at x. */',
    `static inline double ${prefix}_evaluate(double x)`,
    '{',
    `  double y = ${prefix}_coefficients[${fit.degree}];`,
    `  for (int k = ${fit.degree - 1}; k >= 0; k--) y = y * x + ${prefix}_coefficients[k];`,
    '  return y;',
    '}',
    '',
    `#endif /* ${guard} */`,
    '',
  ].join('\n');
}
