import type { NoiseSource, PreparedStage } from '../stages/stage';
import { integrateSegment, logFrequencyGrid } from './frequency-grid';
import { SERIES_TOLERANCE } from './carrier-harmonics';

/** Most odd harmonics summed in the noise folding. */
export const MAX_FOLDED_HARMONICS = 400;
/** Below this fraction of k f0, S(k f0 - f) + S(k f0 + f) is taken as 2 S(k f0): the error is second order in f / (k f0). */
const SYMMETRIC_FRACTION = 1e-3;

/** A source carried to the output; `stageIndex` is its stage in the pre or post list, -1 for the demodulator output itself. */
export interface PlacedSource {
  stage: string;
  source: NoiseSource;
  domain: 'carrier' | 'baseband';
  stageIndex: number;
}

export interface NoiseIntegration {
  /** Output noise power of each source over the band [V^2]. */
  power: Float64Array;
  /** Total output noise power below and above half the ADC sample rate [V^2] (all below without an ADC). */
  belowSplit: number;
  aboveSplit: number;
  harmonicsSummed: number;
  /** integral of |H_bb(f) / H_bb(0)|^2 df over the band [Hz]. */
  basebandEnbw: number;
}

/**
 * Integrates every source's density at the output over [low, high]. Carrier-side sources go
 * through the rest of the pre-demodulator chain and fold through the demodulator:
 * S_bb(f) = sum over odd k of (2 / (pi k))^2 [S_pre(|k f0 - f|) + S_pre(k f0 + f)] (Enz and Temes 1996);
 * baseband sources go through the stages after them only.
 */
export function integrateNoise(
  pre: readonly PreparedStage[],
  post: readonly PreparedStage[],
  sources: readonly PlacedSource[],
  carrier: number,
  low: number,
  high: number,
  split: number | null,
): NoiseIntegration {
  const grid = logFrequencyGrid(low, high, split);
  const nPre = pre.length;
  const nPost = post.length;
  const preSuffix = new Float64Array(nPre + 1);
  const postSuffix = new Float64Array(nPost + 1);
  const preGain2 = Float64Array.from(pre, (s) => s.flatGain * s.flatGain);
  const postGain2 = Float64Array.from(post, (s) => s.flatGain * s.flatGain);
  const carrierSources = sources.filter((s) => s.domain === 'carrier' && s.source.density !== undefined);
  const carrierIndex = carrierSources.map((s) => sources.indexOf(s));
  const basebandSources = sources.map((s, i) => ({ s, i })).filter(({ s }) => s.domain === 'baseband' && s.source.density !== undefined);
  const power = new Float64Array(sources.length);
  const nCarrier = carrierSources.length;

  // Density of each carrier source at the demodulator input, frequency g.
  const carrierDensities = (g: number, out: Float64Array, offset: number) => {
    preSuffix[nPre] = 1;
    for (let j = nPre - 1; j >= 0; j--) preSuffix[j] = preSuffix[j + 1] * pre[j].responsePower(g) * preGain2[j];
    for (let c = 0; c < nCarrier; c++) {
      const placed = carrierSources[c];
      out[offset + c] = (placed.source.density as (f: number) => number)(g) * preSuffix[placed.stageIndex + 1];
    }
  };

  // Harmonics to sum: until the estimated tail of the folded white level is negligible.
  const atHarmonic = new Float64Array(MAX_FOLDED_HARMONICS * nCarrier);
  let harmonics = 0;
  let folded = 0;
  let previousTerm = 0;
  for (let h = 0; h < MAX_FOLDED_HARMONICS; h++) {
    const k = 2 * h + 1;
    carrierDensities(k * carrier, atHarmonic, h * nCarrier);
    let term = 0;
    for (let c = 0; c < nCarrier; c++) term += atHarmonic[h * nCarrier + c];
    term *= 8 / (Math.PI * Math.PI * k * k);
    folded += term;
    harmonics = h + 1;
    if (h >= 2) {
      // Local power law term ~ k^-a: the rest sums to about term * k / (2 (a - 1)).
      const decay = previousTerm > 0 && term > 0 ? Math.log(previousTerm / term) / Math.log(k / (k - 2)) : term === 0 ? Infinity : 0;
      const tail = decay > 1.2 ? (term * k) / (2 * (decay - 1)) : Infinity;
      if (term === 0 || tail < SERIES_TOLERANCE * folded) break;
    }
    previousTerm = term;
  }

  const scratch = new Float64Array(nCarrier);
  const foldedAt = new Float64Array(nCarrier);
  const nSources = sources.length;
  // S(f) * f of every source at every grid point, and |H_bb / H_bb(0)|^2 * f in the last column.
  const columns = nSources + 1;
  const values = new Float64Array(grid.frequency.length * columns);
  const dcBaseband = basebandPower(post, postGain2, 0);
  for (let i = 0; i < grid.frequency.length; i++) {
    const f = grid.frequency[i];
    const row = i * columns;
    postSuffix[nPost] = 1;
    for (let j = nPost - 1; j >= 0; j--) postSuffix[j] = postSuffix[j + 1] * post[j].responsePower(f) * postGain2[j];
    const baseband = postSuffix[0];
    if (nCarrier > 0 && baseband > 0) {
      foldedAt.fill(0);
      for (let h = 0; h < harmonics; h++) {
        const k = 2 * h + 1;
        const weight = 4 / (Math.PI * Math.PI * k * k);
        if (f < SYMMETRIC_FRACTION * k * carrier) {
          for (let c = 0; c < nCarrier; c++) foldedAt[c] += 2 * weight * atHarmonic[h * nCarrier + c];
          continue;
        }
        carrierDensities(Math.abs(k * carrier - f), scratch, 0);
        for (let c = 0; c < nCarrier; c++) foldedAt[c] += weight * scratch[c];
        carrierDensities(k * carrier + f, scratch, 0);
        for (let c = 0; c < nCarrier; c++) foldedAt[c] += weight * scratch[c];
      }
      for (let c = 0; c < nCarrier; c++) values[row + carrierIndex[c]] = foldedAt[c] * baseband * f;
    }
    for (const { s, i: index } of basebandSources) {
      values[row + index] = (s.source.density as (f: number) => number)(f) * postSuffix[s.stageIndex + 1] * f;
    }
    values[row + nSources] = dcBaseband > 0 ? (baseband / dcBaseband) * f : 0;
  }
  let belowSplit = 0;
  let aboveSplit = 0;
  let enbw = 0;
  grid.segments.forEach((segment, index) => {
    for (let s = 0; s < nSources; s++) {
      const p = integrateSegment(segment, values, columns, s);
      power[s] += p;
      if (index < grid.firstAboveSplit) belowSplit += p;
      else aboveSplit += p;
    }
    enbw += integrateSegment(segment, values, columns, nSources);
  });
  sources.forEach((placed, index) => {
    if (placed.source.bandPower === undefined) return;
    const p = placed.source.bandPower(low, high);
    power[index] += p;
    belowSplit += p;
  });
  return { power, belowSplit, aboveSplit, harmonicsSummed: harmonics, basebandEnbw: enbw };
}

function basebandPower(post: readonly PreparedStage[], gain2: Float64Array, f: number): number {
  let product = 1;
  for (let j = 0; j < post.length; j++) product *= post[j].responsePower(f) * gain2[j];
  return product;
}
