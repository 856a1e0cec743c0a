/** What a command may touch: its output streams and the files it is pointed at. */
export interface CommandIo {
  out(text: string): void;
  err(text: string): void;
  readFile(path: string): string;
}

/** One CLI command; `run` returns the process exit code. */
export interface Command {
  readonly name: string;
  readonly usage: string;
  readonly summary: string;
  run(args: readonly string[], io: CommandIo): number;
}

/** Exit codes shared by every command. */
export const EXIT_OK = 0;
export const EXIT_FINDINGS = 1;
export const EXIT_USAGE = 2;
