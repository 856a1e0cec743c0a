import { analyseDesign, type DesignAnalysis } from '../../shared/engine/analyse';
import type { CommandIo } from './command';

/** Reads, upgrades, validates and evaluates the design file; a message when the file itself is unreadable. */
export function readDesign(path: string, io: CommandIo): { analysis: DesignAnalysis } | { message: string } {
  let text: string;
  try {
    text = io.readFile(path);
  } catch {
    return { message: `Cannot read ${path}` };
  }
  let document: unknown;
  try {
    document = JSON.parse(text);
  } catch (error) {
    return { message: `${path} is not valid JSON: ${(error as Error).message}` };
  }
  return { analysis: analyseDesign(document) };
}
