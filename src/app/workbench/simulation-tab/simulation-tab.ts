import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, linkedSignal, signal, untracked } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatOption, MatSelect } from '@angular/material/select';
import { MatSlideToggle } from '@angular/material/slide-toggle';
import type { Design } from '@shared/contracts/design';
import type { Budget } from '@shared/contracts/figures';
import {
  DEFAULT_SAMPLES_PER_PERIOD,
  MIN_SAMPLES_PER_PERIOD,
  inputProfileSchema,
  parsePiecewiseLinearCsv,
  type InputProfile,
  type SimulationOptionsInput,
} from '@shared/contracts/simulation';
import type { SimulationResult } from '@shared/engine/simulation/result';
import { formatQuantity, parseQuantity, type DimensionName } from '@shared/units';
import { map, startWith } from 'rxjs';
import type { LineSeries } from '../../charts/chart-types';
import { LineChart } from '../../charts/line-chart';
import { agreementRows } from './agreement';
import { lastAnalogNode, recordableNodes } from './recorded-nodes';
import { SimulationSession } from './simulation-session';
import { waveformSeries } from './waveform-series';

type ProfileKind = InputProfile['kind'];
type Parsed<T> = { ok: true; value: T } | { ok: false; message: string };

/** Display columns of every node's envelope: enough to zoom in a few times before it blurs. */
const ENVELOPE_COLUMNS = 4000;
/** A relative difference above this is marked: the budget and the simulation disagree. */
const DISAGREEMENT = 0.1;

/**
 * Runs the time-domain simulation of the design in a worker: input profile, duration, sample rate,
 * seed and noise; then the waveforms of chosen nodes and the simulated figures beside the
 * analytic ones.
 */
