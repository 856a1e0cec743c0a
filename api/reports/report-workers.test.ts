import { afterAll, describe, expect, it } from 'vitest';
import { loadDesign } from '@shared/contracts/design-loader';
import demoPressure from '@shared/examples/demo-pressure.json';
import { turnsDuring } from '../../test/support/event-loop';
import { reportSpectrum } from './report-spectrum';
import { closeReportWorkers, simulateReportSpectrum } from './report-workers';

afterAll(() => closeReportWorkers());

describe('the report spectrum in a worker thread', () => {
  it('is the same spectrum as the one computed in the process, while the main thread stays free', async () => {
    const loaded = loadDesign(demoPressure);
    if (!loaded.ok) throw new Error('the demo design does not load');
    const { value: fromWorker, turns } = await turnsDuring(() => simulateReportSpectrum(loaded.design));
    // The simulation takes half a second or more of one core; had it run here, no turn would have.
    expect(turns).toBeGreaterThan(10);

    const here = reportSpectrum(loaded.design);
    expect(fromWorker).not.toBeNull();
    expect(here).not.toBeNull();
    expect(fromWorker!.node).toBe(here!.node);
    expect(fromWorker!.description).toBe(here!.description);
    expect(Array.from(fromWorker!.frequencies)).toEqual(Array.from(here!.frequencies));
    // The same seed gives the same noise: the two estimates agree to the last bit.
    expect(Array.from(fromWorker!.asd)).toEqual(Array.from(here!.asd));
  }, 60_000);
});
