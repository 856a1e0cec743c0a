import { describe, expect, it } from 'vitest';
import sosFixture from '../../../test/fixtures/scipy/sos.json';
import sosfiltFixture from '../../../test/fixtures/scipy/sosfilt.json';
import { type FilterBand, type FilterResponse, designSos, highPassSos, lowPassSos, sosResponse } from './digital';
import { SosFilter } from './sos-filter';

function expectRelativelyClose(actual: ArrayLike<number>, expected: ArrayLike<number>, tolerance: number): void {
  expect(actual.length).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) {
    const e = expected[i];
    if (e === 0) expect(Math.abs(actual[i]), `index ${i}`).toBe(0);
    else expect(Math.abs(actual[i] - e) / Math.abs(e), `index ${i}: ${actual[i]} vs ${e}`).toBeLessThan(tolerance);
  }
}

describe('designSos', () => {
  // reference: scipy.signal.butter / scipy.signal.bessel(norm='mag'), output='sos', scipy 1.17.1,
  // fixture test/fixtures/scipy/sos.json
  it(`uses the scipy ${sosFixture.scipy} fixture`, () => {
    expect(sosFixture.cases).toHaveLength(80);
  });
  for (const c of sosFixture.cases) {
    it(`matches scipy for the ${c.response} ${c.band} of order ${c.order} at ${c.corner} Hz, fs ${c.sampleRate} Hz to 1e-9`, () => {
      const sos = designSos(c.band as FilterBand, c.response as FilterResponse, c.order, c.corner, c.sampleRate);
      expectRelativelyClose(sos, c.sos.flat(), 1e-9);
    });
  }

  for (const response of ['butterworth', 'bessel', 'critical'] as FilterResponse[]) {
    it(`puts the ${response} corner at -3 dB exactly (pre-warping) with unit pass-band gain`, () => {
      // reference: bilinear transform with pre-warping maps the analog corner onto the digital one.
      for (let order = 1; order <= 4; order++) {
        const low = lowPassSos(response, order, 1200, 10000);
        const high = highPassSos(response, order, 1200, 10000);
        const magnitude = (sos: Float64Array, f: number): number => Math.hypot(sosResponse(sos, f, 10000).re, sosResponse(sos, f, 10000).im);
        expect(magnitude(low, 1200)).toBeCloseTo(Math.SQRT1_2, 12);
        expect(magnitude(high, 1200)).toBeCloseTo(Math.SQRT1_2, 12);
        expect(magnitude(low, 0)).toBeCloseTo(1, 12);
        expect(magnitude(high, 5000)).toBeCloseTo(1, 12);
      }
    });
  }

  it('rejects a corner at or above half the sample rate, a non-positive corner and a bad order', () => {
    expect(() => lowPassSos('butterworth', 2, 2000, 4000)).toThrow(/half the sample rate \(2000 Hz\)/);
    expect(() => highPassSos('bessel', 2, 0, 4000)).toThrow(RangeError);
    expect(() => lowPassSos('butterworth', 2, 100, Number.NaN)).toThrow(/Sample rate/);
    expect(() => lowPassSos('critical', 5, 100, 4000)).toThrow(/order/);
  });
});

describe('SosFilter', () => {
  // reference: scipy.signal.sosfilt, scipy 1.17.1, fixture test/fixtures/scipy/sosfilt.json
  const input = Float64Array.from(sosfiltFixture.input);
  for (const c of sosfiltFixture.cases) {
    it(`reproduces scipy's sosfilt for the ${c.response} ${c.band} of order ${c.order}`, () => {
      const sos = designSos(c.band as FilterBand, c.response as FilterResponse, c.order, c.corner, c.sampleRate);
      const output = new SosFilter(sos).process(input, new Float64Array(input.length));
      const peak = Math.max(...c.output.map(Math.abs));
      for (let n = 0; n < input.length; n++) expect(Math.abs(output[n] - c.output[n])).toBeLessThan(1e-12 * peak);
    });
  }

  it('gives the same output in blocks as in one pass, and in place as into an output array', () => {
    // reference: state continuity of direct form II transposed (common practice).
    const sos = lowPassSos('butterworth', 4, 1000, 48000);
    const whole = new SosFilter(sos).process(input, new Float64Array(input.length));
    const blocks = new SosFilter(sos);
    const inPlace = Float64Array.from(input);
    blocks.process(inPlace.subarray(0, 337));
    blocks.process(inPlace.subarray(337, 338));
    blocks.process(inPlace.subarray(338));
    expect(inPlace).toEqual(whole);
  });

  it('starts again from rest after reset', () => {
    const filter = new SosFilter(highPassSos('bessel', 3, 2000, 48000));
    const first = filter.process(input, new Float64Array(input.length));
    filter.reset();
    expect(filter.process(input, new Float64Array(input.length))).toEqual(first);
    expect(filter.sectionCount).toBe(2);
  });

  it('rejects malformed sections and mismatched output length', () => {
    expect(() => new SosFilter(new Float64Array(5))).toThrow(/multiple of 6/);
    expect(() => new SosFilter(Float64Array.from([1, 0, 0, 2, 0, 0]))).toThrow(/a0 = 1/);
    expect(() => new SosFilter(lowPassSos('butterworth', 2, 10, 100)).process(new Float64Array(4), new Float64Array(3))).toThrow(/length/);
  });
});
