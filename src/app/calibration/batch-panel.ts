import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatCheckbox } from '@angular/material/checkbox';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatOption, MatSelect } from '@angular/material/select';
import type { Dataset } from '@shared/contracts/calibration';
import { evaluateBatch, sweepBatchSize, type BatchEvaluation, type BatchSizeRow, type TrimMode } from '@shared/engine/calibration/batch';
import { BarChart } from '../charts/bar-chart';
import type { BarDatum } from '../charts/chart-types';
import { displayUnits, enginePoints, figure } from './display-units';

const trimNames: Record<TrimMode, string> = { none: 'no trim', offset: 'one-point offset trim', 'gain-offset': 'two-point gain and offset trim' };

/** Can the batch share one calibration curve? Reference cells, trim, target; per-cell verdicts and k against pass share. */
@Component({
  selector: 'qb-batch-panel',
  imports: [FormsModule, MatButton, MatCheckbox, MatFormField, MatLabel, MatInput, MatSelect, MatOption, BarChart],
  templateUrl: './batch-panel.html',
  styleUrl: './calibration-panels.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BatchPanel {
  readonly dataset = input.required<Dataset>();

  protected readonly figure = figure;
  protected readonly trimModes = Object.entries(trimNames) as [TrimMode, string][];
  protected readonly degrees = [1, 2, 3, 4, 5];
  protected readonly referenceCells = signal<ReadonlySet<string>>(new Set());
  protected readonly degree = signal(2);
  protected readonly trim = signal<TrimMode>('gain-offset');
  protected readonly target = signal(0.5);
  protected readonly evaluation = signal<BatchEvaluation | null>(null);
  protected readonly sweep = signal<BatchSizeRow[] | null>(null);
  protected readonly problem = signal<string | null>(null);

  protected readonly units = computed(() => displayUnits(this.dataset()));
  private readonly points = computed(() => enginePoints(this.dataset()));
  protected readonly sweepBars = computed((): BarDatum[] =>
    (this.sweep() ?? []).map((row) => ({
      label: `k = ${row.k}`,
      value: 100 * row.meanPassShare,
      detail: `${row.sets} reference sets; worst ${figure(100 * row.worstPassShare, 3)} %, best ${figure(100 * row.bestPassShare, 3)} %`,
    })),
  );
  protected readonly trimName = computed(() => trimNames[this.trim()]);

  protected toggleCell(cell: string, chosen: boolean): void {
    this.referenceCells.update((cells) => {
      const next = new Set(cells);
      if (chosen) next.add(cell);
      else next.delete(cell);
      return next;
    });
  }

  private options() {
    return { degree: this.degree(), trim: this.trim(), targetPercentFullScale: this.target() };
  }

  protected evaluate(): void {
    this.run(() => this.evaluation.set(evaluateBatch(this.points(), [...this.referenceCells()], this.options())));
  }

  protected tryEveryK(): void {
    this.run(() => this.sweep.set(sweepBatchSize(this.points(), this.options())));
  }

  private run(work: () => void): void {
    this.problem.set(null);
    try {
      work();
    } catch (error) {
      this.problem.set(error instanceof Error ? error.message : String(error));
    }
  }
}
