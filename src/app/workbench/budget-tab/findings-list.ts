import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import type { Finding, FindingSeverity } from '@shared/contracts/findings';

const order: Record<FindingSeverity, number> = { error: 0, warning: 1, note: 2 };
const icons: Record<FindingSeverity, string> = { error: 'error', warning: 'warning', note: 'info' };

/** The engine's findings, worst first, each with a link to the field it is about. */
@Component({
  selector: 'qb-findings-list',
  imports: [MatButton, MatIcon],
  template: `
    @if (sorted().length === 0) {
      <p class="none" data-testid="no-findings"><mat-icon>check_circle</mat-icon> No findings: every check of the budget passed.</p>
    } @else {
      <ul class="findings" data-testid="findings">
        @for (finding of sorted(); track $index) {
          <li [class]="finding.severity">
            <mat-icon class="icon" [attr.aria-label]="finding.severity">{{ icons[finding.severity] }}</mat-icon>
            <div class="text">
              <div class="message">{{ finding.message }}</div>
              @if (finding.suggestion) {
                <div class="suggestion">Suggestion: {{ finding.suggestion }}</div>
              }
            </div>
            <button mat-button type="button" class="link" (click)="goTo.emit(finding)" [attr.data-testid]="'finding-link-' + finding.path">
              {{ finding.stage }} · {{ finding.field }}
            </button>
          </li>
        }
      </ul>
    }
  `,
  styleUrl: './findings-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class FindingsList {
  readonly findings = input.required<readonly Finding[]>();
  readonly goTo = output<Finding>();

  protected readonly icons = icons;
  protected readonly sorted = computed(() => this.findings().slice().sort((a, b) => order[a.severity] - order[b.severity]));
}
