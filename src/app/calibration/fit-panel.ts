import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatCheckbox } from '@angular/material/checkbox';
import { MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatOption, MatSelect } from '@angular/material/select';
import type { Dataset } from '@shared/contracts/calibration';
import { analyseCell, type CellAnalysis } from '@shared/engine/calibration/cell-analysis';
import { compareDegrees } from '@shared/engine/calibration/degree-comparison';
import { fitToCHeader, fitToCsv, fitToJson, type FitExport } from '@shared/engine/calibration/export';
import type { FitDirection } from '@shared/engine/calibration/points';
import { evaluateFit } from '@shared/engine/fit/polynomial-fit';
import { LineChart } from '../charts/line-chart';
import type { LineSeries } from '../charts/chart-types';
import { safeFileName, saveFile } from '../charts/chart-export';
import { displayUnits, enginePoints, figure } from './display-units';

const CURVE_POINTS = 121;

/** One cell's fit in the chosen direction and degree, its %FS figures, plots and exports. */
@Component({
  selector: 'qb-fit-panel',
  imports: [FormsModule, MatButton, MatCheckbox, MatFormField, MatLabel, MatHint, MatInput, MatSelect, MatOption, LineChart],
  templateUrl: './fit-panel.html',
  styleUrl: './calibration-panels.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class FitPanel {
  readonly dataset = input.required<Dataset>();
  readonly designName = input('');

  protected readonly degrees = [1, 2, 3, 4, 5];
  protected readonly figure = figure;
  protected readonly chosenCell = signal<string | null>(null);
  protected readonly direction = signal<FitDirection>('calibration');
  protected readonly degree = signal(2);
  protected readonly throughOrigin = signal(false);
  /** Readout noise in the dataset's readout unit; empty: the measured spread. */
  protected readonly noiseText = signal('');
  protected readonly target = signal(0.5);

  protected readonly units = computed(() => displayUnits(this.dataset()));
  protected readonly cell = computed(() => this.chosenCell() ?? this.dataset().cells[0] ?? '');
  private readonly points = computed(() => enginePoints(this.dataset(), new Set([this.cell()])));
  private readonly noiseRms = computed(() => {
    const value = Number(this.noiseText().trim());
    return this.noiseText().trim() === '' || !Number.isFinite(value) || value < 0 ? undefined : value * this.units().readoutScale;
  });

  protected readonly result = computed((): { analysis: CellAnalysis } | { problem: string } => {
    try {
      return {
        analysis: analyseCell(this.points(), { direction: this.direction(), degree: this.degree(), throughOrigin: this.throughOrigin(), noiseRms: this.noiseRms() }),
      };
    } catch (error) {
      return { problem: error instanceof Error ? error.message : String(error) };
    }
  });
  protected readonly analysis = computed(() => {
    const result = this.result();
    return 'analysis' in result ? result.analysis : null;
  });
  protected readonly problem = computed(() => {
    const result = this.result();
    return 'problem' in result ? result.problem : null;
  });

  /** Units of the fit's x and y, SI, as the coefficients use them. */
  protected readonly fitUnits = computed(() => {
    const { units } = this.dataset();
    return this.direction() === 'characteristic' ? { x: units.reference, y: units.readout } : { x: units.readout, y: units.reference };
  });
  protected readonly comparison = computed(() => {
    try {
      return compareDegrees(this.points(), { direction: this.direction(), throughOrigin: this.throughOrigin() });
    } catch {
      return [];
    }
  });

  protected readonly characteristicSeries = computed((): LineSeries[] => {
    const analysis = this.analysis();
    const { referenceScale, readoutScale } = this.units();
    const runs = new Map<string, { x: number[]; y: number[] }>();
    for (const point of [...this.points()].sort((a, b) => a.reference - b.reference)) {
      const key = `run ${point.run} ${point.direction}`;
      const entry = runs.get(key) ?? { x: [], y: [] };
      entry.x.push(point.reference / referenceScale);
      entry.y.push(point.readout / readoutScale);
      runs.set(key, entry);
    }
    const series: LineSeries[] = [...runs].map(([name, values]) => ({ name, ...values }));
    if (analysis) {
      const { fit } = analysis;
      const xs = Array.from({ length: CURVE_POINTS }, (_, i) => fit.xMin + ((fit.xMax - fit.xMin) * i) / (CURVE_POINTS - 1));
      const curve =
        this.direction() === 'characteristic'
          ? { x: xs.map((x) => x / referenceScale), y: xs.map((x) => evaluateFit(fit, x) / readoutScale) }
          : { x: xs.map((x) => evaluateFit(fit, x) / referenceScale), y: xs.map((x) => x / readoutScale) };
      series.push({ name: `fitted ${analysis.nonlinearity[0].against}`, ...curve });
    }
    return series;
  });

  protected readonly residualSeries = computed((): LineSeries[] => {
    const analysis = this.analysis();
    if (!analysis) return [];
    const { referenceScale } = this.units();
    const points = this.points();
    const groups = new Map<string, { x: number[]; y: number[] }>();
    points
      .map((point, index) => ({ point, residual: (100 * analysis.fit.residuals[index]) / analysis.fullScale }))
      .sort((a, b) => a.point.reference - b.point.reference)
      .forEach(({ point, residual }) => {
        const key = `run ${point.run} ${point.direction}`;
        const entry = groups.get(key) ?? { x: [], y: [] };
        entry.x.push(point.reference / referenceScale);
        entry.y.push(residual);
        groups.set(key, entry);
      });
    const span = [analysis.setpoints[0].reference / referenceScale, analysis.setpoints[analysis.setpoints.length - 1].reference / referenceScale];
    return [
      ...[...groups].map(([name, values]) => ({ name, ...values })),
      { name: `+${this.target()} %FS target`, x: span, y: [this.target(), this.target()] },
      { name: `-${this.target()} %FS target`, x: span, y: [-this.target(), -this.target()] },
    ];
  });

  /** Up and down mean readouts at each set point, less the fitted characteristic: the hysteresis loop in %FS. */
  protected readonly loopSeries = computed((): LineSeries[] => {
    let characteristic: CellAnalysis;
    try {
      characteristic = analyseCell(this.points(), { direction: 'characteristic', degree: this.degree(), throughOrigin: this.throughOrigin() });
    } catch {
      return [];
    }
    const { referenceScale } = this.units();
    const traverse = (direction: 'up' | 'down'): LineSeries => {
      const x: number[] = [];
      const y: number[] = [];
      for (const setpoint of characteristic.setpoints) {
        const readouts = [...setpoint.byRun.values()].filter((entry) => entry.direction === direction).flatMap((entry) => entry.readouts);
        if (readouts.length === 0) continue;
        const meanReadout = readouts.reduce((sum, value) => sum + value, 0) / readouts.length;
        x.push(setpoint.reference / referenceScale);
        y.push((100 * (meanReadout - evaluateFit(characteristic.fit, setpoint.reference))) / characteristic.readoutSpan);
      }
      return { name: `${direction}scale`, x, y };
    };
    return [traverse('up'), traverse('down')];
  });

  protected chooseCell(cell: string): void {
    this.chosenCell.set(cell);
  }

  protected exportFit(format: 'json' | 'csv' | 'h'): void {
    const analysis = this.analysis();
    if (!analysis) return;
    const data: FitExport = {
      design: this.designName(),
      dataset: this.dataset().name,
      cells: [this.cell()],
      direction: this.direction(),
      xUnit: this.fitUnits().x,
      yUnit: this.fitUnits().y,
      fit: analysis.fit,
      createdAt: new Date().toISOString(),
    };
    const base = safeFileName(`${this.dataset().name}-${this.cell()}-${this.direction()}-degree-${this.degree()}`);
    const text = format === 'json' ? fitToJson(data) : format === 'csv' ? fitToCsv(data) : fitToCHeader(data);
    const type = format === 'json' ? 'application/json' : format === 'csv' ? 'text/csv' : 'text/x-c';
    saveFile(new Blob([text], { type }), `${base}.${format}`);
  }
}
