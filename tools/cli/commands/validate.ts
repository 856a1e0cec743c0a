import type { Command } from '../command';
import { EXIT_FINDINGS, EXIT_OK, EXIT_USAGE } from '../command';
import { readDesign } from '../read-design';

export const validateCommand: Command = {
  name: 'validate',
  usage: 'validate <design.json>',
  summary: 'List validation errors and findings; exit 1 on any error',
  run(args, io) {
    if (args.length !== 1) {
      io.err(`usage: ${this.usage}`);
      return EXIT_USAGE;
    }
    const read = readDesign(args[0], io);
    if ('message' in read) {
      io.err(read.message);
      return EXIT_FINDINGS;
    }
    const { analysis } = read;
    if (analysis.upgradedFrom !== null) io.out(`note: read as format version ${analysis.upgradedFrom} and upgraded`);
    if (!analysis.ok) {
      for (const error of analysis.errors) io.out(`error ${error.path === '' ? '(document)' : error.path}: ${error.message}`);
      return EXIT_FINDINGS;
    }
    const findings = analysis.budget.findings;
    for (const f of findings) io.out(`${f.severity} ${f.path}: ${f.message}${f.suggestion === null ? '' : ` (${f.suggestion})`}`);
    const errors = findings.filter((f) => f.severity === 'error').length;
    io.out(`${args[0]}: valid, ${errors} error${errors === 1 ? "" : "s"}, ${findings.length - errors} other finding${findings.length - errors === 1 ? '' : 's'}`);
    return errors > 0 ? EXIT_FINDINGS : EXIT_OK;
  },
};
