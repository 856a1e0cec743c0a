import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { MatButton } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogActions, MatDialogClose, MatDialogContent, MatDialogTitle } from '@angular/material/dialog';
import { MatProgressBar } from '@angular/material/progress-bar';
import { problemFrom } from '../core/http/api-problem';
import { DesignsApi } from '../designs/designs-api';
import { compareVersions } from '@shared/engine/compare/compare-versions';

export interface VersionConflict {
  designId: string;
  baseVersion: number;
  latestVersion: number;
  draft: Record<string, unknown>;
}

/**
 * A newer version was saved while this draft was edited: shows what the draft changes against that
 * version, and offers to save the draft on top of it (both versions are kept).
 */
@Component({
  selector: 'qb-version-conflict-dialog',
  imports: [MatButton, MatDialogActions, MatDialogClose, MatDialogContent, MatDialogTitle, MatProgressBar],
  template: `
    <h2 mat-dialog-title>Version {{ data.latestVersion }} was saved meanwhile</h2>
    <mat-dialog-content>
      <p>
        You edited version {{ data.baseVersion }}; version {{ data.latestVersion }} is newer. Nothing was overwritten.
        Saving on top keeps version {{ data.latestVersion }} as it is and adds your draft after it.
      </p>
      @if (latest.isLoading()) {
        <mat-progress-bar mode="indeterminate" />
      } @else if (loadError(); as message) {
        <p class="alert" role="alert">{{ message }}</p>
      } @else {
        @if (changes().length === 0) {
          <p>Your draft is the same as version {{ data.latestVersion }}.</p>
        } @else {
          <p>Your draft differs from version {{ data.latestVersion }} in {{ changes().length }} {{ changes().length === 1 ? 'field' : 'fields' }}:</p>
          <table class="changes" data-testid="conflict-changes">
            <thead>
              <tr>
                <th>Field</th>
                <th>Version {{ data.latestVersion }}</th>
                <th>Your draft</th>
              </tr>
            </thead>
            <tbody>
              @for (change of changes(); track change.path) {
                <tr>
                  <td [title]="change.path">{{ change.label }}</td>
                  <td>{{ change.before }}</td>
                  <td class="after">{{ change.after }}</td>
                </tr>
              }
            </tbody>
          </table>
        }
      }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button [mat-dialog-close]="false">Keep editing</button>
      <button mat-flat-button [mat-dialog-close]="true" [disabled]="latest.isLoading()" data-testid="save-on-top">
        Save on top of version {{ data.latestVersion }}
      </button>
    </mat-dialog-actions>
  `,
  styles: `
    .changes {
      width: 100%;
      border-collapse: collapse;
      font: var(--mat-sys-body-small);
      th,
      td {
        padding: 4px 8px;
        border-bottom: 1px solid var(--mat-sys-outline-variant);
        text-align: left;
      }
      .after {
        font-weight: 500;
      }
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
export class VersionConflictDialog {
  protected readonly data = inject<VersionConflict>(MAT_DIALOG_DATA);
  private readonly designs = inject(DesignsApi);

  protected readonly latest = rxResource({ stream: () => this.designs.version(this.data.designId, this.data.latestVersion) });
  protected readonly loadError = computed(() => (this.latest.error() ? problemFrom(this.latest.error()).detail : null));
  /** What the draft changes against the latest version, stages matched by id. */
  private readonly comparison = computed(() => (this.latest.hasValue() ? compareVersions(this.latest.value().document, this.data.draft) : null));
  protected readonly changes = computed(() => {
    const comparison = this.comparison();
    if (comparison === null) return [];
    const stages = comparison.stages.map((stage) => ({ path: `stage ${stage.id}`, label: `${stage.id} (${stage.kind})`, before: stage.change === 'added' ? '(absent)' : `position ${Number(stage.oldIndex) + 1}`, after: stage.change === 'removed' ? '(removed)' : `position ${Number(stage.newIndex) + 1}` }));
    const fields = comparison.fields.map((field) => ({ path: field.path, label: field.stage === null ? field.label : `${field.stage} · ${field.label}`, before: field.oldText, after: field.newText }));
    return [...stages, ...fields];
  });
}
