import type { Design } from '@shared/contracts/design';
import { nodeSpectrum, simulate } from '@shared/engine/simulation';
import type { ReportSpectrum } from './design-report';

/** Simulated time for the report's spectrum [s]: enough for about 20 averaged segments. */
const DURATION = 0.5;
const SEGMENT = 1 << 16;

/**
 * The output noise spectrum for the report, from a noise-only time-domain run: Welch's estimate on
 * the last analog node (before the converter, which would fold it into its own Nyquist band).
 */
export function reportSpectrum(design: Design): ReportSpectrum | null {
  const analog = design.chain.filter((stage) => stage.kind !== 'adc');
  const node = analog[analog.length - 1]?.id;
  if (!node) return null;
  const result = simulate(design, { duration: DURATION, noise: true, record: [node], envelopeColumns: 0, sensitivity: false, seed: 1 });
  const simulated = result.nodes.find((n) => n.id === node);
  if (!simulated?.waveform) return null;
  const settleFrom = Math.min(simulated.waveform.length - SEGMENT, Math.round(result.figures.settlingTime * simulated.sampleRate));
  const waveform = simulated.waveform.subarray(Math.max(0, settleFrom));
  if (waveform.length < SEGMENT) return null;
  const spectrum = nodeSpectrum(waveform, simulated.sampleRate, SEGMENT, 'density');
  if (spectrum.kind !== 'density') return null;
  const carrier = design.excitation.frequency;
  return {
    node,
    description: `Amplitude spectral density at node "${node}" from a ${DURATION} s noise-only simulation at ${result.samplesPerPeriod} samples per carrier period (Welch, Hann, ${SEGMENT}-sample segments, 50 % overlap).`,
    frequencies: spectrum.frequencies,
    asd: spectrum.asd,
    markers: [carrier, 2 * carrier, 3 * carrier, 4 * carrier],
  };
}
