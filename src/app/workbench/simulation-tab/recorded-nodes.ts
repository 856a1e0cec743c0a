import type { Design } from '@shared/contracts/design';

/** The stage before the converter (or the last stage when there is none): where the ripple and the step are read. */
export function lastAnalogNode(design: Design): string {
  const chain = design.chain;
  return chain[chain.length - 1].kind === 'adc' ? chain[chain.length - 2].id : chain[chain.length - 1].id;
}

/** Nodes whose every sample a run can keep on request: both charge amplifier sides and every stage but the output, which is always kept. */
export function recordableNodes(design: Design): string[] {
  const chain = design.chain;
  const output = chain[chain.length - 1].id;
  return [`${chain[0].id}.A`, `${chain[0].id}.B`, ...chain.map((stage) => stage.id)].filter((id) => id !== output);
}
