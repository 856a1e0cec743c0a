import type { Command } from '../command';
import { EXIT_FINDINGS, EXIT_OK, EXIT_USAGE } from '../command';
import { parseArguments } from '../arguments';
import { readDesign } from '../read-design';
import { textTable } from '../table';
import { sweepBudget } from '../../../shared/engine/sweep/sweep';

const plain = (value: number | null) => (value === null ? '-' : String(Number(value.toPrecision(4))));

export const sweepCommand: Command = {
  name: 'sweep',
  usage: 'sweep <design.json> --param <path> --from A --to B --points N [--log] [--json]',
  summary: 'The budget over one parameter (SI values), every figure per point',
  run(args, io) {
    const { positional, options } = parseArguments(args, ['json', 'log']);
    const numberOption = (name: string) => {
      const raw = options.get(name);
      return typeof raw === 'string' && raw.trim() !== '' ? Number(raw) : Number.NaN;
    };
    const path = options.get('param');
    const from = numberOption('from');
    const to = numberOption('to');
    const points = numberOption('points');
    if (positional.length !== 1 || typeof path !== 'string' || [from, to, points].some(Number.isNaN)) {
      io.err(`usage: ${this.usage}`);
      return EXIT_USAGE;
    }
    const read = readDesign(positional[0], io);
    if ('message' in read) {
      io.err(read.message);
      return EXIT_FINDINGS;
    }
    if (!read.analysis.ok) {
      for (const error of read.analysis.errors) io.err(`error ${error.path === '' ? '(document)' : error.path}: ${error.message}`);
      return EXIT_FINDINGS;
    }
    const result = sweepBudget(read.analysis.design, { path, from, to, points, scale: options.has('log') ? 'log' : 'linear' });
    if (!result.ok) {
      io.err(result.message);
      return EXIT_USAGE;
    }
    if (options.has('json')) {
      io.out(JSON.stringify(result, null, 2));
      return EXIT_OK;
    }
    const rows = result.points.map((p) =>
      p.budget === null
        ? [plain(p.value), `invalid: ${p.errors.map((e) => `${e.path}: ${e.message}`).join('; ')}`]
        : [
            plain(p.value),
            plain(p.budget.sensitivity.voltsPerFarad),
            plain(p.budget.noise.outputRms),
            plain(p.budget.resolution.farad),
            plain(p.budget.resolution.pascal),
            plain(p.budget.resolution.cubicMetrePerSecond),
            p.budget.closestToClipping === null ? '-' : `${p.budget.closestToClipping} ${plain(p.budget.levels.find((l) => l.node === p.budget?.closestToClipping)?.usedFraction ?? null)}`,
            plain(p.budget.ripple.outputPeak),
            String(p.budget.findings.filter((f) => f.severity === 'error').length),
          ],
    );
    io.out(`sweep of ${path} (SI units; figures in V, F, Pa, m^3/s)`);
    io.out(textTable([path, 'V/F', 'noise V rms', 'res. F', 'res. Pa', 'res. m^3/s', 'tightest node, used', 'ripple V', 'errors'], rows));
    return EXIT_OK;
  },
};
