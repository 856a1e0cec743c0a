import demoFlow from '@shared/examples/demo-flow.json';
import demoPressure from '@shared/examples/demo-pressure.json';

/** A design to start from: the two invented demo scenarios of the dispensing robot line sensor. */
export interface DesignTemplate {
  readonly key: string;
  readonly title: string;
  readonly description: string;
  readonly document: { name: string } & Record<string, unknown>;
}

export const designTemplates: readonly DesignTemplate[] = [
  {
    key: 'pressure',
    title: 'Line sensor, pressure mode',
    description: 'Cell A sees 0 to 60 kPa, cell B stays at ambient; 50 kHz square-wave excitation, 16-bit ADC.',
    document: demoPressure,
  },
  {
    key: 'flow',
    title: 'Line sensor, flow mode',
    description: 'Both cells on the line with a 20 mm by 0.2 mm capillary between them; 0 to 20 uL/s.',
    document: demoFlow,
  },
];
