// Runs in the report pool's worker thread (report-workers.ts): the report's time-domain simulation.
// Worker threads do not inherit the server's TypeScript loader, so this plain module loads the
// engine through tsx's API, with the project's tsconfig (for the @shared paths).
import { fileURLToPath } from 'node:url';
import { tsImport } from 'tsx/esm/api';

const tsconfig = fileURLToPath(new URL('../../tsconfig.json', import.meta.url));
const { reportSpectrum } = await tsImport('./report-spectrum.ts', { parentURL: import.meta.url, tsconfig });

export default function spectrum(design) {
  return reportSpectrum(design);
}
