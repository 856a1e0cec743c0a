import { ChangeDetectionStrategy, Component, DestroyRef, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogActions, MatDialogClose, MatDialogContent, MatDialogTitle } from '@angular/material/dialog';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import type { Review } from '@shared/contracts/reviews-api';
import { applyFieldErrors } from '../core/forms/apply-field-errors';
import { problemFrom } from '../core/http/api-problem';
import { catchError, EMPTY, map, switchMap, takeWhile, timer } from 'rxjs';
import { ReviewsApi } from './reviews-api';

/** While the e-mail is pending, the dialog asks again this often, for at most MAIL_WATCH_TIMES times. */
export const MAIL_WATCH_MS = 2000;
export const MAIL_WATCH_TIMES = 30;

export interface ShareRequest {
  designId: string;
  designName: string;
  versionNumber: number;
}

/** Shares one version with a reviewer by e-mail; afterwards says whether the message has gone out or waits for the mail server. */
@Component({
  selector: 'qb-share-dialog',
  imports: [MatButton, MatDialogActions, MatDialogClose, MatDialogContent, MatDialogTitle, MatError, MatFormField, MatHint, MatIcon, MatInput, MatLabel, MatProgressBar, ReactiveFormsModule],
  template: `
    <h2 mat-dialog-title>Share version {{ data.versionNumber }} for review</h2>
    @if (shared(); as review) {
      <mat-dialog-content>
        <p class="result" data-testid="share-result">
          <mat-icon>{{ review.notification === 'sent' ? 'check_circle' : 'schedule' }}</mat-icon>
          <span>
            Version {{ review.versionNumber }} of {{ review.design.name }} is shared with {{ review.reviewerEmail }}.
            @if (review.notification === 'sent') {
              The e-mail has been sent.
            } @else {
              The e-mail is pending: it goes out as soon as the mail server takes it, and nothing is lost meanwhile.
              <span class="watching" data-testid="mail-watching">This message updates when it has gone out.</span>
            }
          </span>
        </p>
        @if (review.reviewer === null) {
          <p class="lead">No account has this address yet: the message holds a one-time link to create a reviewer account, valid for 7 days.</p>
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-flat-button type="button" [mat-dialog-close]="review" data-testid="share-done">Done</button>
      </mat-dialog-actions>
    } @else {
      <form [formGroup]="form" (ngSubmit)="share()" novalidate>
        @if (sending()) {
          <mat-progress-bar mode="indeterminate" />
        }
        <mat-dialog-content>
          <p class="lead">The reviewer sees this snapshot of {{ data.designName }} read-only, recomputes every figure, comments and signs off. You are told by e-mail.</p>
          @if (failure(); as message) {
            <p class="alert" role="alert" data-testid="share-failure">{{ message }}</p>
          }
          <mat-form-field appearance="outline" class="wide">
            <mat-label>Reviewer e-mail</mat-label>
            <input matInput formControlName="reviewerEmail" type="email" autocomplete="email" cdkFocusInitial required data-testid="reviewer-email" />
            <mat-hint>A colleague with an account, or a new address that gets an invitation.</mat-hint>
            @if (form.controls.reviewerEmail.hasError('required')) {
              <mat-error>Enter the reviewer's e-mail address.</mat-error>
            } @else if (form.controls.reviewerEmail.hasError('email')) {
              <mat-error>Enter an address like name&#64;example.com.</mat-error>
            } @else if (form.controls.reviewerEmail.hasError('server')) {
              <mat-error>{{ form.controls.reviewerEmail.getError('server') }}</mat-error>
            }
          </mat-form-field>
          <mat-form-field appearance="outline" class="wide">
            <mat-label>Note to the reviewer</mat-label>
            <textarea matInput formControlName="note" rows="3" data-testid="share-note"></textarea>
            <mat-hint>What to look at, what changed since the last review.</mat-hint>
            @if (form.controls.note.hasError('maxlength')) {
              <mat-error>A note holds at most 4000 characters.</mat-error>
            } @else if (form.controls.note.hasError('server')) {
              <mat-error>{{ form.controls.note.getError('server') }}</mat-error>
            }
          </mat-form-field>
        </mat-dialog-content>
        <mat-dialog-actions align="end">
          <button mat-button type="button" mat-dialog-close>Cancel</button>
          <button mat-flat-button type="submit" [disabled]="sending()" data-testid="confirm-share">Share</button>
        </mat-dialog-actions>
      </form>
    }
  `,
  styles: `
    .lead {
      margin-top: 0;
      color: var(--mat-sys-on-surface-variant);
    }
    .wide {
      width: 100%;
      margin-bottom: 8px;
    }
    .result {
      display: flex;
      gap: 12px;
      align-items: flex-start;
    }
    .result mat-icon {
      flex: none;
    }
    .watching {
      display: block;
      margin-top: 4px;
      color: var(--mat-sys-on-surface-variant);
    }
    .alert {
      padding: 8px 12px;
      border-radius: 8px;
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ShareDialog {
  protected readonly data = inject<ShareRequest>(MAT_DIALOG_DATA);
  private readonly api = inject(ReviewsApi);
  private readonly destroyRef = inject(DestroyRef);

  protected readonly form = new FormGroup({
    reviewerEmail: new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.email] }),
    note: new FormControl('', { nonNullable: true, validators: [Validators.maxLength(4000)] }),
  });
  protected readonly sending = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly shared = signal<Review | null>(null);

  protected share(): void {
    if (this.form.invalid || this.sending()) {
      this.form.markAllAsTouched();
      return;
    }
    this.failure.set(null);
    this.sending.set(true);
    const { reviewerEmail, note } = this.form.getRawValue();
    this.api.share(this.data.designId, this.data.versionNumber, { reviewerEmail: reviewerEmail.trim(), note }).subscribe({
      next: (review) => {
        this.sending.set(false);
        this.shared.set(review);
        if (review.notification === 'pending') this.watchMail(review);
      },
      error: (error: unknown) => {
        this.sending.set(false);
        const problem = problemFrom(error);
        const unmatched = applyFieldErrors(this.form, problem.errors);
        this.failure.set(problem.errors.length > 0 && unmatched.length === 0 ? null : problem.detail);
      },
    });
  }

  /** Asks for the review again until the outbox has sent its e-mail (or for a minute at most). */
  private watchMail(review: Review): void {
    timer(MAIL_WATCH_MS, MAIL_WATCH_MS)
      .pipe(
        takeWhile((turn) => turn < MAIL_WATCH_TIMES),
        switchMap(() => this.api.ofDesign(review.design.id).pipe(catchError(() => EMPTY))),
        map((reviews) => reviews.find((candidate) => candidate.id === review.id)),
        takeWhile((latest) => latest?.notification !== 'sent', true),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe((latest) => {
        if (latest) this.shared.set(latest);
      });
  }
}
