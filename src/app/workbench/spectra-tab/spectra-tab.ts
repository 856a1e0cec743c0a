import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, linkedSignal, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatButtonToggle, MatButtonToggleGroup } from '@angular/material/button-toggle';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatOption, MatSelect } from '@angular/material/select';
import type { Design } from '@shared/contracts/design';
import type { Budget } from '@shared/contracts/figures';
import { defaultSegmentLength } from '@shared/engine/simulation/measure';
import { amplitudeSpectrum, welchPsd } from '@shared/engine/spectral/welch';
import type { ChartMarker, LineSeries } from '../../charts/chart-types';
import { LineChart } from '../../charts/line-chart';
import { lastAnalogNode } from '../simulation-tab/recorded-nodes';
import { SimulationSession } from '../simulation-tab/simulation-session';

type SpectrumKind = 'density' | 'amplitude';

/** Segment lengths offered: 2^6 up to 2^18 samples, as far as the record reaches. */
const SHORTEST_SEGMENT = 1 << 6;
const LONGEST_SEGMENT = 1 << 18;
/** Carrier harmonics marked on the frequency axis. */
const HARMONICS = 7;
/** The run the tab starts when there is none: the noise of the chain at its operating point. */
const NOISE_RUN_SECONDS = 1;

/**
 * Welch spectrum of any node the last simulation kept in full: noise density [V/rtHz] or amplitude
 * spectrum [V peak], log-log, with the carrier and its harmonics marked.
 */
@Component({
  selector: 'qb-spectra-tab',
  imports: [DecimalPipe, LineChart, MatButton, MatButtonToggle, MatButtonToggleGroup, MatFormField, MatLabel, MatOption, MatProgressBar, MatSelect],
  templateUrl: './spectra-tab.html',
  styleUrl: './spectra-tab.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SpectraTab {
  protected readonly session = inject(SimulationSession);

  readonly design = input.required<Design>();
  readonly budget = input.required<Budget>();

  protected readonly noiseRunSeconds = NOISE_RUN_SECONDS;
  protected readonly result = this.session.result;
  protected readonly stale = computed(() => this.result() !== null && this.session.design() !== this.design());
  /** Nodes with every sample kept, in volts: the ones a spectrum can be taken of. */
  protected readonly nodes = computed(() => (this.result()?.nodes ?? []).filter((node) => node.waveform !== null && node.unit === 'V'));
  /** The last analog node when it was kept (the carrier and its harmonics show there), else the first kept. */
  protected readonly nodeId = linkedSignal<string | null>(() => {
    const preferred = this.result()?.figures.rippleNode;
    const nodes = this.nodes();
    return nodes.find((node) => node.id === preferred)?.id ?? nodes.at(0)?.id ?? null;
  });
  protected readonly node = computed(() => this.nodes().find((node) => node.id === this.nodeId()) ?? null);

  protected readonly segmentLengths = computed(() => {
    const samples = this.node()?.waveform?.length ?? 0;
    const lengths: number[] = [];
    for (let length = SHORTEST_SEGMENT; length <= Math.min(samples, LONGEST_SEGMENT); length *= 2) lengths.push(length);
    return lengths;
  });
  protected readonly segmentLength = linkedSignal(() => {
    const lengths = this.segmentLengths();
    const preferred = Math.min(defaultSegmentLength(this.node()?.waveform?.length ?? 0), LONGEST_SEGMENT);
    return lengths.includes(preferred) ? preferred : (lengths.at(-1) ?? null);
  });
  protected readonly kind = signal<SpectrumKind>('density');

  protected readonly spectrum = computed<LineSeries[]>(() => {
    const node = this.node();
    const segment = this.segmentLength();
    if (node === null || node.waveform === null || segment === null || node.waveform.length < segment) return [];
    if (this.kind() === 'density') {
      const { frequencies, psd } = welchPsd(node.waveform, node.sampleRate, segment);
      return [{ name: node.id, x: frequencies, y: psd.map(Math.sqrt) }];
    }
    const { frequencies, amplitude } = amplitudeSpectrum(node.waveform, node.sampleRate, segment);
    return [{ name: node.id, x: frequencies, y: amplitude }];
  });
  protected readonly resolutionBandwidth = computed(() => {
    const node = this.node();
    const segment = this.segmentLength();
    return node === null || segment === null ? null : node.sampleRate / segment;
  });
  protected readonly markers = computed<ChartMarker[]>(() => {
    const node = this.node();
    if (node === null) return [];
    const carrier = this.design().excitation.frequency;
    const markers: ChartMarker[] = [];
    for (let k = 1; k <= HARMONICS && k * carrier <= node.sampleRate / 2; k++) markers.push({ x: k * carrier, label: k === 1 ? 'f0' : `${k} f0` });
    return markers;
  });
  protected readonly yLabel = computed(() => (this.kind() === 'density' ? 'Noise density [V/√Hz]' : 'Amplitude [V peak]'));
  protected readonly yUnit = computed(() => (this.kind() === 'density' ? 'V/√Hz' : 'V'));

  protected runNoiseSimulation(): void {
    const design = this.design();
    this.session.run(design, { duration: NOISE_RUN_SECONDS, noise: true, record: [lastAnalogNode(design)] });
  }

  protected pickNode(id: string): void {
    this.nodeId.set(id);
  }

  protected pickSegmentLength(length: number): void {
    this.segmentLength.set(length);
  }

  protected pickKind(kind: SpectrumKind): void {
    this.kind.set(kind);
  }
}
