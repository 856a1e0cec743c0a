import { readFileSync } from 'node:fs';
import { EXIT_USAGE, type CommandIo } from './command';
import { commands, findCommand } from './registry';

/** Runs one CLI command in-process; the entry point below and the tests share it. */
export function runCli(args: readonly string[], io: CommandIo): number {
  const [name, ...rest] = args;
  const command = name === undefined ? undefined : findCommand(name);
  if (command === undefined) {
    io.err(name === undefined || name === 'help' || name === '--help' ? 'Quietbridge command line' : `unknown command "${name}"`);
    for (const c of commands) io.err(`  npm run cli -- ${c.usage}\n      ${c.summary}`);
    return name === 'help' || name === '--help' ? 0 : EXIT_USAGE;
  }
  return command.run(rest, io);
}

const isEntry = process.argv[1] !== undefined && import.meta.url === new URL(`file://${process.argv[1]}`).href;
if (isEntry) {
  process.exitCode = runCli(process.argv.slice(2), {
    out: (text) => process.stdout.write(`${text}\n`),
    err: (text) => process.stderr.write(`${text}\n`),
    readFile: (path) => readFileSync(path, 'utf8'),
  });
}
