import { ChangeDetectionStrategy, Component, DestroyRef, computed, effect, inject, input, output, signal, untracked } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatButtonToggle, MatButtonToggleGroup } from '@angular/material/button-toggle';
import { MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatOptgroup, MatOption, MatSelect } from '@angular/material/select';
import type { Design } from '@shared/contracts/design';
import type { Budget } from '@shared/contracts/figures';
import { MAX_SWEEP_POINTS, type SweepRequest } from '@shared/engine/index';
import { formatQuantity } from '@shared/units';
import { map, startWith, type Subscription } from 'rxjs';
import type { ChartMarker, LineSeries, PickedPoint } from '../../charts/chart-types';
import { LineChart } from '../../charts/line-chart';
import { bestWithinHeadroom, type SweepRow } from './sweep-figures';
import { axisLabel, formatParameterValue, parseParameterValue, sweepParameters, type SweepParameter } from './sweep-parameters';
import { MAIN_THREAD_SWEEP_POINTS, SweepRunner } from './sweep-runner';

/** A change the designer picked from a sweep: set the number at path to value. */
export interface SweepApply {
  readonly path: string;
  readonly value: number;
}

type ResolutionUnit = 'measurand' | 'capacitance';

interface Swept {
  readonly parameter: SweepParameter;
  readonly scale: 'linear' | 'log';
  readonly rows: readonly SweepRow[];
}

const PREFERRED_PARAMETER = 'excitation.amplitude';

/**
 * Sweeps one number of the design and plots resolution, worst headroom and ripple against it; a
 * clicked point, or the best value within the headroom, goes back to the design through apply.
 */
