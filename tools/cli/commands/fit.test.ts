import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runCli } from '../main';

function run(args: string[], files: Record<string, string> = {}) {
  const out: string[] = [];
  const err: string[] = [];
  const code = runCli(args, {
    out: (t) => out.push(t),
    err: (t) => err.push(t),
    readFile: (path) => (path in files ? files[path] : readFileSync(path, 'utf8')),
  });
  return { code, out: out.join('\n'), err: err.join('\n') };
}

const certified = (name: string) => JSON.parse(readFileSync(`test/fixtures/nist/${name}_certified.json`, 'utf8'));

describe('cli fit', () => {
  it('prints the contract keys and NIST StRD, Linear Least Squares, Pontius to 1e-8 relative', () => {
    const { code, out } = run(['fit', 'test/fixtures/nist/pontius.csv', '--x', 'x', '--y', 'y', '--degree', '2', '--json']);
    expect(code).toBe(0);
    const result = JSON.parse(out);
    expect(Object.keys(result)).toEqual(['coefficients', 'standardErrors', 'residualSd', 'r2']);
    const reference = certified('pontius');
    reference.beta.forEach((value: string, k: number) => expect(Math.abs(result.coefficients[k] / Number(value) - 1)).toBeLessThan(1e-8));
    reference.sd.forEach((value: string, k: number) => expect(Math.abs(result.standardErrors[k] / Number(value) - 1)).toBeLessThan(1e-8));
    expect(Math.abs(result.residualSd / Number(reference.resid_sd) - 1)).toBeLessThan(1e-8);
    expect(Math.abs(result.r2 / Number(reference.r2) - 1)).toBeLessThan(1e-8);
  });

  it('fits through the origin with the uncentred R^2 (NIST StRD, Linear Least Squares, NoInt1)', () => {
    const result = JSON.parse(run(['fit', 'test/fixtures/nist/noint1.csv', '--x', 'x', '--y', 'y', '--degree', '1', '--through-origin', '--json']).out);
    const reference = certified('noint1');
    expect(result.coefficients[0]).toBe(0);
    expect(Math.abs(result.coefficients[1] / Number(reference.beta[0]) - 1)).toBeLessThan(1e-8);
    expect(Math.abs(result.r2 / Number(reference.r2) - 1)).toBeLessThan(1e-8);
  });

  it('prints a readable table without --json', () => {
    const { code, out } = run(['fit', 'test/fixtures/nist/norris.csv', '--x', 'x', '--y', 'y', '--degree', '1']);
    expect(code).toBe(0);
    expect(out).toMatch(/power\s+coefficient\s+standard error/);
    expect(out).toMatch(/residual SD .* \(34 degrees of freedom\); R\^2 0\.99999/);
  });

  it('names the missing column, the bad row and the usage error', () => {
    const files = { 'bench.csv': 'p,v\n0,0.1\n10,abc\n20,0.3\n' };
    expect(run(['fit', 'bench.csv', '--x', 'p', '--y', 'u', '--degree', '1'], files).err).toContain('has no column "u" (columns: p, v)');
    expect(run(['fit', 'bench.csv', '--x', 'p', '--y', 'v', '--degree', '1'], files).err).toContain('row 3: v is not a number ("abc")');
    const usage = run(['fit', 'bench.csv', '--x', 'p', '--y', 'v', '--degree', '7'], files);
    expect(usage.code).toBe(2);
    expect(usage.err).toContain('--degree needs a whole number from 1 to 5');
    expect(run(['fit', 'bench.csv', '--x', 'p', '--y', 'v', '--degree', '3'], { 'bench.csv': 'p,v\n0,1\n1,2\n2,3\n' }).err).toContain('needs at least 5 points, got 3');
  });
});
