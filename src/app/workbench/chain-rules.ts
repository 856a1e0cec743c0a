import { stageRegistry } from '@shared/engine/stages/registry';
import type { StageKind } from './stage-fields';

/**
 * The placement rules of the chain (the stage modules know them): one charge amplifier first,
 * exactly one demodulator, carrier-only stages before it, baseband-only stages after it, and a
 * stage that must end the chain (the ADC) last.
 */
export function chainAllows(kinds: readonly string[]): boolean {
  if (kinds.length < 3 || kinds[0] !== 'chargeAmplifier') return false;
  const demodulators = kinds.filter((kind) => kind === 'demodulator').length;
  if (demodulators !== 1) return false;
  const split = kinds.indexOf('demodulator');
  return kinds.every((kind, index) => {
    const stageModule = stageRegistry.get(kind);
    if (stageModule === undefined) return false;
    if (kind === 'chargeAmplifier' && index !== 0) return false;
    if (stageModule.placement === 'carrier' && index > split) return false;
    if (stageModule.placement === 'baseband' && index < split) return false;
    return !(stageModule.mustBeLast && index !== kinds.length - 1);
  });
}

export function canMove(kinds: readonly string[], index: number, step: -1 | 1): boolean {
  const target = index + step;
  if (target < 0 || target >= kinds.length) return false;
  const moved = kinds.slice();
  [moved[index], moved[target]] = [moved[target], moved[index]];
  return chainAllows(moved);
}

export function canRemove(kinds: readonly string[], index: number): boolean {
  return chainAllows(kinds.filter((_, i) => i !== index));
}

/**
 * Where a new stage of a kind goes: after the last stage of the same kind, else just before the
 * demodulator for a carrier stage (or one that may sit either side), else before the converter.
 * Null when no place keeps the chain valid.
 */
export function insertionIndex(kinds: readonly string[], kind: StageKind): number | null {
  const stageModule = stageRegistry.get(kind);
  if (stageModule === undefined) return null;
  const candidates: number[] = [];
  const sameKind = kinds.lastIndexOf(kind);
  if (sameKind >= 0) candidates.push(sameKind + 1);
  const demodulator = kinds.indexOf('demodulator');
  if (stageModule.placement !== 'baseband' && demodulator >= 0) candidates.push(demodulator);
  const last = stageRegistry.get(kinds[kinds.length - 1])?.mustBeLast ? kinds.length - 1 : kinds.length;
  candidates.push(stageModule.mustBeLast ? kinds.length : last);
  for (const index of candidates) {
    const grown = [...kinds.slice(0, index), kind, ...kinds.slice(index)];
    if (chainAllows(grown)) return index;
  }
  return null;
}

const idPrefixes: Record<StageKind, string> = { chargeAmplifier: 'ca', gain: 'g', highPass: 'hp', demodulator: 'dm', lowPass: 'lp', adc: 'adc' };

/** An id for a new stage, unique in the chain: "g2", "lp2". */
export function newStageId(ids: readonly string[], kind: StageKind): string {
  const prefix = idPrefixes[kind];
  const taken = new Set(ids);
  for (let n = 1; ; n++) {
    const id = n === 1 && prefix !== 'g' ? prefix : `${prefix}${n}`;
    if (!taken.has(id)) return id;
  }
}