@Component({
  selector: 'qb-sweep-tab',
  imports: [
    LineChart,
    MatButton,
    MatButtonToggle,
    MatButtonToggleGroup,
    MatFormField,
    MatHint,
    MatInput,
    MatLabel,
    MatOptgroup,
    MatOption,
    MatProgressBar,
    MatSelect,
    ReactiveFormsModule,
  ],
  templateUrl: './sweep-tab.html',
  styleUrl: './sweep-tab.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SweepTab {
  private readonly runner = inject(SweepRunner);
  private readonly destroyRef = inject(DestroyRef);

  readonly design = input.required<Design>();
  readonly budget = input.required<Budget>();
  readonly apply = output<SweepApply>();

  protected readonly maxPoints = MAX_SWEEP_POINTS;
  protected readonly form = new FormGroup({
    path: new FormControl('', { nonNullable: true }),
    from: new FormControl('', { nonNullable: true }),
    to: new FormControl('', { nonNullable: true }),
    points: new FormControl(50, { nonNullable: true }),
    scale: new FormControl<'linear' | 'log'>('log', { nonNullable: true }),
  });
  private readonly formValue = toSignal(this.form.valueChanges.pipe(map(() => this.form.getRawValue()), startWith(this.form.getRawValue())), {
    requireSync: true,
  });

  protected readonly parameters = computed(() => sweepParameters(this.design()));
  protected readonly groups = computed(() => {
    const groups = new Map<string, SweepParameter[]>();
    for (const parameter of this.parameters()) groups.set(parameter.group, [...(groups.get(parameter.group) ?? []), parameter]);
    return [...groups].map(([name, parameters]) => ({ name, parameters }));
  });
  protected readonly parameter = computed(() => this.parameters().find((p) => p.path === this.formValue().path) ?? null);

  protected readonly from = computed(() => this.readEnd(this.formValue().from));
  protected readonly to = computed(() => this.readEnd(this.formValue().to));
  /** The request the form describes, or what is wrong with it. */
  protected readonly request = computed<{ ok: true; request: SweepRequest } | { ok: false; message: string }>(() => {
    const parameter = this.parameter();
    const { points, scale } = this.formValue();
    const from = this.from();
    const to = this.to();
    if (parameter === null) return { ok: false, message: 'Pick a parameter to sweep' };
    if (!from.ok || !to.ok) return { ok: false, message: 'Give both ends of the range' };
    if (!Number.isInteger(points) || points < 2 || points > MAX_SWEEP_POINTS) return { ok: false, message: `Points must be a whole number from 2 to ${MAX_SWEEP_POINTS}` };
    if (scale === 'log' && (from.value <= 0 || to.value <= 0)) return { ok: false, message: 'A log sweep needs both ends above 0; choose linear for this range' };
    if (from.value === to.value) return { ok: false, message: 'The range needs two different ends' };
    return { ok: true, request: { path: parameter.path, from: from.value, to: to.value, points, scale } };
  });
  protected readonly inWorker = computed(() => this.formValue().points > MAIN_THREAD_SWEEP_POINTS);

  protected readonly running = signal(false);
  protected readonly fraction = signal(0);
  protected readonly failure = signal<string | null>(null);
  protected readonly swept = signal<Swept | null>(null);
  protected readonly resolutionUnit = signal<ResolutionUnit>('measurand');
  protected readonly applied = signal<string | null>(null);
  private running$: Subscription | null = null;

  protected readonly measurandName = computed(() => (this.design().sensor.mode === 'pressure' ? 'pressure' : 'flow'));
  protected readonly best = computed(() => {
    const swept = this.swept();
    return swept === null ? null : bestWithinHeadroom(swept.rows);
  });
  protected readonly invalidPoints = computed(() => {
    const rows = this.swept()?.rows ?? [];
    const invalid = rows.filter((row) => row.error !== null);
    return invalid.length === 0 ? null : { count: invalid.length, first: invalid[0].error };
  });

  protected readonly xLabel = computed(() => {
    const swept = this.swept();
    return swept === null ? '' : axisLabel(swept.parameter);
  });
  protected readonly xUnit = computed(() => this.xLabel().match(/\[(.*)\]$/)?.[1] ?? '');
  protected readonly markers = computed<ChartMarker[]>(() => {
    const swept = this.swept();
    if (swept === null) return [];
    const markers: ChartMarker[] = [];
    const now = this.parameters().find((p) => p.path === swept.parameter.path);
    if (now !== undefined) markers.push({ x: now.value, label: 'design' });
    const best = this.best();
    if (best !== null) markers.push({ x: best.value, label: 'best' });
    return markers;
  });

  private readonly values = computed(() => Float64Array.from(this.swept()?.rows ?? [], (row) => row.value));
  protected readonly resolutionAxis = computed(() => {
    if (this.resolutionUnit() === 'capacitance') return { label: 'Resolution [F]', unit: 'F', scale: 1 };
    return this.design().sensor.mode === 'pressure' ? { label: 'Resolution [Pa]', unit: 'Pa', scale: 1 } : { label: 'Resolution [L/s]', unit: 'L/s', scale: 1e3 };
  });
  protected readonly resolutionSeries = computed<LineSeries[]>(() => {
    const axis = this.resolutionAxis();
    const capacitance = this.resolutionUnit() === 'capacitance';
    const y = Float64Array.from(this.swept()?.rows ?? [], (row) => ((capacitance ? row.resolutionFarad : row.resolutionMeasurand) ?? Number.NaN) * axis.scale);
    return [{ name: 'resolution', x: this.values(), y }];
  });
  protected readonly headroomSeries = computed<LineSeries[]>(() => [
    { name: 'worst swing used', x: this.values(), y: Float64Array.from(this.swept()?.rows ?? [], (row) => (row.worstUsedFraction ?? Number.NaN) * 100) },
  ]);
  protected readonly rippleSeries = computed<LineSeries[]>(() => [
    { name: 'ripple', x: this.values(), y: Float64Array.from(this.swept()?.rows ?? [], (row) => row.ripple ?? Number.NaN) },
  ]);
  protected readonly fileStem = computed(() => `sweep-${this.swept()?.parameter.path ?? ''}`);

  /** The design's figures now, for comparison with the curves. */
  protected readonly now = computed(() => {
    const budget = this.budget();
    const worst = budget.levels.reduce((most, level) => Math.max(most, level.usedFraction ?? 0), 0);
    return {
      resolution: this.formatResolution(budget.mode === 'pressure' ? budget.resolution.pascal : budget.resolution.cubicMetrePerSecond, budget.resolution.farad),
      headroom: `${Math.round(worst * 100)} % of swing at ${budget.closestToClipping ?? 'no node'}`,
      ripple: formatQuantity(budget.ripple.outputPeak, 'voltage'),
    };
  });

  constructor() {
    // A new parameter starts from a range around its present value.
    this.form.controls.path.valueChanges.pipe(takeUntilDestroyed()).subscribe((path) => {
      const parameter = this.parameters().find((p) => p.path === path);
      if (parameter !== undefined) this.suggestRange(parameter);
    });
    // Keep a parameter picked while the design changes; pick one when there is none yet.
    effect(() => {
      const parameters = this.parameters();
      untracked(() => {
        if (parameters.some((p) => p.path === this.form.controls.path.value)) return;
        const preferred = parameters.find((p) => p.path === PREFERRED_PARAMETER) ?? parameters[0];
        if (preferred !== undefined) this.form.controls.path.setValue(preferred.path);
      });
    });
    this.destroyRef.onDestroy(() => this.running$?.unsubscribe());
  }

  protected formatValue(parameter: SweepParameter, value: number): string {
    return formatParameterValue(parameter, value);
  }

  protected formatResolution(measurand: number | null, farad: number | null): string {
    const parts: string[] = [];
    if (farad !== null) parts.push(formatQuantity(farad, 'capacitance'));
    if (measurand !== null) parts.push(formatQuantity(measurand, this.design().sensor.mode === 'pressure' ? 'pressure' : 'volumeFlow'));
    return parts.length === 0 ? '-' : parts.join(', ');
  }

  protected runSweep(): void {
    const request = this.request();
    const parameter = this.parameter();
    if (!request.ok || parameter === null || this.running()) return;
    this.running$?.unsubscribe();
    this.running.set(true);
    this.fraction.set(0);
    this.failure.set(null);
    this.applied.set(null);
    const scale = request.request.scale;
    this.running$ = this.runner.run(this.design(), request.request).subscribe({
      next: (event) => {
        if (event.kind === 'progress') this.fraction.set(event.fraction);
        else this.swept.set({ parameter, scale, rows: event.rows });
      },
      error: (error: unknown) => {
        this.running.set(false);
        this.failure.set(error instanceof Error ? error.message : 'The sweep failed');
      },
      complete: () => this.running.set(false),
    });
  }

  protected cancelSweep(): void {
    this.running$?.unsubscribe();
    this.running$ = null;
    this.running.set(false);
  }

  protected applyPoint(point: PickedPoint): void {
    const row = this.swept()?.rows[point.index];
    if (row !== undefined && row.error === null) this.applyRow(row);
  }

  protected applyBest(): void {
    const best = this.best();
    if (best !== null) this.applyRow(best);
  }

  private applyRow(row: SweepRow): void {
    const swept = this.swept();
    if (swept === null) return;
    this.apply.emit({ path: swept.parameter.path, value: row.value });
    this.applied.set(`${swept.parameter.label} set to ${formatParameterValue(swept.parameter, row.value)}`);
  }

  private readEnd(text: string): { ok: true; value: number } | { ok: false; message: string } {
    const parameter = this.parameter();
    if (parameter === null) return { ok: false, message: 'Pick a parameter first' };
    return parseParameterValue(parameter, text);
  }

  private suggestRange(parameter: SweepParameter): void {
    const value = parameter.value;
    let from: number;
    let to: number;
    let scale: 'linear' | 'log';
    let points = this.form.controls.points.value;
    if (parameter.integer) {
      from = Math.max(1, value - 3);
      to = value + 3;
      scale = 'linear';
      points = to - from + 1;
    } else if (value > 0) {
      from = value / 4;
      to = value * 4;
      scale = 'log';
    } else {
      from = value === 0 ? -1 : value * 2;
      to = value === 0 ? 1 : -value * 2;
      scale = 'linear';
    }
    this.form.patchValue({ from: formatParameterValue(parameter, from), to: formatParameterValue(parameter, to), scale, points });
  }
}
