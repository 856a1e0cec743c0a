import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, input, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatCard, MatCardAvatar, MatCardContent, MatCardHeader, MatCardSubtitle, MatCardTitle } from '@angular/material/card';
import { MatError, MatFormField, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { finalize } from 'rxjs';
import { AuthService } from '../core/auth/auth-service';
import { safeReturnUrl } from '../core/auth/sign-in-url';
import { applyFieldErrors } from '../core/forms/apply-field-errors';
import { problemFrom, retryAfterSeconds } from '../core/http/api-problem';

@Component({
  selector: 'qb-sign-in',
  imports: [
    MatButton,
    MatCard,
    MatCardAvatar,
    MatCardContent,
    MatCardHeader,
    MatCardSubtitle,
    MatCardTitle,
    MatError,
    MatFormField,
    MatIcon,
    MatInput,
    MatLabel,
    MatProgressBar,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './sign-in.html',
  styleUrl: './sign-in.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SignIn {
  private readonly auth = inject(AuthService);
  private readonly router = inject(Router);

  /** Where to go after signing in; bound from the query string. */
  readonly returnUrl = input<string>();

  protected readonly form = new FormGroup({
    email: new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.email] }),
    password: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
  });

  protected readonly pending = signal(false);
  protected readonly failure = signal<string | null>(null);
  private readonly waitSeconds = signal(0);
  protected readonly waiting = computed(() => this.waitSeconds() > 0);
  protected readonly rateLimitMessage = computed(() =>
    this.waiting() ? `Too many attempts, try again in ${this.waitSeconds()} s.` : null,
  );

  private countdown: ReturnType<typeof setInterval> | undefined;

  constructor() {
    inject(DestroyRef).onDestroy(() => clearInterval(this.countdown));
  }

  protected signIn(): void {
    if (this.pending() || this.waiting()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.failure.set(null);
    this.pending.set(true);
    this.auth
      .signIn(this.form.getRawValue())
      .pipe(finalize(() => this.pending.set(false)))
      .subscribe({
        next: () => void this.router.navigateByUrl(safeReturnUrl(this.returnUrl())),
        error: (error: unknown) => this.showFailure(error),
      });
  }

  private showFailure(error: unknown): void {
    const problem = problemFrom(error);
    if (problem.status === 429) {
      const seconds = retryAfterSeconds(error);
      if (seconds !== null && seconds > 0) {
        this.startCountdown(seconds);
        return;
      }
    }
    const unmatched = applyFieldErrors(this.form, problem.errors);
    this.failure.set(problem.errors.length > 0 && unmatched.length === 0 ? null : problem.detail);
  }

  private startCountdown(seconds: number): void {
    clearInterval(this.countdown);
    this.waitSeconds.set(seconds);
    this.countdown = setInterval(() => {
      this.waitSeconds.update((left) => Math.max(0, left - 1));
      if (this.waitSeconds() === 0) clearInterval(this.countdown);
    }, 1000);
  }
}
