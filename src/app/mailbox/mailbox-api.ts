import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, Observable } from 'rxjs';
import type { MailboxMessage } from '@shared/contracts/reviews-api';

/** The local mail catcher's messages (`/api/mailbox`, admins only), newest first. */
@Injectable({ providedIn: 'root' })
export class MailboxApi {
  private readonly http = inject(HttpClient);

  list(): Observable<MailboxMessage[]> {
    return this.http.get<{ items: MailboxMessage[] }>('/api/mailbox').pipe(map((answer) => answer.items));
  }

  get(id: string): Observable<MailboxMessage> {
    return this.http.get<MailboxMessage>(`/api/mailbox/${encodeURIComponent(id)}`);
  }
}

/** The web addresses a message's text holds, in order, each once: what a reader of the message would click. */
export function linksIn(text: string): string[] {
  const found = text.match(/https?:\/\/[^\s<>"')]+/g) ?? [];
  return [...new Set(found.map((link) => link.replace(/[.,;:]+$/, '')))];
}
