import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIcon } from '@angular/material/icon';
import type { ReviewState } from '@shared/contracts/reviews-api';

const looks: Record<ReviewState, { text: string; icon: string }> = {
  pending: { text: 'In review', icon: 'hourglass_top' },
  approved: { text: 'Approved', icon: 'verified' },
  changes_requested: { text: 'Changes requested', icon: 'edit_note' },
};

/** The state of a review as a small chip: in review, approved, changes requested. */
@Component({
  selector: 'qb-review-state-chip',
  imports: [MatIcon],
  template: `<mat-icon aria-hidden="true">{{ look().icon }}</mat-icon><span>{{ look().text }}</span>`,
  styles: `
    :host {
      display: inline-flex;
      align-items: center;
      gap: 4px;
      padding: 1px 8px 1px 6px;
      border-radius: 8px;
      font: var(--mat-sys-label-medium);
      white-space: nowrap;
      background: var(--mat-sys-secondary-container);
      color: var(--mat-sys-on-secondary-container);
    }
    :host(.approved) {
      background: var(--mat-sys-primary-container);
      color: var(--mat-sys-on-primary-container);
    }
    :host(.changes_requested) {
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
    mat-icon {
      font-size: 16px;
      width: 16px;
      height: 16px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '[class]': 'state()', '[attr.data-state]': 'state()' },
})
export class ReviewStateChip {
  readonly state = input.required<ReviewState>();

  protected readonly look = computed(() => looks[this.state()]);
}
