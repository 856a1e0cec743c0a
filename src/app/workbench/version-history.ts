import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatIconButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatTooltip } from '@angular/material/tooltip';
import { RouterLink } from '@angular/router';
import type { VersionSummary } from '@shared/contracts/designs-api';
import type { Review } from '@shared/contracts/reviews-api';
import { resolutionText } from '../designs/key-figures';
import { ReviewStateChip } from '../reviews/review-state-chip';

/** The saved versions of a design, newest first, each to load into the forms or to export. */
@Component({
  selector: 'qb-version-history',
  imports: [DatePipe, MatIcon, MatIconButton, MatTooltip, ReviewStateChip, RouterLink],
  template: `
    <h2 class="title">History</h2>
    <ol class="versions" data-testid="history">
      @for (version of versions(); track version.number) {
        <li class="version" [class.edited]="version.number === editedVersion()" [attr.data-testid]="'version-' + version.number">
          <div class="head">
            <span class="number">v{{ version.number }}</span>
            @if (version.number === editedVersion()) {
              <span class="tag">editing</span>
            }
            @if (reviews().get(version.number); as review) {
              <qb-review-state-chip [state]="review.state" [attr.data-testid]="'review-state-' + version.number" />
            }
            <span class="spacer"></span>
            @if (designId() && version.number > 1) {
              <a mat-icon-button [routerLink]="['/designs', designId(), 'compare']" [queryParams]="{ from: version.number - 1, to: version.number }" [attr.aria-label]="'Compare version ' + version.number + ' with ' + (version.number - 1)" matTooltip="Compare with the version before">
                <mat-icon>compare_arrows</mat-icon>
              </a>
            }
            <button mat-icon-button (click)="load.emit(version.number)" [disabled]="version.number === editedVersion() && !dirty()" [attr.aria-label]="'Load version ' + version.number" matTooltip="Load into the forms">
              <mat-icon>restore_page</mat-icon>
            </button>
            <button mat-icon-button (click)="export.emit(version.number)" [attr.aria-label]="'Export version ' + version.number + ' as JSON'" matTooltip="Export as JSON">
              <mat-icon>download</mat-icon>
            </button>
          </div>
          <div class="message">{{ version.message }}</div>
          <div class="meta">{{ version.author.displayName }} · {{ version.createdAt | date: 'yyyy-MM-dd HH:mm' }}</div>
          <div class="meta">{{ resolutionText(version.figures) }}</div>
        </li>
      } @empty {
        <li class="meta">No versions.</li>
      }
    </ol>
  `,
  styleUrl: './version-history.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class VersionHistory {
  readonly versions = input.required<readonly VersionSummary[]>();
  readonly editedVersion = input<number | null>(null);
  readonly dirty = input(false);
  /** For the compare links; none without it. */
  readonly designId = input<string | null>(null);
  /** The latest review of each version, for its state chip. */
  readonly reviews = input<ReadonlyMap<number, Review>>(new Map());
  readonly load = output<number>();
  readonly export = output<number>();

  protected readonly resolutionText = resolutionText;
}
