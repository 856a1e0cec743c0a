import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, linkedSignal, signal, untracked } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { MatButton } from '@angular/material/button';
import { MatButtonToggle, MatButtonToggleGroup } from '@angular/material/button-toggle';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatOption, MatSelect } from '@angular/material/select';
import type { Design } from '@shared/contracts/design';
import type { Budget } from '@shared/contracts/figures';
import { defaultSegmentLength } from '@shared/engine/simulation/measure';
import type { ChartMarker, LineSeries } from '../../charts/chart-types';
import { LineChart } from '../../charts/line-chart';
import { lastAnalogNode } from '../simulation-tab/recorded-nodes';
import { SimulationSession } from '../simulation-tab/simulation-session';
import type { SpectrumKind } from './spectrum-messages';
import { observeVisibility } from './host-visibility';
import { SpectrumRunner } from './spectrum-runner';


/** Segment lengths offered: 2^6 up to 2^18 samples, as far as the record reaches. */
const SHORTEST_SEGMENT = 1 << 6;
const LONGEST_SEGMENT = 1 << 18;
/** The longest segment chosen unasked: 2^15 bins are plenty on a screen. */
const LONGEST_DEFAULT_SEGMENT = 1 << 16;
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
  private readonly spectra = inject(SpectrumRunner);
  private readonly visible = observeVisibility();
  /** True from the first time the tab is on screen: a spectrum once computed stays while the designer looks at other tabs. */
  private readonly opened = signal(false);

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
    const preferred = Math.min(defaultSegmentLength(this.node()?.waveform?.length ?? 0), LONGEST_DEFAULT_SEGMENT);
    return lengths.includes(preferred) ? preferred : (lengths.at(-1) ?? null);
  });
  protected readonly kind = signal<SpectrumKind>('density');

  /** The spectrum of the chosen node, computed in a worker once the tab is on screen; a new choice cancels the one in progress. */
  protected readonly spectrumResource = rxResource({
    params: () => {
      if (!this.opened()) return undefined;
      const node = this.node();
      const segmentLength = this.segmentLength();
      if (node === null || node.waveform === null || segmentLength === null || node.waveform.length < segmentLength) return undefined;
      return { id: node.id, samples: node.waveform, sampleRate: node.sampleRate, segmentLength, kind: this.kind() };
    },
    stream: ({ params }) => this.spectra.spectrum(params.samples, params.sampleRate, params.segmentLength, params.kind),
  });
  protected readonly spectrum = computed<LineSeries[]>(() => {
    const node = this.node();
    if (!this.spectrumResource.hasValue() || node === null) return [];
    const { frequencies, values } = this.spectrumResource.value();
    return [{ name: node.id, x: frequencies, y: values }];
  });
  protected readonly spectrumError = computed(() => {
    const error = this.spectrumResource.error();
    return error === undefined ? null : error instanceof Error ? error.message : 'The spectrum could not be computed';
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

  constructor() {
    effect(() => {
      if (this.visible()) untracked(() => this.opened.set(true));
    });
  }

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
