// Writes the demo calibration batch (tools/seed/demo-calibration.ts) to
// test/fixtures/calibration/demo-batch.csv for the end-to-end test:
// `node --import tsx tools/generate-demo-batch.ts`.
import { mkdirSync, writeFileSync } from 'node:fs';
import { demoBatchCsv } from './seed/demo-calibration';

const folder = new URL('../test/fixtures/calibration/', import.meta.url);
mkdirSync(folder, { recursive: true });
writeFileSync(new URL('demo-batch.csv', folder), demoBatchCsv());
process.stdout.write('wrote test/fixtures/calibration/demo-batch.csv\n');
