/** Positional arguments and --flags (--name value, or a bare --switch). */
export interface ParsedArguments {
  positional: string[];
  options: Map<string, string | true>;
}

export function parseArguments(args: readonly string[], switches: readonly string[]): ParsedArguments {
  const positional: string[] = [];
  const options = new Map<string, string | true>();
  for (let i = 0; i < args.length; i++) {
    const arg = args[i];
    if (!arg.startsWith('--')) {
      positional.push(arg);
      continue;
    }
    const [name, inline] = arg.slice(2).split('=', 2);
    if (switches.includes(name)) options.set(name, true);
    else if (inline !== undefined) options.set(name, inline);
    else if (i + 1 < args.length) options.set(name, args[++i]);
    else options.set(name, true);
  }
  return { positional, options };
}
