import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { fitPolynomial, type PolynomialFit } from './polynomial-fit';

interface Certified {
  degree: number;
  intercept: boolean;
  beta: string[];
  sd: string[];
  resid_sd: string;
  r2: string;
}

const fixtures = new URL('../../../test/fixtures/nist/', import.meta.url);

function load(name: string): { x: number[]; y: number[]; certified: Certified } {
  const lines = readFileSync(new URL(`${name}.csv`, fixtures), 'utf8').trim().split(/\r?\n/).slice(1);
  const x = lines.map((line) => Number(line.split(',')[0]));
  const y = lines.map((line) => Number(line.split(',')[1]));
  const certified = JSON.parse(readFileSync(new URL(`${name}_certified.json`, fixtures), 'utf8')) as Certified;
  return { x, y, certified };
}

/**
 * Relative error against a certified value; a certified 0 (the exact fits Wampler1 and Wampler2)
 * is compared against `scale`, the size of the quantity it stands beside.
 */
function relativeError(computed: number, certified: number, scale: number): number {
  return certified === 0 ? Math.abs(computed) / scale : Math.abs(computed - certified) / Math.abs(certified);
}

interface Worst {
  coefficients: number;
  standardErrors: number;
  residualSd: number;
  r2: number;
}

function compare(fit: PolynomialFit, certified: Certified, y: number[]): Worst {
  const beta = certified.beta.map(Number);
  const sd = certified.sd.map(Number);
  // Through the origin the fit reports the absent constant as 0; NIST lists only B1.
  const offset = certified.intercept ? 0 : 1;
  const yScale = Math.sqrt(y.reduce((sum, value) => sum + value * value, 0) / y.length);
  const worst: Worst = { coefficients: 0, standardErrors: 0, residualSd: 0, r2: 0 };
  beta.forEach((value, k) => {
    worst.coefficients = Math.max(worst.coefficients, relativeError(fit.coefficients[k + offset], value, 1));
    worst.standardErrors = Math.max(worst.standardErrors, relativeError(fit.standardErrors[k + offset], sd[k], Math.abs(value)));
  });
  worst.residualSd = relativeError(fit.residualSd, Number(certified.resid_sd), yScale);
  worst.r2 = relativeError(fit.r2 ?? Number.NaN, Number(certified.r2), 1);
  return worst;
}

// Each dataset: NIST StRD, Linear Least Squares, <name>; certified values to 1e-8 relative.
const datasets = ['pontius', 'wampler1', 'wampler2', 'wampler3', 'wampler4', 'wampler5', 'norris', 'noint1', 'noint2', 'filip'];

describe('polynomial fit against the NIST StRD certified values', () => {
  for (const name of datasets) {
    it(`reproduces NIST StRD, Linear Least Squares, ${name} to 1e-8 relative`, () => {
      const { x, y, certified } = load(name);
      const fit = fitPolynomial(x, y, { degree: certified.degree, throughOrigin: !certified.intercept });
      const worst = compare(fit, certified, y);
      expect(worst.coefficients).toBeLessThan(1e-8);
      expect(worst.standardErrors).toBeLessThan(1e-8);
      expect(worst.residualSd).toBeLessThan(1e-8);
      expect(worst.r2).toBeLessThan(1e-8);
    });
  }
});
