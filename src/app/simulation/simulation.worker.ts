/// <reference lib="webworker" />
import { validateDesign } from '@shared/contracts/design';
import type { SimulationResult } from '@shared/engine/simulation/result';
import { Simulation } from '@shared/engine/simulation/simulator';
import type { SimulationMessage, SimulationRequest } from './simulation-messages';

/** Samples per slice: about 10 to 30 ms of work, so progress is fine-grained. */
const SLICE = 1 << 18;

function send(message: SimulationMessage, transfer: Transferable[] = []): void {
  postMessage(message, { transfer });
}

/** Every typed array's buffer in the result, once each (the output node's waveform is also output.volts). */
function buffers(result: SimulationResult): Transferable[] {
  const found = new Set<ArrayBuffer>();
  const add = (array: Float64Array | Float32Array | null) => {
    if (array !== null) found.add(array.buffer as ArrayBuffer);
  };
  for (const node of result.nodes) {
    add(node.waveform);
    add(node.envelope?.min ?? null);
    add(node.envelope?.max ?? null);
  }
  add(result.output.volts);
  add(result.output.measurand);
  return [...found];
}

addEventListener('message', ({ data }: MessageEvent<SimulationRequest>) => {
  const validation = validateDesign(data.design);
  if (!validation.ok) {
    send({ type: 'error', message: validation.errors.map((e) => `${e.path}: ${e.message}`).join('; ') });
    return;
  }
  try {
    const simulation = new Simulation(validation.design, data.options);
    while (!simulation.done) send({ type: 'progress', fraction: simulation.advance(SLICE) });
    const result = simulation.result();
    send({ type: 'result', result }, buffers(result));
  } catch (error) {
    send({ type: 'error', message: error instanceof Error ? error.message : String(error) });
  }
});
