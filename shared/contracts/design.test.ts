import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { z } from 'zod';
import { designSchema, validateDesign } from './design';
import { loadDesign } from './design-loader';
import { demoDocument } from '../../test/fixtures/engine/designs';
import { evaluateBudget } from '../engine/budget/evaluate';

const errorsOf = (document: unknown) => {
  const result = validateDesign(document);
  return result.ok ? [] : result.errors;
};

describe('design document format v1', () => {
  it.each(['pressure', 'flow'] as const)('accepts the %s demo, free of error findings', (mode) => {
    const result = validateDesign(demoDocument(mode));
    expect(result.ok).toBe(true);
    if (result.ok) expect(evaluateBudget(result.design).findings.filter((f) => f.severity === 'error')).toEqual([]);
  });

  it('says what is wrong in a designer\'s words, at the field path', () => {
    const document = demoDocument();
    document.chain[0].feedbackCapacitance = 0;
    document.chain[2].corner = -5;
    expect(errorsOf(document)).toEqual([
      { path: 'chain[0].feedbackCapacitance', message: 'Feedback capacitance must be above 0 F' },
      { path: 'chain[2].corner', message: 'Corner frequency must be above 0 Hz' },
    ]);
  });

  it('names the stage kinds it knows', () => {
    const document = demoDocument();
    document.chain[1].kind = 'mixer';
    expect(errorsOf(document)).toEqual([{ path: 'chain[1].kind', message: 'Stage kind must be one of chargeAmplifier, gain, highPass, demodulator, lowPass, adc' }]);
  });

  it('checks the order of the chain', () => {
    const document = demoDocument();
    [document.chain[2], document.chain[4]] = [document.chain[4], document.chain[2]];
    expect(errorsOf(document).map((e) => e.path)).toEqual(['chain[4].kind']);
    const twoDemodulators = demoDocument();
    twoDemodulators.chain.splice(5, 0, { id: 'dm2', kind: 'demodulator', phase: 0 });
    expect(errorsOf(twoDemodulators)[0].message).toBe('The chain needs exactly one demodulator, it has 2');
    const adcFirst = demoDocument();
    adcFirst.chain.unshift(adcFirst.chain.pop());
    expect(errorsOf(adcFirst).map((e) => e.path)).toContain('chain[0].kind');
    const duplicate = demoDocument();
    duplicate.chain[1].id = 'ca';
    expect(errorsOf(duplicate)).toEqual([{ path: 'chain[1].id', message: 'Stage id "ca" is used twice; ids must be unique' }]);
  });

  it('needs a capillary in flow mode', () => {
    const document = demoDocument('flow');
    delete document.sensor.capillary;
    expect(errorsOf(document)).toEqual([{ path: 'sensor.capillary', message: 'Flow mode needs a capillary: its geometry or its hydraulic resistance' }]);
  });

  it('fills the optional parts with their defaults', () => {
    const document = demoDocument();
    delete document.analysis;
    delete document.environment;
    delete document.excitation.amplitudeNoise;
    const result = validateDesign(document);
    expect(result.ok && result.design.analysis).toEqual({ bandLow: 0.1, bandHigh: null, operatingPoint: 0 });
    expect(result.ok && result.design.environment.temperature).toBe(300);
    expect(result.ok && result.design.excitation.amplitudeNoise).toBe(0);
  });

  it('describes every numeric field, with its SI unit where it has one', () => {
    const described: string[] = [];
    const missing: string[] = [];
    const walk = (node: unknown, path: string): void => {
      if (typeof node !== 'object' || node === null) return;
      const schema = node as Record<string, unknown>;
      if ((schema.type === 'number' || schema.type === 'integer') && !path.endsWith('.items') && !/prefixItems\[\d\]$/.test(path)) {
        if (typeof schema.description === 'string' && schema.description.length > 0) described.push(schema.description);
        else missing.push(path);
      }
      for (const [key, value] of Object.entries(schema)) {
        if (Array.isArray(value)) value.forEach((entry, i) => walk(entry, `${path}.${key}[${i}]`));
        else walk(value, `${path}.${key}`);
      }
    };
    walk(z.toJSONSchema(designSchema, { io: 'input', unrepresentable: 'any' }), '');
    expect(missing).toEqual([]);
    expect(described).toContain('Feedback capacitance [F]. Cf: sets the charge gain 1/Cf');
    expect(described.filter((d) => /\[[^\]]+\]/.test(d)).length).toBeGreaterThan(30);
  });
});

describe('loader', () => {
  it('upgrades an unversioned draft (version 0) to version 1', () => {
    const document = demoDocument();
    delete document.format;
    delete document.version;
    const loaded = loadDesign(document);
    expect(loaded.ok).toBe(true);
    expect(loaded.upgradedFrom).toBe(0);
    expect(loaded.ok && loaded.design.version).toBe(1);
  });

  it('reads the current version as it is', () => {
    expect(loadDesign(demoDocument()).upgradedFrom).toBeNull();
  });

  it('refuses a newer version with a message saying so', () => {
    const document = { ...demoDocument(), version: 2 };
    expect(loadDesign(document)).toEqual({
      ok: false,
      errors: [{ path: 'version', message: 'This design was written in format version 2; this Quietbridge reads versions up to 1' }],
      upgradedFrom: null,
    });
  });

  it('gives validation errors, never exceptions, for random documents (property)', () => {
    fc.assert(
      fc.property(fc.anything(), (document) => {
        const loaded = loadDesign(document);
        expect(loaded.ok).toBe(false);
      }),
      { numRuns: 300 },
    );
  });

  it('gives validation errors, never exceptions, for demo designs with a random value at a random field (property)', () => {
    const paths: Array<[string, string | number, ...(string | number)[]]> = [
      ['chain', 0, 'feedbackCapacitance'],
      ['chain', 1, 'gain'],
      ['chain', 2, 'order'],
      ['chain', 4, 'response'],
      ['chain', 5, 'inputRange'],
      ['excitation', 'trim'],
      ['sensor', 'cellA', 'coefficients'],
      ['sensor', 'mode'],
      ['analysis', 'bandHigh'],
      ['chain', 3],
    ];
    fc.assert(
      fc.property(fc.constantFrom(...paths), fc.oneof(fc.anything(), fc.double(), fc.integer({ min: -10, max: 10 })), (path, value) => {
        const document = demoDocument();
        let node = document;
        for (const key of path.slice(0, -1)) node = node[key];
        node[path[path.length - 1]] = value;
        const loaded = loadDesign(document);
        if (loaded.ok) expect(() => evaluateBudget(loaded.design)).not.toThrow();
        else expect(loaded.errors.length).toBeGreaterThan(0);
      }),
      { numRuns: 500 },
    );
  });
});
