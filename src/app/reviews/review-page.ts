import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal, viewChild } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { MatAnchor } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatTab, MatTabContent, MatTabGroup } from '@angular/material/tabs';
import { RouterLink } from '@angular/router';
import type { Finding } from '@shared/contracts/findings';
import type { Review, ReviewDetail } from '@shared/contracts/reviews-api';
import { analyseDesign } from '@shared/engine/analyse';
import { catchError, map, of, switchMap, type Observable } from 'rxjs';
import { AuthService } from '../core/auth/auth-service';
import { problemFrom } from '../core/http/api-problem';
import { CompareView } from '../compare/compare-view';
import { DesignsApi } from '../designs/designs-api';
import { BudgetTab } from '../workbench/budget-tab/budget-tab';
import { LevelsTab } from '../workbench/levels-tab/levels-tab';
import { SimulationSession } from '../workbench/simulation-tab/simulation-session';
import { SimulationTab } from '../workbench/simulation-tab/simulation-tab';
import { SpectraTab } from '../workbench/spectra-tab/spectra-tab';
import { commentAnchors } from './comment-anchors';
import { CommentThread } from './comment-thread';
import { ReviewDecision } from './review-decision';
import { ReviewStateChip } from './review-state-chip';
import { reportUrl, ReviewsApi } from './reviews-api';
import { SnapshotChain } from './snapshot-chain';

const CHAIN_TAB = 0;

/** The earlier version's document, or why it cannot be shown to this user. */
type PreviousVersion = { number: number; document: Record<string, unknown> } | { number: number; unavailable: string };

/**
 * One review: the shared snapshot read-only with every figure and plot recomputed from its document,
 * the comparison against the previously reviewed version, the comment threads and the decision.
 */
@Component({
  selector: 'qb-review-page',
  imports: [
    BudgetTab,
    CommentThread,
    CompareView,
    DatePipe,
    LevelsTab,
    MatAnchor,
    MatIcon,
    MatProgressBar,
    MatTab,
    MatTabContent,
    MatTabGroup,
    ReviewDecision,
    ReviewStateChip,
    RouterLink,
    SimulationTab,
    SnapshotChain,
    SpectraTab,
  ],
  templateUrl: './review-page.html',
  styleUrl: './review-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  providers: [SimulationSession],
})
export class ReviewPage {
  private readonly api = inject(ReviewsApi);
  private readonly designs = inject(DesignsApi);
  private readonly me = inject(AuthService).currentUser;
  private readonly thread = viewChild(CommentThread);

  /** The review id, from the route. */
  readonly id = input.required<string>();

  protected readonly detail = rxResource({ params: () => this.id(), stream: ({ params }) => this.api.get(params) });
  /** The review as it stands; a decision made on this page replaces the loaded one. */
  private readonly decidedReview = signal<Review | null>(null);
  protected readonly review = computed(() => {
    const decided = this.decidedReview();
    if (decided !== null && decided.id === this.id()) return decided;
    return this.detail.hasValue() ? this.detail.value().review : null;
  });
  protected readonly comments = computed(() => (this.detail.hasValue() ? this.detail.value().comments : []));
  protected readonly snapshotDocument = computed(() => (this.detail.hasValue() ? this.detail.value().version.document : null));
  protected readonly analysis = computed(() => (this.detail.hasValue() ? analyseDesign(this.detail.value().version.document) : null));
  protected readonly design = computed(() => {
    const analysis = this.analysis();
    return analysis?.ok ? analysis.design : null;
  });
  protected readonly budget = computed(() => {
    const analysis = this.analysis();
    return analysis?.ok ? analysis.budget : null;
  });
  protected readonly snapshotErrors = computed(() => {
    const analysis = this.analysis();
    return analysis !== null && !analysis.ok ? analysis.errors : [];
  });
  protected readonly anchors = computed(() => {
    const design = this.design();
    return design === null ? [] : commentAnchors(design);
  });
  protected readonly isReviewer = computed(() => {
    const review = this.review();
    return review !== null && review.reviewer !== null && review.reviewer.id === this.me()?.id;
  });
  protected readonly reportLink = computed(() => {
    const review = this.review();
    return review === null ? null : reportUrl(review.design.id, review.versionNumber);
  });
  protected readonly loadError = computed(() => (this.detail.error() ? problemFrom(this.detail.error()).detail : null));
  protected readonly fileName = computed(() => {
    const review = this.review();
    return review === null ? 'design' : `${review.design.name.replace(/[^A-Za-z0-9]+/g, '-').toLowerCase()}-v${review.versionNumber}`;
  });

  protected readonly previous = rxResource({
    params: () => (this.detail.hasValue() ? this.detail.value() : undefined),
    stream: ({ params }) => this.previousVersion(params),
  });

  protected readonly selectedTab = signal(CHAIN_TAB);
  protected readonly highlight = signal<string | null>(null);

  protected recordDecision(review: Review): void {
    this.decidedReview.set(review);
  }

  /** A field picked in the snapshot: the new comment is anchored to it. */
  protected commentOn(anchor: { stage: string; field: string | null }): void {
    this.highlight.set(anchor.stage);
    this.thread()?.anchorTo(anchor.stage, anchor.field);
  }

  /** A comment's anchor picked: the snapshot shows that stage. */
  protected showAnchor(anchor: { stage: string; field: string | null }): void {
    this.selectedTab.set(CHAIN_TAB);
    this.highlight.set(anchor.stage);
  }

  protected showFinding(finding: Finding): void {
    this.showAnchor({ stage: finding.stage, field: finding.field });
  }

  /**
   * The previously reviewed version: through the reviewer's own review of it when there is one,
   * else through the design (owner and admins); a reviewer who was not shared it is told so.
   */
  private previousVersion(detail: ReviewDetail | undefined): Observable<PreviousVersion | null> {
    const number = detail?.previousReviewedVersion ?? null;
    if (detail === undefined || number === null) return of(null);
    const designId = detail.review.design.id;
    const unavailable: PreviousVersion = { number, unavailable: `Version ${number} was reviewed by someone else and is not shared with you.` };
    const throughDesign = () =>
      this.designs.version(designId, number).pipe(
        map((version): PreviousVersion => ({ number, document: version.document })),
        catchError(() => of(unavailable)),
      );
    return this.api.assigned().pipe(
      switchMap((reviews) => {
        const own = reviews.find((review) => review.design.id === designId && review.versionNumber === number);
        return own === undefined ? throughDesign() : this.api.get(own.id).pipe(map((earlier): PreviousVersion => ({ number, document: earlier.version.document })));
      }),
      catchError(() => throughDesign()),
    );
  }
}
