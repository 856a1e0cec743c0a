import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import type { Review } from '@shared/contracts/reviews-api';
import { catchError, of } from 'rxjs';
import { ReviewStateChip } from './review-state-chip';
import { ReviewsApi } from './reviews-api';

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
    @if (latest(); as review) {
      <qb-review-state-chip [state]="review.state" [attr.title]="'Review of version ' + review.versionNumber" />
      <span class="version">v{{ review.versionNumber }}</span>
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
  private readonly api = inject(ReviewsApi);

  readonly designId = input.required<string>();

  // A design the user may not list the reviews of shows no chip rather than an error in a table cell.
  private readonly reviews = rxResource({ params: () => this.designId(), stream: ({ params }) => this.api.ofDesign(params).pipe(catchError(() => of([]))) });
  protected readonly latest = computed(() => {
    const reviews = this.reviews.hasValue() ? this.reviews.value() : [];
    return reviews.reduce<Review | null>((newest, review) => (newest === null || review.createdAt > newest.createdAt ? review : newest), null);
  });
}
