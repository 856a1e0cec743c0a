import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { AbstractControl, FormControl, FormGroup, ReactiveFormsModule, ValidationErrors, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatDialogActions, MatDialogClose, MatDialogContent, MatDialogRef, MatDialogTitle } from '@angular/material/dialog';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { finalize } from 'rxjs';
import { AuthService } from '../core/auth/auth-service';
import { PASSWORD_MIN_LENGTH } from '@shared/contracts/constants';
import { applyFieldErrors } from '../core/forms/apply-field-errors';
import { problemFrom } from '../core/http/api-problem';

function matchesNewPassword(control: AbstractControl<string>): ValidationErrors | null {
  const newPassword = control.parent?.get('newPassword')?.value as string | undefined;
  return control.value === '' || control.value === newPassword ? null : { mismatch: true };
}

/** Every user changes their own password here; closes with `true` once the API accepted it. */
@Component({
  selector: 'qb-change-password-dialog',
  imports: [
    MatButton,
    MatDialogActions,
    MatDialogClose,
    MatDialogContent,
    MatDialogTitle,
    MatError,
    MatFormField,
    MatHint,
    MatInput,
    MatLabel,
    MatProgressBar,
    ReactiveFormsModule,
  ],
  templateUrl: './change-password-dialog.html',
  styleUrl: './change-password-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ChangePasswordDialog {
  private readonly auth = inject(AuthService);
  private readonly dialogRef = inject<MatDialogRef<ChangePasswordDialog, boolean>>(MatDialogRef);

  protected readonly minLength = PASSWORD_MIN_LENGTH;
  protected readonly email = computed(() => this.auth.currentUser()?.email ?? '');

  protected readonly form = new FormGroup({
    currentPassword: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    newPassword: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.minLength(PASSWORD_MIN_LENGTH)],
    }),
    confirmPassword: new FormControl('', { nonNullable: true, validators: [Validators.required, matchesNewPassword] }),
  });

  protected readonly pending = signal(false);
  protected readonly failure = signal<string | null>(null);

  constructor() {
    this.form.controls.newPassword.valueChanges
      .pipe(takeUntilDestroyed())
      .subscribe(() => this.form.controls.confirmPassword.updateValueAndValidity());
  }

  protected changePassword(): void {
    if (this.pending()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { currentPassword, newPassword } = this.form.getRawValue();
    this.failure.set(null);
    this.pending.set(true);
    this.auth
      .changePassword({ currentPassword, newPassword })
      .pipe(finalize(() => this.pending.set(false)))
      .subscribe({
        next: () => this.dialogRef.close(true),
        error: (error: unknown) => {
          const problem = problemFrom(error);
          const unmatched = applyFieldErrors(this.form, problem.errors);
          this.failure.set(problem.errors.length > 0 && unmatched.length === 0 ? null : [problem.detail, ...unmatched].join(' '));
        },
      });
  }
}
