import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { createStageRegistry, stageRegistry } from './registry';
import type { StageModule } from './stage';
import { analyseDesign } from '../analyse';
import { evaluateBudget } from '../budget/evaluate';
import { demoDesign, demoDocument } from '../../../test/fixtures/engine/designs';

describe('stage registry', () => {
  it('holds every built-in kind once, each with a schema that accepts its own defaults', () => {
    expect(stageRegistry.kinds).toEqual(['chargeAmplifier', 'gain', 'highPass', 'demodulator', 'lowPass', 'adc']);
    for (const stageModule of stageRegistry.modules) {
      expect(stageModule.schema.safeParse(stageModule.defaults('x')).success).toBe(true);
    }
  });

  it('takes a second gain stage: its gain multiplies the sensitivity and its noise joins the budget', () => {
    const single = evaluateBudget(demoDesign('pressure', (d) => (d.chain[1].gainBandwidth = 1e12)));
    const double = evaluateBudget(
      demoDesign('pressure', (d) => {
        d.chain[1].gainBandwidth = 1e12;
        d.chain.splice(2, 0, { ...d.chain[1], id: 'g2', gain: 2 });
      }),
    );
    expect(double.sensitivity.voltsPerFarad / single.sensitivity.voltsPerFarad).toBeCloseTo(2, 4);
    expect(double.noise.contributions.filter((c) => c.stage === 'g2').map((c) => c.source)).toEqual(['voltage noise', 'voltage flicker noise (1/f)']);
    expect(double.levels.map((l) => l.node)).toEqual(['ca', 'g1', 'g2', 'hp', 'dm', 'lp', 'adc']);
  });

  it('takes a gain stage after the demodulator, at baseband', () => {
    const budget = evaluateBudget(demoDesign('pressure', (d) => d.chain.splice(5, 0, { id: 'post', kind: 'gain', gain: 1.5, gainBandwidth: 1e7, voltageNoise: 8e-9, flickerCorner: 2e3, outputSwing: [0.1, 4.9] })));
    expect(budget.levels.find((l) => l.node === 'post')?.domain).toBe('baseband');
    expect(budget.noise.contributions.find((c) => c.stage === 'post' && c.source.includes('1/f'))?.share).toBeGreaterThan(0);
  });

  it('takes a new kind as one module plus one registry entry', () => {
    const attenuatorSchema = z.object({ id: z.string(), kind: z.literal('attenuator'), ratio: z.number().gt(0, 'Ratio must be above 0').lte(1, 'Ratio must be at most 1') });
    type Attenuator = z.infer<typeof attenuatorSchema>;
    const attenuator: StageModule<Attenuator> = {
      kind: 'attenuator',
      label: 'attenuator',
      placement: 'either',
      mustBeLast: false,
      schema: attenuatorSchema,
      defaults: (id) => ({ id, kind: 'attenuator', ratio: 0.5 }),
      prepare: (p, context) => ({
        id: p.id,
        kind: p.kind,
        path: context.path,
        domain: context.domain,
        flatGain: p.ratio,
        multiplyResponse: () => undefined,
        responsePower: () => 1,
        poles: [],
        noiseSources: [],
        swing: null,
        levelKind: 'differential',
        demodulatorPhase: null,
        converter: null,
        findings: () => [],
      }),
    };
    const registry = createStageRegistry([...stageRegistry.modules, attenuator]);
    const document = demoDocument();
    document.chain.splice(2, 0, { id: 'att', kind: 'attenuator', ratio: 0.5 });
    const withIt = analyseDesign(document, registry);
    const without = analyseDesign(demoDocument());
    expect(withIt.ok && without.ok).toBe(true);
    if (withIt.ok && without.ok) expect(withIt.budget.sensitivity.voltsPerFarad / without.budget.sensitivity.voltsPerFarad).toBeCloseTo(0.5, 12);
    const invalid = demoDocument();
    invalid.chain.splice(2, 0, { id: 'att', kind: 'attenuator', ratio: 2 });
    const refused = analyseDesign(invalid, registry);
    expect(refused.ok ? [] : refused.errors).toEqual([{ path: 'chain[2].ratio', message: 'Ratio must be at most 1' }]);
    expect(analyseDesign(document).ok).toBe(false);
  });
});
