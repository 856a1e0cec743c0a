import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runCli } from './main';

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

const demo = 'shared/examples/demo-pressure.json';
const flowDemo = 'shared/examples/demo-flow.json';

describe('cli budget --json (the contract shape)', () => {
  it('prints every key of the contract with finite figures, null where a figure does not apply', () => {
    const { code, out } = run(['budget', demo, '--json']);
    expect(code).toBe(0);
    const budget = JSON.parse(out);
    expect(Object.keys(budget.sensitivity)).toEqual(expect.arrayContaining(['voltsPerFarad', 'voltsPerPascal', 'voltsPerCubicMetrePerSecond']));
    expect(budget.sensitivity.voltsPerCubicMetrePerSecond).toBeNull();
    expect(Number.isFinite(budget.sensitivity.voltsPerFarad)).toBe(true);
    expect(Number.isFinite(budget.demodulatorGain)).toBe(true);
    expect(Number.isInteger(budget.harmonicsSummed)).toBe(true);
    expect(Object.keys(budget.offset)).toEqual(expect.arrayContaining(['untrimmedVolts', 'trimmedVolts', 'idealTrim', 'trimCode']));
    expect(Object.keys(budget.noise)).toEqual(expect.arrayContaining(['outputRms', 'bandLow', 'bandHigh', 'contributions']));
    for (const c of budget.noise.contributions) expect(Object.keys(c)).toEqual(expect.arrayContaining(['stage', 'source', 'outputRms', 'share']));
    expect(Object.keys(budget.resolution)).toEqual(expect.arrayContaining(['farad', 'pascal', 'cubicMetrePerSecond']));
    expect(budget.resolution.cubicMetrePerSecond).toBeNull();
    for (const l of budget.levels) expect(Object.keys(l)).toEqual(expect.arrayContaining(['node', 'peak', 'swingLow', 'swingHigh', 'usedFraction']));
    expect(Number.isFinite(budget.ripple.outputPeak)).toBe(true);
    expect(Array.isArray(budget.findings)).toBe(true);
  });

  it('fills the flow figures in flow mode', () => {
    const budget = JSON.parse(run(['budget', flowDemo, '--json']).out);
    expect(budget.sensitivity.voltsPerCubicMetrePerSecond).toBeGreaterThan(0);
    expect(budget.resolution.cubicMetrePerSecond).toBeGreaterThan(0);
  });

  it('prints a readable table in engineering units', () => {
    const { out } = run(['budget', demo]);
    expect(out).toMatch(/sensitivity\s+[\d.]+ mV\/fF/);
    expect(out).toMatch(/resolution\s+[\d.]+ aF, [\d.]+ Pa rms in 100 mHz to/);
  });
});

describe('cli validate', () => {
  it('exits 0 on a clean design', () => {
    const { code, out } = run(['validate', demo]);
    expect(code).toBe(0);
    expect(out).toContain('valid, 0 errors');
  });

  it('exits 1 with the field paths of validation errors', () => {
    const document = JSON.parse(readFileSync(demo, 'utf8'));
    document.chain[0].feedbackCapacitance = -1;
    const { code, out } = run(['validate', 'broken.json'], { 'broken.json': JSON.stringify(document) });
    expect(code).toBe(1);
    expect(out).toBe('error chain[0].feedbackCapacitance: Feedback capacitance must be above 0 F');
  });

  it('exits 1 on an error finding', () => {
    const document = JSON.parse(readFileSync(demo, 'utf8'));
    document.chain[1].gain = 500;
    const { code, out } = run(['validate', 'clips.json'], { 'clips.json': JSON.stringify(document) });
    expect(code).toBe(1);
    expect(out).toMatch(/^error chain\[1\]\.outputSwing: /m);
  });

  it('says when a file is not JSON, and exits 2 on a usage error', () => {
    expect(run(['validate', 'x.json'], { 'x.json': '{' }).code).toBe(1);
    expect(run(['validate']).code).toBe(2);
    expect(run(['frobnicate']).code).toBe(2);
  });
});

describe('cli sweep', () => {
  it('sweeps a parameter by its path over a log range', () => {
    const { code, out } = run(['sweep', demo, '--param', 'chain[4].corner', '--from', '100', '--to', '1000', '--points', '5', '--log']);
    expect(code).toBe(0);
    expect(out.split('\n')).toHaveLength(2 + 5 + 1);
    expect(out).toContain('316.2');
  });

  it('gives every figure per point with --json', () => {
    const result = JSON.parse(run(['sweep', demo, '--param', 'excitation.amplitude', '--from', '1', '--to', '2', '--points', '2', '--json']).out);
    expect(result.points[1].budget.sensitivity.voltsPerFarad / result.points[0].budget.sensitivity.voltsPerFarad).toBeCloseTo(2, 10);
  });

  it('refuses an unknown path', () => {
    const { code, err } = run(['sweep', demo, '--param', 'chain[9].corner', '--from', '1', '--to', '2', '--points', '2']);
    expect(code).toBe(2);
    expect(err).toBe('The design has no number at chain[9].corner');
  });
});
