import type { Command } from './command';
import { budgetCommand } from './commands/budget';
import { fitCommand } from './commands/fit';
import { psdCommand } from './commands/psd';
import { simulateCommand } from './commands/simulate';
import { sweepCommand } from './commands/sweep';
import { validateCommand } from './commands/validate';

/** The CLI's commands; a new one is a file in commands/ plus one entry here. */
export const commands: readonly Command[] = [validateCommand, budgetCommand, sweepCommand, simulateCommand, psdCommand, fitCommand];

export function findCommand(name: string): Command | undefined {
  return commands.find((c) => c.name === name);
}
