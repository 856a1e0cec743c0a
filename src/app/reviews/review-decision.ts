import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, input, output, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatButtonToggle, MatButtonToggleGroup } from '@angular/material/button-toggle';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import type { Review } from '@shared/contracts/reviews-api';
import { applyFieldErrors } from '../core/forms/apply-field-errors';
import { problemFrom } from '../core/http/api-problem';
import { ReviewStateChip } from './review-state-chip';
import { ReviewsApi } from './reviews-api';

type DecisionValue = 'approved' | 'changes_requested';

/** The reviewer's sign-off: approve or request changes, with a note; once decided, the decision as it stands. */
@Component({
  selector: 'qb-review-decision',
  imports: [DatePipe, MatButton, MatButtonToggle, MatButtonToggleGroup, MatError, MatFormField, MatHint, MatIcon, MatInput, MatLabel, ReactiveFormsModule, ReviewStateChip],
  template: `
    <h3>Decision</h3>
    @if (review().state !== 'pending') {
      <div class="decided" data-testid="decision-shown">
        <qb-review-state-chip [state]="review().state" />
        <span class="meta">by {{ review().reviewer?.displayName ?? review().reviewerEmail }} · {{ review().decidedAt | date: 'yyyy-MM-dd HH:mm' }}</span>
        @if (review().decisionNote) {
          <p class="note">{{ review().decisionNote }}</p>
        }
      </div>
    } @else if (isReviewer()) {
      <form [formGroup]="form" (ngSubmit)="decide()" novalidate data-testid="decision-form">
        <mat-button-toggle-group formControlName="decision" aria-label="Decision" hideSingleSelectionIndicator>
          <mat-button-toggle value="approved" data-testid="decide-approve"><mat-icon>verified</mat-icon> Approve</mat-button-toggle>
          <mat-button-toggle value="changes_requested" data-testid="decide-changes"><mat-icon>edit_note</mat-icon> Request changes</mat-button-toggle>
        </mat-button-toggle-group>
        @if (form.controls.decision.touched && form.controls.decision.hasError('required')) {
          <p class="error" role="alert">Choose approve or request changes.</p>
        }
        <mat-form-field appearance="outline" class="note-field">
          <mat-label>Note to the designer</mat-label>
          <textarea matInput formControlName="note" rows="3" data-testid="decision-note"></textarea>
          <mat-hint>Sent with the decision by e-mail.</mat-hint>
          @if (form.controls.note.hasError('maxlength')) {
            <mat-error>A note holds at most 4000 characters.</mat-error>
          } @else if (form.controls.note.hasError('server')) {
            <mat-error>{{ form.controls.note.getError('server') }}</mat-error>
          }
        </mat-form-field>
        @if (failure(); as message) {
          <p class="error" role="alert" data-testid="decision-failure">{{ message }}</p>
        }
        <button mat-flat-button type="submit" [disabled]="sending()" data-testid="send-decision">Send decision</button>
      </form>
    } @else {
      <p class="meta" data-testid="decision-waiting">
        <qb-review-state-chip [state]="review().state" />
        Waiting for {{ review().reviewer?.displayName ?? review().reviewerEmail }}.
      </p>
    }
  `,
  styles: `
    :host {
      display: block;
    }
    h3 {
      font: var(--mat-sys-title-medium);
      margin: 0 0 8px;
    }
    form {
      display: flex;
      flex-direction: column;
      align-items: flex-start;
      gap: 12px;
    }
    .note-field {
      width: 100%;
    }
    .meta {
      display: flex;
      align-items: center;
      gap: 8px;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
    .decided {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      gap: 8px;
    }
    .note {
      flex-basis: 100%;
      white-space: pre-wrap;
      margin: 4px 0 0;
    }
    .error {
      margin: 0;
      color: var(--mat-sys-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReviewDecision {
  private readonly api = inject(ReviewsApi);

  readonly review = input.required<Review>();
  /** Whether the signed-in user is the reviewer asked; only they decide. */
  readonly isReviewer = input(false);
  readonly decided = output<Review>();

  protected readonly sending = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly form = new FormGroup({
    decision: new FormControl<DecisionValue | null>(null, { validators: [Validators.required] }),
    note: new FormControl('', { nonNullable: true, validators: [Validators.maxLength(4000)] }),
  });

  protected decide(): void {
    const { decision, note } = this.form.getRawValue();
    if (this.form.invalid || decision === null || this.sending()) {
      this.form.markAllAsTouched();
      return;
    }
    this.failure.set(null);
    this.sending.set(true);
    this.api.decide(this.review().id, { decision, note }).subscribe({
      next: (review) => {
        this.sending.set(false);
        this.decided.emit(review);
      },
      error: (error: unknown) => {
        this.sending.set(false);
        const problem = problemFrom(error);
        const unmatched = applyFieldErrors(this.form, problem.errors);
        this.failure.set(problem.errors.length > 0 && unmatched.length === 0 ? null : problem.detail);
      },
    });
  }
}
