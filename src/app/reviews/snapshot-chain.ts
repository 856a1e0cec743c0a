import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatIconButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatTooltip } from '@angular/material/tooltip';
import type { Design } from '@shared/contracts/design';
import type { Budget } from '@shared/contracts/figures';
import { formatFieldValue, type FieldValue } from '@shared/engine/compare/compare-versions';
import { fieldUnit } from '@shared/engine/compare/field-units';
import { stageRegistry } from '@shared/engine/stages/registry';
import { ChainPicture } from '../workbench/chain-tab/chain-picture';
import { stageTitles, type StageKind } from '../workbench/stage-fields';
import { commentAnchors } from './comment-anchors';

interface SnapshotCard {
  stage: string;
  title: string;
  rows: { key: string; label: string; value: string }[];
}

function valueAt(source: unknown, key: string): FieldValue {
  return key.split('.').reduce<unknown>((value, part) => (typeof value === 'object' && value !== null ? (value as Record<string, unknown>)[part] : undefined), source) as FieldValue;
}

/** The shared snapshot's chain and sections, read-only, every value in display units; each field can take a comment. */
@Component({
  selector: 'qb-snapshot-chain',
  imports: [ChainPicture, MatIcon, MatIconButton, MatTooltip],
  template: `
    <qb-chain-picture [stages]="pictureStages()" [levels]="budget().levels" [excitationFrequency]="design().excitation.frequency" [highlight]="highlight()" (picked)="commentOn.emit({ stage: $event, field: null })" />
    <div class="cards">
      @for (card of cards(); track card.stage) {
        <section class="card" [class.highlight]="card.stage === highlight()" [attr.data-stage]="card.stage">
          <h4>{{ card.title }}</h4>
          <dl>
            @for (row of card.rows; track row.key) {
              <div class="row" [attr.data-field]="card.stage + '.' + row.key">
                <dt>{{ row.label }}</dt>
                <dd>{{ row.value }}</dd>
                <button mat-icon-button type="button" class="comment" (click)="commentOn.emit({ stage: card.stage, field: row.key })" [attr.aria-label]="'Comment on ' + card.stage + ' ' + row.label" matTooltip="Comment on this field">
                  <mat-icon>add_comment</mat-icon>
                </button>
              </div>
            }
          </dl>
        </section>
      }
    </div>
  `,
  styles: `
    :host {
      display: block;
    }
    .cards {
      display: grid;
      grid-template-columns: repeat(auto-fill, minmax(280px, 1fr));
      gap: 12px;
      margin-top: 16px;
    }
    .card {
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: 12px;
      padding: 8px 12px;
      &.highlight {
        border-color: var(--mat-sys-primary);
        box-shadow: 0 0 0 1px var(--mat-sys-primary);
      }
    }
    h4 {
      font: var(--mat-sys-title-small);
      margin: 0 0 4px;
    }
    dl {
      margin: 0;
    }
    .row {
      display: grid;
      grid-template-columns: 1fr auto 32px;
      align-items: center;
      gap: 8px;
      min-height: 32px;
      font: var(--mat-sys-body-small);
    }
    dt {
      color: var(--mat-sys-on-surface-variant);
    }
    dd {
      margin: 0;
      font-variant-numeric: tabular-nums;
      text-align: right;
    }
    .comment {
      --mat-icon-button-state-layer-size: 32px;
      width: 32px;
      height: 32px;
      padding: 4px;
      mat-icon {
        font-size: 18px;
        width: 18px;
        height: 18px;
      }
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SnapshotChain {
  readonly design = input.required<Design>();
  readonly budget = input.required<Budget>();
  readonly highlight = input<string | null>(null);
  readonly commentOn = output<{ stage: string; field: string | null }>();

  protected readonly pictureStages = computed(() => this.design().chain.map((stage) => ({ id: stage.id, kind: stage.kind as StageKind })));

  protected readonly cards = computed<SnapshotCard[]>(() => {
    const design = this.design();
    const mode = design.sensor.mode;
    return commentAnchors(design).map((anchor) => {
      const stage = design.chain.find((candidate) => candidate.id === anchor.stage);
      const source = stage ?? design[anchor.stage as 'sensor' | 'excitation' | 'environment' | 'analysis'];
      const where = stage === undefined ? { section: anchor.stage } : { stageKind: stage.kind };
      return {
        stage: anchor.stage,
        title: stage === undefined ? anchor.label : `${stage.id} · ${stageTitles[stage.kind as StageKind] ?? stage.kind}`,
        rows: anchor.fields.map((field) => ({
          key: field.key,
          label: field.label,
          value: formatFieldValue(valueAt(source, field.key), fieldUnit(stageRegistry, where, field.key.split('.'), mode).units),
        })),
      };
    });
  });
}
