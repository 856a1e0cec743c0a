import type { SimulatedNode } from '@shared/engine/simulation/result';
import type { LineSeries } from '../../charts/chart-types';

/** Waveforms up to this many samples are drawn sample by sample; longer ones from their envelope. */
export const FULL_WAVEFORM_SAMPLES = 50_000;

/**
 * A node's waveform against time [s] for the line chart: every sample when it was kept and is short
 * enough, else the min/max envelope as a band around the column midpoints. `scale` converts the
 * node's unit for display (1e3 for m^3/s to L/s).
 */
export function waveformSeries(node: SimulatedNode, scale = 1): LineSeries | null {
  if (node.waveform !== null && node.waveform.length <= FULL_WAVEFORM_SAMPLES) {
    const samples = node.waveform;
    const x = new Float64Array(samples.length);
    const y = new Float64Array(samples.length);
    for (let n = 0; n < samples.length; n++) {
      x[n] = n / node.sampleRate;
      y[n] = samples[n] * scale;
    }
    return { name: node.id, x, y };
  }
  if (node.envelope === null) return null;
  const { min, max, samplesPerColumn } = node.envelope;
  const columns = min.length;
  const x = new Float64Array(columns);
  const y = new Float64Array(columns);
  const yLow = new Float64Array(columns);
  const yHigh = new Float64Array(columns);
  const columnTime = samplesPerColumn / node.sampleRate;
  for (let i = 0; i < columns; i++) {
    x[i] = (i + 0.5) * columnTime;
    yLow[i] = min[i] * scale;
    yHigh[i] = max[i] * scale;
    y[i] = ((min[i] + max[i]) / 2) * scale;
  }
  return { name: node.id, x, y, yLow, yHigh };
}
