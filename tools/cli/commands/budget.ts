import type { Command } from '../command';
import { EXIT_FINDINGS, EXIT_OK, EXIT_USAGE } from '../command';
import { parseArguments } from '../arguments';
import { budgetReport } from '../budget-report';
import { readDesign } from '../read-design';

export const budgetCommand: Command = {
  name: 'budget',
  usage: 'budget <design.json> [--json]',
  summary: 'The analytic budget: sensitivity, offset and trim, noise, resolution, levels, ripple, findings',
  run(args, io) {
    const { positional, options } = parseArguments(args, ['json']);
    if (positional.length !== 1) {
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
    io.out(options.has('json') ? JSON.stringify(read.analysis.budget, null, 2) : budgetReport(read.analysis.budget));
    return EXIT_OK;
  },
};
