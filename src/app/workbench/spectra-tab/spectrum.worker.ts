import { amplitudeSpectrum, welchPsd } from '@shared/engine/spectral/welch';
import type { SpectrumJob, SpectrumMessage } from './spectrum-messages';

addEventListener('message', ({ data }: MessageEvent<SpectrumJob>) => {
  try {
    let frequencies: Float64Array;
    let values: Float64Array;
    if (data.kind === 'density') {
      const spectrum = welchPsd(data.samples, data.sampleRate, data.segmentLength);
      frequencies = spectrum.frequencies;
      values = spectrum.psd.map(Math.sqrt);
    } else {
      const spectrum = amplitudeSpectrum(data.samples, data.sampleRate, data.segmentLength);
      frequencies = spectrum.frequencies;
      values = spectrum.amplitude;
    }
    const message: SpectrumMessage = { kind: 'done', frequencies, values };
    postMessage(message, { transfer: [frequencies.buffer, values.buffer] });
  } catch (error) {
    const message: SpectrumMessage = { kind: 'failed', message: error instanceof Error ? error.message : 'The spectrum could not be computed' };
    postMessage(message);
  }
});