@Component({
  selector: 'qb-simulation-tab',
  imports: [DecimalPipe, LineChart, MatButton, MatFormField, MatHint, MatInput, MatLabel, MatOption, MatProgressBar, MatSelect, MatSlideToggle, ReactiveFormsModule],
  templateUrl: './simulation-tab.html',
  styleUrl: './simulation-tab.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SimulationTab {
  protected readonly session = inject(SimulationSession);

  readonly design = input.required<Design>();
  readonly budget = input.required<Budget>();

  protected readonly profileKinds: readonly { kind: ProfileKind; label: string }[] = [
    { kind: 'constant', label: 'Constant' },
    { kind: 'sine', label: 'Sine' },
    { kind: 'step', label: 'Step' },
    { kind: 'ramp', label: 'Ramp' },
    { kind: 'piecewiseLinear', label: 'Piecewise linear (pasted rows)' },
  ];
  protected readonly minSamplesPerPeriod = MIN_SAMPLES_PER_PERIOD;

  protected readonly form = new FormGroup({
    kind: new FormControl<ProfileKind>('constant', { nonNullable: true }),
    value: new FormControl('0', { nonNullable: true }),
    offset: new FormControl('0', { nonNullable: true }),
    amplitude: new FormControl('', { nonNullable: true }),
    frequency: new FormControl('20 Hz', { nonNullable: true }),
    stepTime: new FormControl('50 ms', { nonNullable: true }),
    stepHeight: new FormControl('', { nonNullable: true }),
    base: new FormControl('0', { nonNullable: true }),
    rampStart: new FormControl('50 ms', { nonNullable: true }),
    rampEnd: new FormControl('150 ms', { nonNullable: true }),
    rampFrom: new FormControl('0', { nonNullable: true }),
    rampTo: new FormControl('', { nonNullable: true }),
    rows: new FormControl('', { nonNullable: true }),
    duration: new FormControl('1 s', { nonNullable: true }),
    samplesPerPeriod: new FormControl(DEFAULT_SAMPLES_PER_PERIOD, { nonNullable: true }),
    seed: new FormControl(1, { nonNullable: true }),
    noise: new FormControl(true, { nonNullable: true }),
    record: new FormControl<string[]>([], { nonNullable: true }),
  });
  private readonly value = toSignal(this.form.valueChanges.pipe(map(() => this.form.getRawValue()), startWith(this.form.getRawValue())), { requireSync: true });

  protected readonly measurand = computed<DimensionName>(() => (this.design().sensor.mode === 'pressure' ? 'pressure' : 'volumeFlow'));
  protected readonly measurandExample = computed(() => formatQuantity(this.design().sensor.fullScale / 2, this.measurand()));

  /** Nodes whose every sample can be kept besides the output. */
  protected readonly recordable = computed(() => recordableNodes(this.design()));
  private recordChosen = false;

  protected readonly duration = computed(() => parseQuantity(this.value().duration, 'time'));
  protected readonly profile = computed<Parsed<InputProfile>>(() => this.readProfile());
  protected readonly options = computed<Parsed<SimulationOptionsInput>>(() => {
    const profile = this.profile();
    const duration = this.duration();
    const { samplesPerPeriod, seed, noise, record } = this.value();
    if (!profile.ok) return profile;
    if (!duration.ok) return { ok: false, message: `Duration: ${duration.message}` };
    if (duration.value <= 0 || duration.value > 100) return { ok: false, message: 'Duration must be above 0 s and at most 100 s' };
    if (!Number.isInteger(samplesPerPeriod) || samplesPerPeriod < MIN_SAMPLES_PER_PERIOD || samplesPerPeriod > 4096) {
      return { ok: false, message: `Samples per period must be a whole number from ${MIN_SAMPLES_PER_PERIOD} to 4096` };
    }
    if (!Number.isInteger(seed) || seed < 0 || seed > 2 ** 32 - 1) return { ok: false, message: 'Seed must be a whole number from 0 to 2^32 - 1' };
    return {
      ok: true,
      value: { duration: duration.value, samplesPerPeriod, seed, noise, input: profile.value, record, envelopeColumns: ENVELOPE_COLUMNS },
    };
  });
  /** Samples the run will take, to say what the worker is in for. */
  protected readonly sampleCount = computed(() => {
    const duration = this.duration();
    return duration.ok ? Math.round(duration.value * this.value().samplesPerPeriod * this.design().excitation.frequency) : null;
  });

  protected readonly result = this.session.result;
  protected readonly stale = computed(() => this.result() !== null && this.session.design() !== this.design());

  /** The nodes to draw: the output and the node the figures were read on, until the designer picks others. */
  protected readonly shownNodes = linkedSignal<string[]>(() => {
    const result = this.result();
    return result === null ? [] : [...new Set([result.figures.rippleNode, result.output.node])];
  });
  /** The result the charts draw: taken a task after the result arrives, so the figures show first and no task runs long. */
  private readonly charted = signal<SimulationResult | null>(null);
  protected readonly voltageSeries = computed<LineSeries[]>(() => this.seriesOf((unit) => unit === 'V', 1));
  protected readonly inputSeries = computed<LineSeries[]>(() => this.seriesOf((unit) => unit !== 'V', this.design().sensor.mode === 'flow' ? 1e3 : 1));
  protected readonly inputLabel = computed(() => (this.design().sensor.mode === 'pressure' ? 'Pressure [Pa]' : 'Flow [L/s]'));
  protected readonly agreement = computed(() => {
    const result = this.result();
    return result === null ? [] : agreementRows(result, this.budget(), this.design().sensor.fullScale).map((row) => ({ ...row, disagrees: row.relative !== null && row.relative > DISAGREEMENT }));
  });

  constructor() {
    effect((onCleanup) => {
      const result = this.result();
      const timer = setTimeout(() => this.charted.set(result));
      onCleanup(() => clearTimeout(timer));
    });
    // Levels that depend on the sensor's span start at round parts of the full scale.
    effect(() => {
      const fullScale = this.design().sensor.fullScale;
      const dimension = this.measurand();
      untracked(() => {
        const controls = this.form.controls;
        const fill = (control: FormControl<string>, value: number) => {
          if (control.value === '') control.setValue(formatQuantity(value, dimension));
        };
        fill(controls.amplitude, fullScale / 4);
        fill(controls.stepHeight, fullScale / 2);
        fill(controls.rampTo, fullScale);
        // Keep the last analog node unless the designer chose otherwise: its spectrum shows the carrier.
        if (!this.recordChosen) controls.record.setValue([lastAnalogNode(this.design())]);
      });
    });
  }

  protected runSimulation(): void {
    const options = this.options();
    if (options.ok) this.session.run(this.design(), options.value);
  }

  protected chooseRecorded(): void {
    this.recordChosen = true;
  }

  protected cancelSimulation(): void {
    this.session.cancel();
  }

  protected showNodes(ids: string[]): void {
    this.shownNodes.set(ids);
  }

  private seriesOf(keep: (unit: string) => boolean, scale: number): LineSeries[] {
    const result = this.charted();
    if (result === null) return [];
    const shown = new Set(this.shownNodes());
    return result.nodes
      .filter((node) => shown.has(node.id) && keep(node.unit))
      .map((node) => waveformSeries(node, scale))
      .filter((series): series is LineSeries => series !== null);
  }

  private readProfile(): Parsed<InputProfile> {
    const v = this.value();
    const dimension = this.measurand();
    const fields: [string, string, DimensionName][] = [];
    let candidate: Record<string, unknown>;
    switch (v.kind) {
      case 'constant':
        fields.push(['value', v.value, dimension]);
        candidate = { kind: 'constant' };
        break;
      case 'sine':
        fields.push(['offset', v.offset, dimension], ['amplitude', v.amplitude, dimension], ['frequency', v.frequency, 'frequency']);
        candidate = { kind: 'sine', phase: 0 };
        break;
      case 'step':
        fields.push(['time', v.stepTime, 'time'], ['height', v.stepHeight, dimension], ['base', v.base, dimension]);
        candidate = { kind: 'step' };
        break;
      case 'ramp':
        fields.push(['start', v.rampStart, 'time'], ['end', v.rampEnd, 'time'], ['from', v.rampFrom, dimension], ['to', v.rampTo, dimension]);
        candidate = { kind: 'ramp' };
        break;
      case 'piecewiseLinear': {
        const parsed = parsePiecewiseLinearCsv(v.rows);
        return parsed.ok ? { ok: true, value: parsed.profile } : { ok: false, message: `Rows: ${parsed.message}` };
      }
    }
    for (const [name, text, fieldDimension] of fields) {
      const parsed = parseQuantity(text, fieldDimension);
      if (!parsed.ok) return { ok: false, message: `${FIELD_LABELS[name]}: ${parsed.message}` };
      candidate[name] = parsed.value;
    }
    const checked = inputProfileSchema.safeParse(candidate);
    return checked.success ? { ok: true, value: checked.data } : { ok: false, message: checked.error.issues[0].message };
  }
}

const FIELD_LABELS: Readonly<Record<string, string>> = {
  value: 'Value',
  offset: 'Offset',
  amplitude: 'Amplitude',
  frequency: 'Frequency',
  time: 'Step time',
  height: 'Step height',
  base: 'Level before the step',
  start: 'Ramp start',
  end: 'Ramp end',
  from: 'Level before the ramp',
  to: 'Level after the ramp',
};
