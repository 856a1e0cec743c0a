/**
 * Benchmark of the analytic budget (not a timed test): median time of one evaluation of each demo
 * design and of a 1,000-point sweep, in Node. Targets: under 1 ms and under 1 s.
 * Run: node --import tsx tools/bench/budget.ts
 */
import { readFileSync } from 'node:fs';
import { validateDesign, type Design } from '../../shared/contracts/design';
import { evaluateBudget } from '../../shared/engine/budget/evaluate';
import { sweepBudget } from '../../shared/engine/sweep/sweep';

const EVALUATIONS = 2000;
const SWEEPS = 7;

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)];
}

function load(name: string): Design {
  const result = validateDesign(JSON.parse(readFileSync(new URL(`../../shared/examples/${name}`, import.meta.url), 'utf8')));
  if (!result.ok) throw new Error(`${name} is invalid: ${JSON.stringify(result.errors)}`);
  return result.design;
}

for (const name of ['demo-pressure.json', 'demo-flow.json']) {
  const design = load(name);
  for (let i = 0; i < 200; i++) evaluateBudget(design);
  const times: number[] = [];
  for (let i = 0; i < EVALUATIONS; i++) {
    const start = performance.now();
    evaluateBudget(design);
    times.push(performance.now() - start);
  }
  const one = median(times);
  console.log(`${name}: one budget evaluation, median ${one.toFixed(3)} ms over ${EVALUATIONS} (target < 1 ms) ${one < 1 ? 'ok' : 'MISSED'}`);

  const sweeps: number[] = [];
  for (let i = 0; i < SWEEPS; i++) {
    const start = performance.now();
    const result = sweepBudget(design, { path: 'chain[4].corner', from: 50, to: 5000, points: 1000, scale: 'log' });
    sweeps.push(performance.now() - start);
    if (!result.ok) throw new Error(result.message);
  }
  const sweep = median(sweeps);
  console.log(`${name}: 1000-point sweep of chain[4].corner, median ${sweep.toFixed(1)} ms over ${SWEEPS} (target < 1000 ms) ${sweep < 1000 ? 'ok' : 'MISSED'}`);
}
