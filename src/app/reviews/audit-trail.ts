import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import type { AuditEvent } from '@shared/contracts/reviews-api';
import { problemFrom } from '../core/http/api-problem';
import { ReviewsApi } from './reviews-api';

const icons: Record<AuditEvent['action'], string> = {
  created: 'add_circle',
  saved: 'save',
  renamed: 'edit',
  archived: 'archive',
  restored: 'unarchive',
  shared: 'forward_to_inbox',
  invited: 'person_add',
  commented: 'comment',
  decided: 'gavel',
};

function text(value: unknown): string {
  return typeof value === 'string' ? value : '';
}

/** One event in a sentence: "saved version 3: Low-pass to third order". */
export function describeEvent(event: AuditEvent): string {
  const version = event.versionNumber === null ? '' : ` version ${event.versionNumber}`;
  const detail = event.detail;
  switch (event.action) {
    case 'created':
      return `created the design${version}`;
    case 'saved':
      return `saved${version}${text(detail['message']) ? `: ${text(detail['message'])}` : ''}`;
    case 'renamed':
      return `renamed the design from “${text(detail['from'])}” to “${text(detail['to'])}”`;
    case 'archived':
      return 'archived the design';
    case 'restored':
      return 'restored the design';
    case 'shared':
      return `shared${version} with ${text(detail['reviewerEmail'])}`;
    case 'invited':
      return `invited ${text(detail['email'])} to review${version}`;
    case 'commented': {
      const stage = text(detail['stage']);
      const field = text(detail['field']);
      const anchor = stage === '' ? 'the design' : field === '' ? stage : `${stage} · ${field}`;
      return `commented on ${anchor} in the review of${version}`;
    }
    case 'decided':
      return `${detail['decision'] === 'approved' ? 'approved' : 'requested changes to'}${version}${text(detail['note']) ? `: ${text(detail['note'])}` : ''}`;
  }
}

/** Who created, saved, shared, commented and decided on a design, and when: the design's append-only audit trail, newest first. */
@Component({
  selector: 'qb-audit-trail',
  imports: [DatePipe, MatButton, MatIcon],
  template: `
    <h2 class="title">Audit trail</h2>
    @if (error(); as message) {
      <p class="alert" role="alert">{{ message }} <button mat-button type="button" (click)="events.reload()">Try again</button></p>
    }
    <ol class="events" data-testid="audit-trail">
      @for (event of rows(); track event.id) {
        <li [attr.data-action]="event.action">
          <mat-icon aria-hidden="true">{{ icons[event.action] }}</mat-icon>
          <div>
            <div><strong>{{ event.actor?.displayName ?? 'System' }}</strong> {{ describe(event) }}</div>
            <div class="meta">{{ event.createdAt | date: 'yyyy-MM-dd HH:mm' }}</div>
          </div>
        </li>
      } @empty {
        @if (!events.isLoading() && !error()) {
          <li class="meta">Nothing recorded yet.</li>
        }
      }
    </ol>
  `,
  styles: `
    .title {
      font: var(--mat-sys-title-medium);
      margin: 0 0 8px;
    }
    .events {
      list-style: none;
      padding: 0;
      margin: 0;
      max-height: 360px;
      overflow-y: auto;
    }
    li {
      display: flex;
      gap: 8px;
      padding: 6px 0;
      border-bottom: 1px solid var(--mat-sys-outline-variant);
      font: var(--mat-sys-body-small);
      overflow-wrap: anywhere;
    }
    mat-icon {
      flex: none;
      font-size: 18px;
      width: 18px;
      height: 18px;
      color: var(--mat-sys-on-surface-variant);
    }
    .meta {
      color: var(--mat-sys-on-surface-variant);
    }
    .alert {
      color: var(--mat-sys-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AuditTrail {
  private readonly api = inject(ReviewsApi);

  readonly designId = input.required<string>();
  /** Any value that changes when the design has changed (a save, a share): the trail is read again. */
  readonly refresh = input<unknown>(null);

  protected readonly icons = icons;
  protected readonly describe = describeEvent;
  protected readonly events = rxResource({
    params: () => ({ id: this.designId(), refresh: this.refresh() }),
    stream: ({ params }) => this.api.audit(params.id),
  });
  protected readonly rows = computed(() => {
    const events = this.events.hasValue() ? this.events.value() : [];
    return [...events].sort((a, b) => b.createdAt.localeCompare(a.createdAt));
  });
  protected readonly error = computed(() => (this.events.error() ? problemFrom(this.events.error()).detail : null));
}
