import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { DesignSummary } from '@shared/contracts/designs-api';
import type { Review } from '@shared/contracts/reviews-api';
import { ReviewStateChip } from './review-state-chip';

/** The latest review of each version (by request time), from a design's reviews. */
export function latestReviewByVersion(reviews: readonly Review[]): Map<number, Review> {
  const latest = new Map<number, Review>();
  for (const review of reviews) {
    const known = latest.get(review.versionNumber);
    if (known === undefined || review.createdAt > known.createdAt) latest.set(review.versionNumber, review);
  }
  return latest;
}

/** The state of a design's most recent review, as a chip with its version; nothing when no version was shared. */
@Component({
  selector: 'qb-design-review-state',
  imports: [ReviewStateChip],
  template: `
    @if (review(); as latest) {
      <qb-review-state-chip [state]="latest.state" [attr.title]="'Review of version ' + latest.versionNumber" />
      <span class="version">v{{ latest.versionNumber }}</span>
    }
  `,
  styles: `
    :host {
      display: inline-flex;
      align-items: center;
      gap: 4px;
    }
    .version {
      font: var(--mat-sys-label-small);
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DesignReviewState {
  /** The design's latest review as the designs list reports it (no request of its own per row). */
  readonly review = input.required<DesignSummary['latestReview']>();
}
