import type { ChildProcess } from 'node:child_process';

export const projectRoot: string;
export const isRoot: boolean;
export function say(tag: string, message: string): void;
export function projectTmpDir(): string;
export function run(command: string, args: string[], options?: { env?: NodeJS.ProcessEnv }): number;
export function runOrThrow(command: string, args: string[], options?: { env?: NodeJS.ProcessEnv }): void;
export function ensureDependencies(): void;
export function ensureChromium(): void;
export function nodeScript(script: string, args?: string[], env?: NodeJS.ProcessEnv): number;
export function ng(args: string[], env?: NodeJS.ProcessEnv): number;
export function startServer(env: NodeJS.ProcessEnv, options?: { watch?: boolean }): ChildProcess;
export function waitForHealth(url: string, child: ChildProcess | null, timeoutMs?: number): Promise<unknown>;
/** A free loopback port below the ephemeral range (never taken by an outgoing connection's source port). */
export function freePort(): Promise<number>;
