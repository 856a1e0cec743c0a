import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogActions, MatDialogClose, MatDialogContent, MatDialogTitle } from '@angular/material/dialog';
import type { FieldError } from '@shared/contracts/problem';

export interface ImportProblems {
  fileName: string;
  /** Who found them: the browser's check or the server's. */
  checkedBy: 'browser' | 'server';
  summary: string;
  errors: readonly FieldError[];
}

/** Why an imported file was not taken, each problem with the path of the field it is about. */
@Component({
  selector: 'qb-import-problems-dialog',
  imports: [MatButton, MatDialogActions, MatDialogClose, MatDialogContent, MatDialogTitle],
  template: `
    <h2 mat-dialog-title>{{ data.fileName }} was not imported</h2>
    <mat-dialog-content>
      <p>{{ data.summary }}</p>
      @if (data.errors.length > 0) {
        <ul class="problems" data-testid="import-problems">
          @for (error of data.errors; track $index) {
            <li>
              @if (error.path) {
                <code>{{ error.path }}</code>
              }
              {{ error.message }}
            </li>
          }
        </ul>
      }
      <p class="checked-by">Checked by the {{ data.checkedBy === 'browser' ? 'design format in this browser' : 'server' }}.</p>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-flat-button mat-dialog-close>Close</button>
    </mat-dialog-actions>
  `,
  styles: `
    .problems {
      margin: 0;
      padding-left: 20px;
      li {
        margin: 4px 0;
      }
      code {
        padding: 1px 4px;
        border-radius: 4px;
        background: var(--mat-sys-surface-container-high);
      }
    }
    .checked-by {
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ImportProblemsDialog {
  protected readonly data = inject<ImportProblems>(MAT_DIALOG_DATA);
}
