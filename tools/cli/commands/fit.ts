import Papa from 'papaparse';
import { FitInputError, fitPolynomial } from '../../../shared/engine/fit/polynomial-fit';
import { parseArguments } from '../arguments';
import type { Command } from '../command';
import { EXIT_FINDINGS, EXIT_OK, EXIT_USAGE } from '../command';
import { textTable } from '../table';

/** The two named columns of a CSV with a header row, as numbers; or the first problem found. */
function readColumns(text: string, xColumn: string, yColumn: string): { x: number[]; y: number[] } | string {
  const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: 'greedy', transformHeader: (name) => name.trim() });
  const fields = parsed.meta.fields ?? [];
  for (const column of [xColumn, yColumn]) {
    if (!fields.includes(column)) return `has no column "${column}" (columns: ${fields.join(', ') || 'none'})`;
  }
  const x: number[] = [];
  const y: number[] = [];
  for (let i = 0; i < parsed.data.length; i++) {
    const row = parsed.data[i];
    for (const [column, target] of [
      [xColumn, x],
      [yColumn, y],
    ] as const) {
      const cell = (row[column] ?? '').trim();
      const value = cell === '' ? Number.NaN : Number(cell);
      // Row numbers count the header as row 1, as a spreadsheet shows them.
      if (!Number.isFinite(value)) return `row ${i + 2}: ${column} is not a number ("${cell}")`;
      target.push(value);
    }
  }
  return { x, y };
}

export const fitCommand: Command = {
  name: 'fit',
  usage: 'fit <file.csv> --x COL --y COL --degree N [--through-origin] [--json]',
  summary: 'Least-squares polynomial y = b0 + b1 x + ... of degree 1-5 on two CSV columns: coefficients, standard errors, residual SD, R^2',
  run(args, io) {
    const { positional, options } = parseArguments(args, ['json', 'through-origin']);
    const usage = (message: string) => {
      io.err(message);
      io.err(`usage: ${this.usage}`);
      return EXIT_USAGE;
    };
    const [file] = positional;
    const xColumn = options.get('x');
    const yColumn = options.get('y');
    const degree = Number(options.get('degree'));
    if (file === undefined) return usage('fit needs a CSV file');
    if (typeof xColumn !== 'string' || typeof yColumn !== 'string') return usage('--x and --y need column names');
    if (!Number.isInteger(degree) || degree < 1 || degree > 5) return usage('--degree needs a whole number from 1 to 5');
    let text: string;
    try {
      text = io.readFile(file);
    } catch {
      io.err(`Cannot read ${file}`);
      return EXIT_FINDINGS;
    }
    const columns = readColumns(text, xColumn, yColumn);
    if (typeof columns === 'string') {
      io.err(`${file} ${columns}`);
      return EXIT_FINDINGS;
    }
    let fit;
    try {
      fit = fitPolynomial(columns.x, columns.y, { degree, throughOrigin: options.has('through-origin') });
    } catch (error) {
      if (!(error instanceof FitInputError)) throw error;
      io.err(`${file}: ${error.message}`);
      return EXIT_FINDINGS;
    }
    const { coefficients, standardErrors, residualSd, r2 } = fit;
    if (options.has('json')) {
      io.out(JSON.stringify({ coefficients, standardErrors, residualSd, r2 }));
      return EXIT_OK;
    }
    const plain = (value: number) => value.toPrecision(15);
    io.out(textTable(['power', 'coefficient', 'standard error'], coefficients.map((c, k) => [String(k), plain(c), plain(standardErrors[k])])));
    io.out(`residual SD ${plain(residualSd)} (${fit.degreesOfFreedom} degrees of freedom); R^2 ${r2 === null ? 'undefined' : plain(r2)}${fit.throughOrigin ? ' (uncentred)' : ''}`);
    io.out(`valid for ${xColumn} from ${fit.xMin} to ${fit.xMax}`);
    return EXIT_OK;
  },
};
