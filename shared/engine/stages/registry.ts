import { adcModule } from './adc';
import { chargeAmplifierModule } from './charge-amplifier';
import { demodulatorModule } from './demodulator';
import { gainModule } from './gain';
import { highPassModule } from './high-pass';
import { lowPassModule } from './low-pass';
import type { StageModule } from './stage';

/** The stage kinds a chain may hold; a new kind is one module plus one entry here. */
export interface StageRegistry {
  readonly kinds: readonly string[];
  readonly modules: readonly StageModule[];
  get(kind: string): StageModule | undefined;
}

export function createStageRegistry(modules: readonly StageModule[]): StageRegistry {
  const byKind = new Map<string, StageModule>(modules.map((m) => [m.kind, m]));
  return { kinds: [...byKind.keys()], modules: [...byKind.values()], get: (kind) => byKind.get(kind) };
}

export const stageRegistry = createStageRegistry([
  chargeAmplifierModule,
  gainModule,
  highPassModule,
  demodulatorModule,
  lowPassModule,
  adcModule,
]);
