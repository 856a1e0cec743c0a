import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { User } from '@shared/contracts/user';
import { AuthService } from './auth-service';

const admin: User = {
  id: '2b3c4d5e-6f70-4812-9a3b-4c5d6e7f8091',
  email: 'admin@example.com',
  displayName: 'Demo admin',
  role: 'admin',
  disabled: false,
  createdAt: '2026-01-05T09:00:00.000Z',
  updatedAt: '2026-01-05T09:00:00.000Z',
};

describe('AuthService', () => {
  let auth: AuthService;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    auth = TestBed.inject(AuthService);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('should learn the signed-in user from /api/auth/me', async () => {
    const loading = auth.loadCurrentUser();
    http.expectOne('/api/auth/me').flush({ user: admin });
    await loading;
    expect(auth.currentUser()).toEqual(admin);
    expect(auth.isAdmin()).toBeTrue();
  });

  it('should start with nobody signed in when there is no session', async () => {
    const loading = auth.loadCurrentUser();
    http.expectOne('/api/auth/me').flush({ status: 401, title: 'Unauthorized', detail: 'Sign in first.', errors: [] }, { status: 401, statusText: 'Unauthorized' });
    await loading;
    expect(auth.signedIn()).toBeFalse();
  });

  it('should start with nobody signed in when the server is unreachable', async () => {
    const loading = auth.loadCurrentUser();
    http.expectOne('/api/auth/me').error(new ProgressEvent('error'));
    await loading;
    expect(auth.currentUser()).toBeNull();
  });

  it('should forget the user on sign-out and tell the server', async () => {
    const loading = auth.loadCurrentUser();
    http.expectOne('/api/auth/me').flush({ user: admin });
    await loading;
    auth.signOut().subscribe();
    expect(auth.currentUser()).toBeNull();
    const request = http.expectOne('/api/auth/sign-out');
    expect(request.request.method).toBe('POST');
    request.flush(null, { status: 204, statusText: 'No Content' });
  });
});
