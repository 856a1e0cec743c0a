import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { AbstractControl, FormControl, FormGroup, ReactiveFormsModule, ValidationErrors } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { ErrorStateMatcher } from '@angular/material/core';
import { MAT_DIALOG_DATA, MatDialogActions, MatDialogClose, MatDialogContent, MatDialogRef, MatDialogTitle } from '@angular/material/dialog';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import type { DesignSummary } from '@shared/contracts/designs-api';
import { DESIGN_NAME_MAX_LENGTH } from '@shared/contracts/constants';
import { applyFieldErrors } from '../core/forms/apply-field-errors';
import { problemFrom } from '../core/http/api-problem';
import { EditedErrorStateMatcher } from '../workbench/edited-error-state';
import { DesignsApi } from './designs-api';

/** The contract's name rule on the trimmed text: not empty, at most DESIGN_NAME_MAX_LENGTH characters. */
function designName(control: AbstractControl<string>): ValidationErrors | null {
  const name = control.value.trim();
  if (name === '') return { required: true };
  if (name.length > DESIGN_NAME_MAX_LENGTH) return { maxlength: { requiredLength: DESIGN_NAME_MAX_LENGTH, actualLength: name.length } };
  return null;
}

/** Gives a design a new name; its versions and their documents stay as they are. */
@Component({
  selector: 'qb-rename-design-dialog',
  imports: [MatButton, MatDialogActions, MatDialogClose, MatDialogContent, MatDialogTitle, MatError, MatFormField, MatHint, MatInput, MatLabel, ReactiveFormsModule],
  templateUrl: './rename-design-dialog.html',
  styleUrl: './rename-design-dialog.scss',
  // The field says what is wrong while it is typed in, not only after leaving it (Save is disabled, so there is no submit).
  providers: [{ provide: ErrorStateMatcher, useClass: EditedErrorStateMatcher }],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RenameDesignDialog {
  private readonly designs = inject(DesignsApi);
  private readonly dialogRef = inject<MatDialogRef<RenameDesignDialog, DesignSummary>>(MatDialogRef);
  protected readonly design = inject<DesignSummary>(MAT_DIALOG_DATA);

  protected readonly maxLength = DESIGN_NAME_MAX_LENGTH;
  protected readonly form = new FormGroup({
    name: new FormControl(this.design.name, { nonNullable: true, validators: [designName] }),
  });
  protected readonly busy = signal(false);
  protected readonly problem = signal<string | null>(null);
  /** The form's state as signals, so that the OnPush template follows every keystroke and server answer. */
  protected readonly status = toSignal(this.form.statusChanges, { initialValue: this.form.status });
  protected readonly name = toSignal(this.form.controls.name.valueChanges, { initialValue: this.form.controls.name.value });

  /** Save is offered only for a valid name that differs from the current one once trimmed. */
  protected canSave(): boolean {
    return this.status() === 'VALID' && !this.busy() && this.name().trim() !== this.design.name;
  }

  protected save(): void {
    if (!this.canSave()) return;
    const name = this.form.controls.name.value.trim();
    this.busy.set(true);
    this.problem.set(null);
    this.designs.update(this.design.id, { name }).subscribe({
      next: (renamed) => this.dialogRef.close(renamed),
      error: (error: unknown) => {
        this.busy.set(false);
        const problem = problemFrom(error);
        const unmatched = applyFieldErrors(this.form, problem.errors);
        this.problem.set(unmatched.length > 0 ? unmatched.join(' ') : problem.errors.length > 0 ? null : problem.detail);
      },
    });
  }
}
