/**
 * Digital low-pass and high-pass design as second-order sections, by the bilinear transform with
 * the corner pre-warped, so that the digital filter has exactly the analog prototype's response
 * (-3 dB) at the corner. The layout follows scipy.signal's sos: one row of six coefficients
 * b0 b1 b2 a0 a1 a2 per section, a0 = 1, the overall gain in the first row's numerator, and the
 * sections paired and ordered as scipy.signal.zpk2sos does (pairing 'nearest': the poles closest
 * to the unit circle in the last section).
 */
import { type Complex, type FilterResponse, lowPassPrototypePoles } from './prototype';

export type { FilterResponse } from './prototype';

/** Coefficients per second-order section (b0 b1 b2 a0 a1 a2). */
export const SOS_ROW = 6;

export type FilterBand = 'lowPass' | 'highPass';

/**
 * Second-order sections of a digital Butterworth, Bessel (magnitude-normalised) or critically
 * damped filter.
 * @param band 'lowPass' or 'highPass'.
 * @param response prototype family.
 * @param order 1..4.
 * @param corner -3 dB frequency [Hz], 0 < corner < sampleRate / 2.
 * @param sampleRate sample rate [Hz].
 * @returns Float64Array of ceil(order / 2) rows of six coefficients (dimensionless).
 */
export function designSos(
  band: FilterBand,
  response: FilterResponse,
  order: number,
  corner: number,
  sampleRate: number,
): Float64Array {
  if (!(sampleRate > 0) || !Number.isFinite(sampleRate)) {
    throw new RangeError(`Sample rate must be a finite frequency above 0 Hz, got ${sampleRate}`);
  }
  if (!(corner > 0) || !(corner < sampleRate / 2)) {
    throw new RangeError(`Corner frequency must lie between 0 Hz and half the sample rate (${sampleRate / 2} Hz), got ${corner}`);
  }
  const prototype = lowPassPrototypePoles(response, order);
  const twiceRate = 2 * sampleRate;
  const warped = twiceRate * Math.tan((Math.PI * corner) / sampleRate);

  // Analog poles and gain (scipy lp2lp_zpk / lp2hp_zpk); zeros are all at 0 (high-pass) or at infinity.
  const analogPoles = prototype.map((p) => (band === 'lowPass' ? scale(p, warped) : divideReal(warped, p)));
  const prototypeGain = prototype.reduce((product, p) => multiply(product, negate(p)), one()).re;
  const analogGain = band === 'lowPass' ? prototypeGain * Math.pow(warped, order) : 1;

  // Bilinear transform (scipy bilinear_zpk): z = (2 fs + s) / (2 fs - s).
  const poles = analogPoles.map((p) => bilinear(p, twiceRate));
  const zeroValue = band === 'lowPass' ? -1 : 1;
  let numerator = one();
  let denominator = one();
  for (const p of analogPoles) denominator = multiply(denominator, { re: twiceRate - p.re, im: -p.im });
  if (band === 'highPass') for (let i = 0; i < order; i++) numerator = multiply(numerator, { re: twiceRate, im: 0 });
  const gain = analogGain * divide(numerator, denominator).re;

  return pairSections(
    poles,
    Array.from({ length: order }, () => zeroValue),
    gain,
  );
}

/** Low-pass second-order sections; see {@link designSos}. corner and sampleRate in Hz. */
export function lowPassSos(response: FilterResponse, order: number, corner: number, sampleRate: number): Float64Array {
  return designSos('lowPass', response, order, corner, sampleRate);
}

/** High-pass second-order sections; see {@link designSos}. corner and sampleRate in Hz. */
export function highPassSos(response: FilterResponse, order: number, corner: number, sampleRate: number): Float64Array {
  return designSos('highPass', response, order, corner, sampleRate);
}

/**
 * Complex response of second-order sections at one frequency.
 * @param sos rows of b0 b1 b2 a0 a1 a2.
 * @param frequency [Hz].
 * @param sampleRate [Hz].
 */
