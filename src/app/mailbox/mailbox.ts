import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MatButtonToggle, MatButtonToggleGroup } from '@angular/material/button-toggle';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import {
  MatCell,
  MatCellDef,
  MatColumnDef,
  MatHeaderCell,
  MatHeaderCellDef,
  MatHeaderRow,
  MatHeaderRowDef,
  MatNoDataRow,
  MatRow,
  MatRowDef,
  MatTable,
} from '@angular/material/table';
import { MatTooltip } from '@angular/material/tooltip';
import { DomSanitizer } from '@angular/platform-browser';
import { Router, RouterLink } from '@angular/router';
import { of } from 'rxjs';
import { problemFrom } from '../core/http/api-problem';
import { linksIn, MailboxApi } from './mailbox-api';

/**
 * The local mail catcher for administrators: every message the server sent, newest first; an opened
 * message shows its text, its HTML part in a sandboxed frame (no scripts, no access to the app) and
 * the links it carries.
 */
@Component({
  selector: 'qb-mailbox',
  imports: [
    DatePipe,
    MatButton,
    MatButtonToggle,
    MatButtonToggleGroup,
    MatCell,
    MatCellDef,
    MatColumnDef,
    MatHeaderCell,
    MatHeaderCellDef,
    MatHeaderRow,
    MatHeaderRowDef,
    MatIcon,
    MatIconButton,
    MatNoDataRow,
    MatProgressBar,
    MatRow,
    MatRowDef,
    MatTable,
    MatTooltip,
    RouterLink,
  ],
  templateUrl: './mailbox.html',
  styleUrl: './mailbox.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Mailbox {
  private readonly api = inject(MailboxApi);
  private readonly router = inject(Router);
  private readonly sanitizer = inject(DomSanitizer);

  /** The open message, from the query string (?message=id). */
  readonly message = input<string>();
  /** Which part of the open message to show. */
  readonly part = input<string>();

  protected readonly columns = ['to', 'subject', 'receivedAt'];
  protected readonly list = rxResource({ stream: () => this.api.list() });
  protected readonly rows = computed(() => (this.list.hasValue() ? this.list.value() : []));
  protected readonly loadError = computed(() => (this.list.error() ? problemFrom(this.list.error()).detail : null));

  protected readonly open = rxResource({
    params: () => this.message() ?? '',
    stream: ({ params }) => (params === '' ? of(null) : this.api.get(params)),
  });
  protected readonly openError = computed(() => (this.open.error() ? problemFrom(this.open.error()).detail : null));
  protected readonly shownPart = computed(() => (this.part() === 'text' ? 'text' : 'html'));
  protected readonly links = computed(() => {
    const message = this.open.hasValue() ? this.open.value() : null;
    return message === null ? [] : linksIn(message.text);
  });
  /**
   * The HTML part for the frame's srcdoc. The frame's empty sandbox is what keeps it harmless: no
   * scripts, no forms, a unique origin without the app's cookies; so the markup goes in unchanged.
   */
  protected readonly htmlDocument = computed(() => {
    const message = this.open.hasValue() ? this.open.value() : null;
    return message === null || message.html === '' ? null : this.sanitizer.bypassSecurityTrustHtml(message.html);
  });

  protected showPart(part: 'html' | 'text'): void {
    void this.router.navigate([], { queryParams: { part: part === 'html' ? null : part }, queryParamsHandling: 'merge', replaceUrl: true });
  }

  protected close(): void {
    void this.router.navigate([], { queryParams: { message: null, part: null }, queryParamsHandling: 'merge' });
  }

  protected reload(): void {
    this.list.reload();
  }
}
