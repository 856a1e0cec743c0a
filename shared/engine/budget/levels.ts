import type { Finding } from '../../contracts/findings';
import type { NodeLevel } from '../../contracts/figures';
import { finding, number, digits } from '../findings';
import { formatQuantity } from '../../units/format';
import type { PreparedStage } from '../stages/stage';

/** Above this share of the swing a node is close enough to clipping to say so. */
export const LEVEL_WARNING = 0.9;

/**
 * A node's level: `deviation` is the peak distance of the signal from its centre in the sense the
 * stage's level kind asks for (per side, half the differential signal, or the converter's input).
 */
export function nodeLevel(stage: PreparedStage, differentialPeak: number, perSidePeak: number): NodeLevel {
  const deviation = stage.levelKind === 'perSide' ? perSidePeak : stage.levelKind === 'converter' ? differentialPeak : differentialPeak / 2;
  const swing = stage.swing;
  if (swing === null) {
    return { node: stage.id, kind: stage.kind, domain: stage.domain, peak: deviation, centre: 0, swingLow: null, swingHigh: null, usedFraction: null };
  }
  const room = Math.min(swing.high - swing.centre, swing.centre - swing.low);
  return {
    node: stage.id,
    kind: stage.kind,
    domain: stage.domain,
    peak: deviation,
    centre: swing.centre,
    swingLow: swing.low,
    swingHigh: swing.high,
    usedFraction: room > 0 ? deviation / room : null,
  };
}

export function levelFindings(stage: PreparedStage, level: NodeLevel): Finding[] {
  const swing = stage.swing;
  if (swing === null) return [];
  const field = stage.levelKind === 'converter' ? 'inputRange' : 'outputSwing';
  const target = { stage: stage.id, path: stage.path };
  const numbers = [number('peak', level.peak, 'V'), number('centre', swing.centre, 'V'), number('swing low', swing.low, 'V'), number('swing high', swing.high, 'V')];
  if (level.usedFraction === null) {
    return [finding('error', 'centre-outside-swing', target, field, `The signal is centred at ${formatQuantity(swing.centre, 'voltage')}, outside the swing of this node`, numbers, 'widen the swing to include mid-supply')];
  }
  const used = level.usedFraction;
  const side = stage.levelKind === 'perSide' ? ' on one input side' : '';
  if (used > 1) {
    return [finding('error', 'clipping', target, field, `The ${stage.kind} output clips${side}: the signal needs ${digits(used * 100)} % of the room to the nearer limit`, [...numbers, number('used fraction', used, '')], clippingSuggestion(stage, used))];
  }
  if (used > LEVEL_WARNING) {
    return [finding('warning', 'near-clipping', target, field, `The ${stage.kind} output uses ${digits(used * 100)} % of its swing${side}`, [...numbers, number('used fraction', used, '')], clippingSuggestion(stage, used))];
  }
  return [];
}

function clippingSuggestion(stage: PreparedStage, used: number): string {
  if (stage.levelKind === 'perSide') return 'raise the feedback capacitance or match the counter-pulse capacitors closer to the cells';
  return `lower the gain ahead of this node by a factor of ${digits(used / LEVEL_WARNING)}`;
}
