import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogActions, MatDialogClose, MatDialogContent, MatDialogRef, MatDialogTitle } from '@angular/material/dialog';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';

export interface SaveVersionRequest {
  designName: string;
  baseVersion: number;
}

/** Asks what changed; the answer becomes the new version's message. */
@Component({
  selector: 'qb-save-version-dialog',
  imports: [MatButton, MatDialogActions, MatDialogClose, MatDialogContent, MatDialogTitle, MatError, MatFormField, MatHint, MatInput, MatLabel, ReactiveFormsModule],
  template: `
    <h2 mat-dialog-title>Save a version of {{ data.designName }}</h2>
    <form [formGroup]="form" (ngSubmit)="save()">
      <mat-dialog-content>
        <p class="lead">The new version goes on top of version {{ data.baseVersion }}, which you edited. Versions are never changed once saved.</p>
        <mat-form-field appearance="outline" class="message">
          <mat-label>What changed</mat-label>
          <textarea matInput [formControl]="message" rows="3" cdkFocusInitial data-testid="version-message"></textarea>
          <mat-hint>For example: “Low-pass to third order to push the ripple below one LSB”</mat-hint>
          @if (message.hasError('required')) {
            <mat-error>Say what changed</mat-error>
          } @else if (message.hasError('maxlength')) {
            <mat-error>At most 2000 characters</mat-error>
          }
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" data-testid="confirm-save">Save version</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .lead {
      margin-top: 0;
      color: var(--mat-sys-on-surface-variant);
    }
    .message {
      width: 100%;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SaveVersionDialog {
  protected readonly data = inject<SaveVersionRequest>(MAT_DIALOG_DATA);
  private readonly dialogRef = inject<MatDialogRef<SaveVersionDialog, string>>(MatDialogRef);
  protected readonly message = new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.maxLength(2000)] });
  protected readonly form = new FormGroup({ message: this.message });

  protected save(): void {
    this.message.markAsTouched();
    const text = this.message.value.trim();
    if (this.message.invalid || text === '') {
      this.message.setErrors({ required: true });
      return;
    }
    this.dialogRef.close(text);
  }
}
