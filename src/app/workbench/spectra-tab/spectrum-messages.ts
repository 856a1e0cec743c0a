/** 'density': noise density [unit/rtHz] (square root of the Welch PSD); 'amplitude': amplitude spectrum [unit peak]. */
export type SpectrumKind = 'density' | 'amplitude';

/** The page to the spectrum worker: the samples (a copy, transferred), their rate [Hz] and the Welch segment. */
export interface SpectrumJob {
  readonly samples: Float64Array;
  readonly sampleRate: number;
  readonly segmentLength: number;
  readonly kind: SpectrumKind;
}

export type SpectrumMessage =
  | { readonly kind: 'done'; readonly frequencies: Float64Array; readonly values: Float64Array }
  | { readonly kind: 'failed'; readonly message: string };
