import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import {
  MatCell,
  MatCellDef,
  MatColumnDef,
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
import { LevelDiagram } from '../../charts/level-diagram';

interface LevelRow {
  node: string;
  kind: string;
  domain: string;
  peak: string;
  centre: string;
  swing: string;
  used: string;
  state: 'ok' | 'warn' | 'clip' | 'passive';
}

/** Peak against swing at every node, the node closest to clipping named. */
@Component({
  selector: 'qb-levels-tab',
  imports: [LevelDiagram, MatCell, MatCellDef, MatColumnDef, MatHeaderCell, MatHeaderCellDef, MatHeaderRow, MatHeaderRowDef, MatRow, MatRowDef, MatTable],
  templateUrl: './levels-tab.html',
  styleUrl: './levels-tab.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LevelsTab {
  readonly budget = input.required<Budget>();
  readonly highlight = input<string | null>(null);
  readonly fileName = input('design');
  readonly nodePicked = output<string>();

  protected readonly columns = ['node', 'domain', 'peak', 'centre', 'swing', 'used'];

  protected readonly closest = computed(() => {
    const b = this.budget();
    const level = b.levels.find((candidate) => candidate.node === b.closestToClipping);
    if (level === undefined || level.usedFraction === null) return null;
    return { node: level.node, percent: Math.round(level.usedFraction * 100), clips: level.usedFraction > 1 };
  });

  protected readonly rows = computed<LevelRow[]>(() =>
    this.budget().levels.map((level) => {
      const used = level.usedFraction;
      return {
        node: level.node,
        kind: level.kind,
        domain: level.domain,
        peak: formatQuantity(level.peak, 'voltage'),
        centre: formatQuantity(level.centre, 'voltage'),
        swing: level.swingLow === null || level.swingHigh === null ? 'passive' : `${formatQuantity(level.swingLow, 'voltage')} to ${formatQuantity(level.swingHigh, 'voltage')}`,
        used: used === null ? '–' : `${(used * 100).toFixed(1)} %`,
        state: used === null ? 'passive' : used > 1 ? 'clip' : used >= 0.8 ? 'warn' : 'ok',
      };
    }),
  );
}
