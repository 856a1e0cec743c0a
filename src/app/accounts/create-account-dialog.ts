import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatDialogActions, MatDialogClose, MatDialogContent, MatDialogRef, MatDialogTitle } from '@angular/material/dialog';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatOption, MatSelect } from '@angular/material/select';
import type { Role, User } from '@shared/contracts/user';
import { finalize } from 'rxjs';
import { PASSWORD_MIN_LENGTH, roles as ROLES } from '@shared/contracts/constants';
import { applyFieldErrors } from '../core/forms/apply-field-errors';
import { problemFrom } from '../core/http/api-problem';
import { UsersApi } from './users-api';

/** An administrator opens an account; closes with the created user. */
@Component({
  selector: 'qb-create-account-dialog',
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
    MatOption,
    MatProgressBar,
    MatSelect,
    ReactiveFormsModule,
  ],
  templateUrl: './create-account-dialog.html',
  styleUrl: './create-account-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CreateAccountDialog {
  private readonly users = inject(UsersApi);
  private readonly dialogRef = inject<MatDialogRef<CreateAccountDialog, User>>(MatDialogRef);

  protected readonly roles = ROLES;
  protected readonly minLength = PASSWORD_MIN_LENGTH;

  protected readonly form = new FormGroup({
    email: new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.email, Validators.maxLength(254)] }),
    displayName: new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.maxLength(100)] }),
    role: new FormControl<Role>('designer', { nonNullable: true, validators: [Validators.required] }),
    password: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.minLength(PASSWORD_MIN_LENGTH), Validators.maxLength(200)],
    }),
  });

  protected readonly pending = signal(false);
  protected readonly failure = signal<string | null>(null);

  protected createAccount(): void {
    if (this.pending()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.failure.set(null);
    this.pending.set(true);
    this.users
      .create(this.form.getRawValue())
      .pipe(finalize(() => this.pending.set(false)))
      .subscribe({
        next: (user) => this.dialogRef.close(user),
        error: (error: unknown) => {
          const problem = problemFrom(error);
          const unmatched = applyFieldErrors(this.form, problem.errors);
          this.failure.set(problem.errors.length > 0 && unmatched.length === 0 ? null : [problem.detail, ...unmatched].join(' '));
        },
      });
  }
}
