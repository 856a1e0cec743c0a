import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { rxResource, takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { AbstractControl, FormControl, FormGroup, ReactiveFormsModule, ValidationErrors, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatCard, MatCardAvatar, MatCardContent, MatCardHeader, MatCardSubtitle, MatCardTitle } from '@angular/material/card';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { firstValueFrom, of } from 'rxjs';
import { AuthService } from '../core/auth/auth-service';
import { applyFieldErrors } from '../core/forms/apply-field-errors';
import { problemFrom } from '../core/http/api-problem';
import { ReviewsApi } from '../reviews/reviews-api';

const MIN_PASSWORD = 10;

/** The confirmation must repeat the password field beside it. */
function repeatsPassword(control: AbstractControl): ValidationErrors | null {
  const password = control.parent?.get('password')?.value as string | undefined;
  return control.value === '' || password === undefined || control.value === password ? null : { mismatch: true };
}

/** The page an invitation link opens: who invited, the address, and the reviewer account to create. */
@Component({
  selector: 'qb-sign-up',
  imports: [
    DatePipe,
    MatButton,
    MatCard,
    MatCardAvatar,
    MatCardContent,
    MatCardHeader,
    MatCardSubtitle,
    MatCardTitle,
    MatError,
    MatFormField,
    MatHint,
    MatIcon,
    MatInput,
    MatLabel,
    MatProgressBar,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './sign-up.html',
  styleUrl: './sign-up.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SignUp {
  private readonly api = inject(ReviewsApi);
  private readonly auth = inject(AuthService);
  private readonly router = inject(Router);

  /** The one-time token from the link's query string. */
  readonly token = input<string>();

  protected readonly minPassword = MIN_PASSWORD;
  protected readonly invitation = rxResource({
    params: () => this.token() ?? '',
    stream: ({ params }) => (params === '' ? of(null) : this.api.invitation(params)),
  });
  /** Why the link cannot be used: gone (410: used or expired) or not valid (404, or no token). */
  protected readonly linkProblem = computed<{ gone: boolean; detail: string } | null>(() => {
    if ((this.token() ?? '') === '') return { gone: false, detail: 'This page needs the link from your invitation e-mail.' };
    const error = this.invitation.error();
    if (!error) return null;
    const problem = problemFrom(error);
    return { gone: problem.status === 410, detail: problem.detail };
  });

  protected readonly form = new FormGroup({
    displayName: new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.maxLength(100)] }),
    password: new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.minLength(MIN_PASSWORD), Validators.maxLength(200)] }),
    confirm: new FormControl('', { nonNullable: true, validators: [Validators.required, repeatsPassword] }),
  });
  protected readonly pending = signal(false);
  protected readonly failure = signal<string | null>(null);
  /** Set when the link stopped working between opening the page and sending the form. */
  protected readonly goneOnSubmit = signal<string | null>(null);

  constructor() {
    this.form.controls.password.valueChanges.pipe(takeUntilDestroyed()).subscribe(() => this.form.controls.confirm.updateValueAndValidity());
  }

  protected async createAccount(): Promise<void> {
    const token = this.token();
    if (this.pending() || token === undefined) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.failure.set(null);
    this.pending.set(true);
    const { displayName, password } = this.form.getRawValue();
    try {
      await firstValueFrom(this.api.acceptInvitation(token, { displayName, password }));
    } catch (error) {
      this.pending.set(false);
      this.showFailure(error);
      return;
    }
    await this.auth.loadCurrentUser();
    await this.router.navigateByUrl(await this.firstReviewUrl());
  }

  /** The newest pending review the invitation was for; the review list when there is none. */
  private async firstReviewUrl(): Promise<string> {
    try {
      const reviews = await firstValueFrom(this.api.assigned());
      const pending = reviews.filter((review) => review.state === 'pending').sort((a, b) => b.createdAt.localeCompare(a.createdAt));
      return pending.length > 0 ? `/reviews/${pending[0]!.id}` : '/reviews';
    } catch {
      return '/reviews';
    }
  }

  private showFailure(error: unknown): void {
    const problem = problemFrom(error);
    if (problem.status === 410) {
      this.goneOnSubmit.set(problem.detail);
      return;
    }
    const unmatched = applyFieldErrors(this.form, problem.errors);
    this.failure.set(problem.errors.length > 0 && unmatched.length === 0 ? null : problem.detail);
  }
}
