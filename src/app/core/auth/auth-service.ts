import { HttpClient, HttpErrorResponse } from '@angular/common/http';
import { computed, inject, Injectable, signal } from '@angular/core';
import { firstValueFrom, map, Observable, tap } from 'rxjs';
import type { ChangePassword, Session, SignIn } from '@shared/contracts/auth';
import type { Role, User } from '@shared/contracts/user';

/** The signed-in user, as the client knows it; the session itself lives in an httpOnly cookie. */
@Injectable({ providedIn: 'root' })
export class AuthService {
  private readonly http = inject(HttpClient);
  private readonly user = signal<User | null>(null);

  readonly currentUser = this.user.asReadonly();
  readonly signedIn = computed(() => this.user() !== null);
  readonly role = computed<Role | null>(() => this.user()?.role ?? null);
  readonly isAdmin = computed(() => this.role() === 'admin');

  /** Asks the API who holds the session cookie; no session (401) or no server leaves nobody signed in. */
  async loadCurrentUser(): Promise<void> {
    try {
      const answer = await firstValueFrom(this.http.get<{ user: User }>('/api/auth/me'));
      this.user.set(answer.user);
    } catch (error) {
      if (!(error instanceof HttpErrorResponse)) throw error;
      this.user.set(null);
    }
  }

  signIn(credentials: SignIn): Observable<User> {
    return this.http.post<Session>('/api/auth/sign-in', credentials).pipe(
      map((session) => session.user),
      tap((user) => this.user.set(user)),
    );
  }

  signOut(): Observable<void> {
    // Forget the user first: even when the request fails the client must not act as signed in.
    this.user.set(null);
    return this.http.post<void>('/api/auth/sign-out', null);
  }

  changePassword(change: ChangePassword): Observable<void> {
    return this.http.post<void>('/api/auth/password', change);
  }

  /** Called when the API says the session is gone (expired, revoked, account disabled). */
  forgetUser(): void {
    this.user.set(null);
  }
}
