import { describe, expect, it } from 'vitest';
import { demoDocument } from '../../../test/fixtures/engine/designs';
import { compareFindings, compareVersions, formatFieldValue } from './compare-versions';
import type { Finding } from '../../contracts/findings';

describe('compareVersions: fields', () => {
  it('finds nothing between a document and its copy', () => {
    const comparison = compareVersions(demoDocument(), demoDocument());
    expect(comparison.fields).toEqual([]);
    expect(comparison.stages).toEqual([]);
    expect(comparison.findings).toEqual([]);
    expect(comparison.figures.every((figure) => figure.direction === 'same')).toBe(true);
  });

  it('reports a changed stage field with its path, label, unit and display values', () => {
    const newer = demoDocument();
    newer.chain[4].corner = 300;
    newer.excitation.amplitude = 1;
    const comparison = compareVersions(demoDocument(), newer);
    expect(comparison.fields).toEqual([
      expect.objectContaining({ path: 'excitation.amplitude', stage: 'excitation', field: 'amplitude', label: 'Excitation amplitude', old: 2, new: 1, dimension: 'voltage', oldText: '2 V', newText: '1 V' }),
      expect.objectContaining({ path: 'chain[4].corner', stage: 'lp', field: 'corner', label: 'Corner frequency', old: 500, new: 300, dimension: 'frequency', oldText: '500 Hz', newText: '300 Hz' }),
    ]);
  });

  it('shows engineering prefixes, ranges element by element, nested sensor fields and the full scale in the mode unit', () => {
    const newer = demoDocument();
    newer.chain[0].feedbackCapacitance = 2.2e-12;
    newer.chain[1].outputSwing = [0.2, 4.8];
    newer.sensor.cellA.baseCapacitance = 3.4e-12;
    newer.sensor.fullScale = 50000;
    const fields = compareVersions(demoDocument(), newer).fields;
    const byPath = new Map(fields.map((field) => [field.path, field]));
    expect(byPath.get('chain[0].feedbackCapacitance')).toMatchObject({ oldText: '1 pF', newText: '2.2 pF', units: ['F'] });
    expect(byPath.get('chain[1].outputSwing')).toMatchObject({ oldText: '[100 mV, 4.9 V]', newText: '[200 mV, 4.8 V]', units: ['V', 'V'], label: 'Output swing' });
    expect(byPath.get('sensor.cellA.baseCapacitance')).toMatchObject({ stage: 'sensor', field: 'cellA.baseCapacitance', oldText: '3.3 pF', newText: '3.4 pF' });
    expect(byPath.get('sensor.fullScale')).toMatchObject({ oldText: '60 kPa', newText: '50 kPa', dimension: 'pressure' });
    expect(fields).toHaveLength(4);
  });

  it('reads a range in a description as no unit: the trim DAC bits stay a bare number', () => {
    const newer = demoDocument();
    newer.excitation.trimBits = 10;
    expect(compareVersions(demoDocument(), newer).fields).toEqual([expect.objectContaining({ path: 'excitation.trimBits', units: [], oldText: '12', newText: '10' })]);
  });

  it('gives a flow-mode full scale in L/s and coefficients with their own units', () => {
    const newer = demoDocument('flow');
    newer.sensor.fullScale = 1e-8;
    newer.sensor.cellB.coefficients = [3e-19, -2.5e-25];
    const byPath = new Map(compareVersions(demoDocument('flow'), newer).fields.map((field) => [field.path, field]));
    expect(byPath.get('sensor.fullScale')).toMatchObject({ oldText: '20 uL/s', newText: '10 uL/s' });
    expect(byPath.get('sensor.cellB.coefficients')).toMatchObject({ label: 'coefficients', units: ['F/Pa', 'F/Pa^2', 'F/Pa^3'], newText: '[300 aF/kPa, -2.5e-25 F/Pa^2]' });
  });

  it('does not count a default left out of the older document as a change', () => {
    const older = demoDocument();
    delete older.excitation.amplitudeNoise;
    const newer = demoDocument();
    newer.excitation.amplitudeNoise = 0;
    expect(compareVersions(older, newer).fields).toEqual([]);
  });

  it('matches stages by id: a removed stage is one stage change, not a shift of every field after it', () => {
    const newer = demoDocument();
    newer.chain.splice(1, 1);
    const comparison = compareVersions(demoDocument(), newer);
    expect(comparison.stages).toEqual([{ id: 'g1', kind: 'gain', change: 'removed', oldIndex: 1, newIndex: null }]);
    expect(comparison.fields).toEqual([]);
  });

  it('reports an added stage and a stage moved in the chain, with the fields at their new paths', () => {
    const newer = demoDocument();
    newer.chain.splice(1, 0, { id: 'g0', kind: 'gain', gain: 2, gainBandwidth: 1e7, voltageNoise: 8e-9, flickerCorner: 2000, outputSwing: [0.1, 4.9] });
    const older = demoDocument();
    // Move the high-pass ahead of the gain stage in the older chain, so the newer one has it after.
    [older.chain[1], older.chain[2]] = [older.chain[2], older.chain[1]];
    newer.chain[2].gain = 25;
    const comparison = compareVersions(older, newer);
    expect(comparison.stages).toEqual(
      expect.arrayContaining([
        { id: 'g0', kind: 'gain', change: 'added', oldIndex: null, newIndex: 1 },
        { id: 'g1', kind: 'gain', change: 'moved', oldIndex: 2, newIndex: 2 },
        { id: 'hp', kind: 'highPass', change: 'moved', oldIndex: 1, newIndex: 3 },
      ]),
    );
    expect(comparison.stages).toHaveLength(3);
    expect(comparison.fields).toEqual([expect.objectContaining({ path: 'chain[2].gain', stage: 'g1', oldText: '20 V/V', newText: '25 V/V' })]);
  });

  it('still lists the fields of a document that does not validate, without figures', () => {
    const newer = demoDocument();
    newer.chain[4].corner = -5;
    const comparison = compareVersions(demoDocument(), newer);
    expect(comparison.newValid).toBe(false);
    expect(comparison.figures).toEqual([]);
    expect(comparison.fields).toEqual([expect.objectContaining({ path: 'chain[4].corner', oldText: '500 Hz', newText: '-5 Hz' })]);
  });
});

