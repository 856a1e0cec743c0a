import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, Observable } from 'rxjs';
import type { Session } from '@shared/contracts/auth';
import type { AuditEvent, CreateComment, Decision, Review, ReviewComment, ReviewDetail, ShareVersion } from '@shared/contracts/reviews-api';

/** What an invitation link says before it is used. */
export interface Invitation {
  email: string;
  expiresAt: string;
  invitedBy: string;
}

const part = encodeURIComponent;

/** The review resources: sharing a version, the reviewer's requests, comments, decisions, invitations and the audit trail. */
@Injectable({ providedIn: 'root' })
export class ReviewsApi {
  private readonly http = inject(HttpClient);

  share(designId: string, versionNumber: number, share: ShareVersion): Observable<Review> {
    return this.http.post<Review>(`/api/designs/${part(designId)}/versions/${versionNumber}/reviews`, share);
  }

  /** Every review of a design's versions (owner and admins), newest first as the server lists them. */
  ofDesign(designId: string): Observable<Review[]> {
    return this.http.get<{ items: Review[] }>(`/api/designs/${part(designId)}/reviews`).pipe(map((answer) => answer.items));
  }

  /** The reviews assigned to the signed-in user. */
  assigned(): Observable<Review[]> {
    return this.http.get<{ items: Review[] }>('/api/reviews').pipe(map((answer) => answer.items));
  }

  get(id: string): Observable<ReviewDetail> {
    return this.http.get<ReviewDetail>(`/api/reviews/${part(id)}`);
  }

  comment(reviewId: string, comment: CreateComment): Observable<ReviewComment> {
    return this.http.post<ReviewComment>(`/api/reviews/${part(reviewId)}/comments`, comment);
  }

  setResolved(reviewId: string, commentId: string, resolved: boolean): Observable<ReviewComment> {
    return this.http.patch<ReviewComment>(`/api/reviews/${part(reviewId)}/comments/${part(commentId)}`, { resolved });
  }

  decide(reviewId: string, decision: Decision): Observable<Review> {
    return this.http.post<Review>(`/api/reviews/${part(reviewId)}/decision`, decision);
  }

  invitation(token: string): Observable<Invitation> {
    return this.http.get<Invitation>(`/api/invitations/${part(token)}`);
  }

  acceptInvitation(token: string, account: { displayName: string; password: string }): Observable<Session> {
    return this.http.post<Session>(`/api/invitations/${part(token)}/accept`, account);
  }

  audit(designId: string): Observable<AuditEvent[]> {
    return this.http.get<{ items: AuditEvent[] }>(`/api/designs/${part(designId)}/audit`).pipe(map((answer) => answer.items));
  }
}

/** Same-origin address of a version's PDF report; the session cookie goes with a plain link. */
export function reportUrl(designId: string, versionNumber: number): string {
  return `/api/designs/${part(designId)}/versions/${versionNumber}/report`;
}
