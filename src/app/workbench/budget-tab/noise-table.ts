import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import { MatSort, MatSortHeader, Sort } from '@angular/material/sort';
import {
  MatCell,
  MatCellDef,
  MatColumnDef,
  MatFooterCell,
  MatFooterCellDef,
  MatFooterRow,
  MatFooterRowDef,
  MatHeaderCell,
  MatHeaderCellDef,
  MatHeaderRow,
  MatHeaderRowDef,
  MatRow,
  MatRowDef,
  MatTable,
} from '@angular/material/table';
import type { Budget } from '@shared/contracts/figures';
import { formatQuantity } from '@shared/units/format';
import { BarChart } from '../../charts/bar-chart';
import { noiseRows, type NoiseRow } from './noise-rows';

type SortKey = 'source' | 'stage' | 'outputRms' | 'inputFarad' | 'inputMeasurand' | 'share';

/** The noise budget: every source carried to the output, referred to the input, and its share of the power. */
@Component({
  selector: 'qb-noise-table',
  imports: [
    BarChart,
    MatCell,
    MatCellDef,
    MatColumnDef,
    MatFooterCell,
    MatFooterCellDef,
    MatFooterRow,
    MatFooterRowDef,
    MatHeaderCell,
    MatHeaderCellDef,
    MatHeaderRow,
    MatHeaderRowDef,
    MatRow,
    MatRowDef,
    MatSort,
    MatSortHeader,
    MatTable,
  ],
  templateUrl: './noise-table.html',
  styleUrl: './noise-table.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NoiseTable {
  readonly budget = input.required<Budget>();
  readonly fileName = input('noise-budget');

  protected readonly columns = ['source', 'stage', 'outputRms', 'inputFarad', 'inputMeasurand', 'share'];
  protected readonly sort = signal<{ key: SortKey; direction: 'asc' | 'desc' }>({ key: 'share', direction: 'desc' });
  protected readonly flow = computed(() => this.budget().mode === 'flow');
  private readonly unsorted = computed(() => noiseRows(this.budget()));
  protected readonly rows = computed<NoiseRow[]>(() => {
    const { key, direction } = this.sort();
    const sign = direction === 'asc' ? 1 : -1;
    return this.unsorted()
      .slice()
      .sort((a, b) => {
        const x = a[key];
        const y = b[key];
        if (typeof x === 'string' && typeof y === 'string') return sign * x.localeCompare(y);
        return sign * ((x ?? -Infinity) > (y ?? -Infinity) ? 1 : (x ?? -Infinity) < (y ?? -Infinity) ? -1 : 0);
      });
  });
  protected readonly bars = computed(() =>
    this.unsorted().map((row) => ({ label: `${row.stage} · ${row.source}`, value: row.share * 100, detail: `${row.outputText} rms at the output` })),
  );
  protected readonly totalText = computed(() => {
    const noise = this.budget().noise;
    return `${formatQuantity(noise.outputRms, 'voltage')} rms, ${formatQuantity(noise.bandLow, 'frequency')} to ${formatQuantity(noise.bandHigh, 'frequency')}`;
  });
  protected readonly resolutionText = computed(() => {
    const resolution = this.budget().resolution;
    const measurand = this.flow() ? resolution.cubicMetrePerSecond : resolution.pascal;
    return {
      farad: resolution.farad === null ? 'undefined' : formatQuantity(resolution.farad, 'capacitance'),
      measurand: measurand === null ? 'undefined' : formatQuantity(measurand, this.flow() ? 'volumeFlow' : 'pressure'),
    };
  });
  protected readonly percentFormat = (value: number): string => `${value < 1 ? value.toFixed(2) : value.toFixed(1)} %`;

  protected sortBy(sort: Sort): void {
    const key = (this.columns.includes(sort.active) ? sort.active : 'share') as SortKey;
    this.sort.set({ key, direction: sort.direction === 'asc' ? 'asc' : 'desc' });
  }
}