describe('compareVersions: figures', () => {
  it('lists sensitivity, the resolutions, noise, headroom and ripple of a pressure design (no flow resolution)', () => {
    const keys = compareVersions(demoDocument(), demoDocument()).figures.map((figure) => figure.key);
    expect(keys).toEqual(['sensitivity', 'resolutionCapacitance', 'resolutionPressure', 'outputNoise', 'worstHeadroom', 'ripple']);
  });

  it('calls more gain better for sensitivity and worse for headroom, and a lower low-pass corner better for ripple and noise', () => {
    const newer = demoDocument();
    newer.chain[1].gain = 25;
    newer.chain[4].corner = 300;
    const figures = new Map(compareVersions(demoDocument(), newer).figures.map((figure) => [figure.key, figure]));
    expect(figures.get('sensitivity')).toMatchObject({ direction: 'better', sense: 'higher' });
    expect(figures.get('sensitivity')!.new! / figures.get('sensitivity')!.old!).toBeCloseTo(25 / 20, 1); // the stage pole GBW / G moves too, so D changes a little
    expect(figures.get('worstHeadroom')).toMatchObject({ direction: 'worse' });
    expect(figures.get('ripple')).toMatchObject({ direction: 'better' });
    expect(figures.get('resolutionCapacitance')).toMatchObject({ direction: 'better' });
    expect(figures.get('worstHeadroom')!.newText).toMatch(/^[\d.]+ % at \w+$/);
  });

  it('counts a change below 0.1 % as the same', () => {
    const newer = demoDocument();
    newer.chain[1].gainBandwidth = 5.00001e7;
    const figures = compareVersions(demoDocument(), newer).figures;
    expect(figures.every((figure) => figure.direction === 'same')).toBe(true);
  });

  it('shows the flow resolution in L/s for a flow design', () => {
    const flow = compareVersions(demoDocument('flow'), demoDocument('flow')).figures.find((figure) => figure.key === 'resolutionFlow');
    expect(flow?.newText).toMatch(/ [unp]?L\/s$/);
  });
});

describe('compareVersions: findings', () => {
  const finding = (code: string, path: string): Finding => ({ severity: 'warning', code, stage: 'lp', field: 'corner', path, message: code, numbers: [], suggestion: null });

  it('keys findings by code and path: the same code on another field is a new finding', () => {
    const changes = compareFindings([finding('carrier-ripple', 'chain[4].corner'), finding('clipping', 'chain[1].gain')], [finding('carrier-ripple', 'chain[4].corner'), finding('clipping', 'chain[0].feedbackCapacitance')]);
    expect(changes).toEqual([
      { change: 'added', finding: finding('clipping', 'chain[0].feedbackCapacitance') },
      { change: 'gone', finding: finding('clipping', 'chain[1].gain') },
    ]);
  });

  it('finds a ripple finding added when the low-pass corner goes up near the carrier', () => {
    const newer = demoDocument();
    newer.chain[4].corner = 40000;
    const added = compareVersions(demoDocument(), newer).findings.filter((change) => change.change === 'added');
    expect(added.map((change) => change.finding.path)).toContain('chain[4].corner');
  });
});

describe('formatFieldValue', () => {
  it('writes absent, none, text and plain numbers', () => {
    expect(formatFieldValue(undefined, [])).toBe('(absent)');
    expect(formatFieldValue(null, ['Hz'])).toBe('none');
    expect(formatFieldValue('bessel', [])).toBe('bessel');
    expect(formatFieldValue(12, [])).toBe('12');
  });
});
