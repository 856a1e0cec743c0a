import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIcon } from '@angular/material/icon';
import type { FieldChange, FigureDirection } from '@shared/engine/compare/compare-versions';
import { compareVersions } from '@shared/engine/compare/compare-versions';

const directionIcons: Record<FigureDirection, string> = { better: 'trending_up', worse: 'trending_down', same: 'drag_handle', changed: 'swap_horiz' };
const directionWords: Record<FigureDirection, string> = { better: 'better', worse: 'worse', same: 'unchanged', changed: 'changed' };
const stageWords = { added: 'added', removed: 'removed', moved: 'moved' } as const;

/** Where a changed field sits, as a reader scans for it: "lp · corner", "sensor · cellA.baseCapacitance". */
function placeOf(change: FieldChange): string {
  return change.stage === null ? change.field : `${change.stage} · ${change.field}`;
}

/**
 * Two design documents side by side: the key figures with the direction of each change, the fields
 * that differ in display units, the stages added, removed or moved, and the findings added or gone.
 */
@Component({
  selector: 'qb-compare-view',
  imports: [MatIcon],
  templateUrl: './compare-view.html',
  styleUrl: './compare-view.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CompareView {
  readonly older = input.required<unknown>();
  readonly newer = input.required<unknown>();
  readonly olderLabel = input('Older');
  readonly newerLabel = input('Newer');

  protected readonly comparison = computed(() => compareVersions(this.older(), this.newer()));
  protected readonly fields = computed(() => this.comparison().fields.map((change) => ({ ...change, place: placeOf(change) })));
  protected readonly changedFigures = computed(() => this.comparison().figures.filter((figure) => figure.direction !== 'same').length);
  protected readonly directionIcons = directionIcons;
  protected readonly directionWords = directionWords;
  protected readonly stageWords = stageWords;
}
