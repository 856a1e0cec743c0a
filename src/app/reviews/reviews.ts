import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { MatButton } from '@angular/material/button';
import { MatButtonToggle, MatButtonToggleGroup } from '@angular/material/button-toggle';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSort, MatSortHeader, Sort } from '@angular/material/sort';
import {
  MatCell,
  MatCellDef,
  MatColumnDef,
  MatHeaderCell,
  MatHeaderCellDef,
  MatHeaderRow,
  MatHeaderRowDef,
  MatNoDataRow,
  MatRow,
  MatRowDef,
  MatTable,
} from '@angular/material/table';
import { RouterLink } from '@angular/router';
import type { Review } from '@shared/contracts/reviews-api';
import { problemFrom } from '../core/http/api-problem';
import { ReviewStateChip } from './review-state-chip';
import { ReviewsApi } from './reviews-api';

export type ReviewFilter = 'pending' | 'decided' | 'all';
type SortKey = 'design' | 'requestedBy' | 'createdAt' | 'state' | 'decidedAt';

const sortValue: Record<SortKey, (review: Review) => string> = {
  design: (r) => `${r.design.name.toLowerCase()}\u0000${String(r.versionNumber).padStart(6, '0')}`,
  requestedBy: (r) => r.requestedBy.displayName.toLowerCase(),
  createdAt: (r) => r.createdAt,
  state: (r) => r.state,
  decidedAt: (r) => r.decidedAt ?? '',
};

/** The review requests assigned to the signed-in user: pending ones to do, decided ones to look back at. */
@Component({
  selector: 'qb-reviews',
  imports: [
    DatePipe,
    MatButton,
    MatButtonToggle,
    MatButtonToggleGroup,
    MatCell,
    MatCellDef,
    MatColumnDef,
    MatHeaderCell,
    MatHeaderCellDef,
    MatHeaderRow,
    MatHeaderRowDef,
    MatNoDataRow,
    MatProgressBar,
    MatRow,
    MatRowDef,
    MatSort,
    MatSortHeader,
    MatTable,
    ReviewStateChip,
    RouterLink,
  ],
  templateUrl: './reviews.html',
  styleUrl: './reviews.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Reviews {
  private readonly api = inject(ReviewsApi);

  protected readonly columns = ['design', 'requestedBy', 'note', 'createdAt', 'state', 'decidedAt'];
  protected readonly filter = signal<ReviewFilter>('pending');
  protected readonly sort = signal<{ key: SortKey; order: 'asc' | 'desc' }>({ key: 'createdAt', order: 'desc' });

  protected readonly list = rxResource({ stream: () => this.api.assigned() });
  private readonly all = computed<Review[]>(() => (this.list.hasValue() ? this.list.value() : []));
  protected readonly counts = computed(() => {
    const pending = this.all().filter((review) => review.state === 'pending').length;
    return { pending, decided: this.all().length - pending, all: this.all().length };
  });
  protected readonly rows = computed<Review[]>(() => {
    const filter = this.filter();
    const { key, order } = this.sort();
    const value = sortValue[key];
    return this.all()
      .filter((review) => filter === 'all' || (filter === 'pending') === (review.state === 'pending'))
      .sort((a, b) => value(a).localeCompare(value(b)) * (order === 'asc' ? 1 : -1));
  });
  protected readonly loadError = computed(() => (this.list.error() ? problemFrom(this.list.error()).detail : null));

  protected sortBy(sort: Sort): void {
    const key = (sort.active in sortValue ? sort.active : 'createdAt') as SortKey;
    this.sort.set({ key, order: sort.direction === 'asc' ? 'asc' : 'desc' });
  }
}
