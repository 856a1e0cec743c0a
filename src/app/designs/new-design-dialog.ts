import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatDialogActions, MatDialogClose, MatDialogContent, MatDialogRef, MatDialogTitle } from '@angular/material/dialog';
import { MatError, MatFormField, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatRadioButton, MatRadioGroup } from '@angular/material/radio';
import { DESIGN_NAME_MAX_LENGTH } from '@shared/contracts/constants';
import type { DesignSummary } from '@shared/contracts/designs-api';
import { applyFieldErrors } from '../core/forms/apply-field-errors';
import { problemFrom } from '../core/http/api-problem';
import { DesignsApi } from './designs-api';
import { designTemplates } from './design-templates';

/** Starts a design from one of the templates under a name of the designer's choosing. */
@Component({
  selector: 'qb-new-design-dialog',
  imports: [
    MatButton,
    MatDialogActions,
    MatDialogClose,
    MatDialogContent,
    MatDialogTitle,
    MatError,
    MatFormField,
    MatInput,
    MatLabel,
    MatRadioButton,
    MatRadioGroup,
    ReactiveFormsModule,
  ],
  templateUrl: './new-design-dialog.html',
  styleUrl: './new-design-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NewDesignDialog {
  private readonly designs = inject(DesignsApi);
  private readonly dialogRef = inject<MatDialogRef<NewDesignDialog, DesignSummary>>(MatDialogRef);

  protected readonly templates = designTemplates;
  protected readonly maxLength = DESIGN_NAME_MAX_LENGTH;
  protected readonly form = new FormGroup({
    template: new FormControl(designTemplates[0].key, { nonNullable: true }),
    name: new FormControl(designTemplates[0].document.name, { nonNullable: true, validators: [Validators.required, Validators.maxLength(DESIGN_NAME_MAX_LENGTH)] }),
  });
  protected readonly busy = signal(false);
  protected readonly problem = signal<string | null>(null);

  constructor() {
    this.form.controls.template.valueChanges.subscribe((key) => {
      const template = designTemplates.find((candidate) => candidate.key === key);
      if (template && !this.form.controls.name.dirty) this.form.controls.name.setValue(template.document.name);
    });
  }

  protected create(): void {
    if (this.form.invalid || this.busy()) return;
    const { template: key, name } = this.form.getRawValue();
    const template = designTemplates.find((candidate) => candidate.key === key) ?? designTemplates[0];
    this.busy.set(true);
    this.problem.set(null);
    this.designs.create({ name, document: { ...template.document, name }, message: `Started from the ${template.title.toLowerCase()} template` }).subscribe({
      next: (created) => this.dialogRef.close(created),
      error: (error: unknown) => {
        this.busy.set(false);
        const problem = problemFrom(error);
        const unmatched = applyFieldErrors(this.form, problem.errors);
        this.problem.set(unmatched.length > 0 ? unmatched.join(' ') : problem.errors.length > 0 ? null : problem.detail);
      },
    });
  }
}