export function sosResponse(sos: Float64Array, frequency: number, sampleRate: number): Complex {
  const omega = (2 * Math.PI * frequency) / sampleRate;
  const z1: Complex = { re: Math.cos(omega), im: -Math.sin(omega) };
  const z2 = multiply(z1, z1);
  let response = one();
  for (let row = 0; row < sos.length; row += SOS_ROW) {
    const numerator = {
      re: sos[row] + sos[row + 1] * z1.re + sos[row + 2] * z2.re,
      im: sos[row + 1] * z1.im + sos[row + 2] * z2.im,
    };
    const denominator = {
      re: sos[row + 3] + sos[row + 4] * z1.re + sos[row + 5] * z2.re,
      im: sos[row + 4] * z1.im + sos[row + 5] * z2.im,
    };
    response = multiply(response, divide(numerator, denominator));
  }
  return response;
}

/**
 * scipy.signal.zpk2sos with pairing 'nearest', for real zeros: an odd count is padded with a pole
 * and a zero at the origin; the section of the pole closest to the unit circle is filled last.
 * Only the upper member of each conjugate pole pair is kept, as scipy's _cplxreal does.
 */
function pairSections(allPoles: Complex[], allZeros: number[], gain: number): Float64Array {
  const poles: Complex[] = allPoles.filter((p) => p.im > 0);
  const realPoles = allPoles.filter((p) => p.im === 0);
  const zeros = allZeros.slice();
  if (allPoles.length % 2 === 1) {
    realPoles.push({ re: 0, im: 0 });
    zeros.push(0);
  }
  poles.push(...realPoles);
  const sectionCount = Math.ceil(allPoles.length / 2);
  const sos = new Float64Array(sectionCount * SOS_ROW);
  const distanceToCircle = (p: Complex): number => Math.abs(1 - Math.hypot(p.re, p.im));
  const worstIndex = (candidates: Complex[]): number => {
    let best = 0;
    for (let i = 1; i < candidates.length; i++) if (distanceToCircle(candidates[i]) < distanceToCircle(candidates[best])) best = i;
    return best;
  };
  const takeNearestZero = (to: Complex): number => {
    let best = 0;
    const distance = (z: number): number => Math.hypot(z - to.re, to.im);
    for (let i = 1; i < zeros.length; i++) if (distance(zeros[i]) < distance(zeros[best])) best = i;
    return zeros.splice(best, 1)[0];
  };

  for (let section = sectionCount - 1; section >= 0; section--) {
    const p1 = poles.splice(worstIndex(poles), 1)[0];
    const row = section * SOS_ROW;
    sos[row + 3] = 1;
    if (p1.im === 0 && poles.every((p) => p.im !== 0)) {
      // The last real pole: paired with the origin pole padded above, one zero and the padded zero.
      const z1 = takeNearestZero(p1);
      sos.set([1, -z1, 0, 1, -p1.re, 0], row);
      continue;
    }
    let a1: number;
    let a2: number;
    if (p1.im === 0) {
      const reals = poles.map((p, i) => ({ p, i })).filter(({ p }) => p.im === 0);
      const second = reals[worstIndex(reals.map(({ p }) => p))];
      poles.splice(second.i, 1);
      a1 = -(p1.re + second.p.re);
      a2 = p1.re * second.p.re;
    } else {
      a1 = -2 * p1.re;
      a2 = p1.re * p1.re + p1.im * p1.im;
    }
    const z1 = takeNearestZero(p1);
    const z2 = takeNearestZero(p1);
    sos.set([1, -(z1 + z2), z1 * z2, 1, a1, a2], row);
  }
  sos[0] *= gain;
  sos[1] *= gain;
  sos[2] *= gain;
  return sos;
}

function bilinear(s: Complex, twiceRate: number): Complex {
  if (s.im === 0) return { re: (twiceRate + s.re) / (twiceRate - s.re), im: 0 };
  return divide({ re: twiceRate + s.re, im: s.im }, { re: twiceRate - s.re, im: -s.im });
}

function one(): Complex {
  return { re: 1, im: 0 };
}

function negate(a: Complex): Complex {
  return { re: -a.re, im: -a.im };
}

function scale(a: Complex, factor: number): Complex {
  return { re: a.re * factor, im: a.im * factor };
}

function divideReal(numerator: number, a: Complex): Complex {
  return a.im === 0 ? { re: numerator / a.re, im: 0 } : divide({ re: numerator, im: 0 }, a);
}

function multiply(a: Complex, b: Complex): Complex {
  return { re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re };
}

function divide(a: Complex, b: Complex): Complex {
  const scaleFactor = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / scaleFactor, im: (a.im * b.re - a.re * b.im) / scaleFactor };
}
