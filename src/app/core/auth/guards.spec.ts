import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { ActivatedRouteSnapshot, Router, RouterStateSnapshot, UrlTree, provideRouter } from '@angular/router';
import type { User } from '@shared/contracts/user';
import { authGuard } from './auth-guard';
import { AuthService } from './auth-service';
import { roleGuard } from './role-guard';

function user(role: User['role']): User {
  return {
    id: '1c2d3e4f-5a6b-4c7d-8e9f-0a1b2c3d4e5f',
    email: `${role}@example.com`,
    displayName: `Demo ${role}`,
    role,
    disabled: false,
    createdAt: '2026-01-05T09:00:00.000Z',
    updatedAt: '2026-01-05T09:00:00.000Z',
  };
}

describe('route guards', () => {
  const route = {} as ActivatedRouteSnapshot;
  const state = { url: '/accounts?page=1' } as RouterStateSnapshot;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()] });
  });

  async function signInAs(role: User['role']): Promise<void> {
    const loading = TestBed.inject(AuthService).loadCurrentUser();
    TestBed.inject(HttpTestingController).expectOne('/api/auth/me').flush({ user: user(role) });
    await loading;
  }

  function serialized(result: unknown): string {
    expect(result).toBeInstanceOf(UrlTree);
    return TestBed.inject(Router).serializeUrl(result as UrlTree);
  }

  it('should send a visitor to sign in and back', () => {
    const result = TestBed.runInInjectionContext(() => authGuard(route, state));
    expect(serialized(result)).toBe('/sign-in?returnUrl=%2Faccounts%3Fpage%3D1');
  });

  it('should let a signed-in user through', async () => {
    await signInAs('designer');
    expect(TestBed.runInInjectionContext(() => authGuard(route, state))).toBeTrue();
  });

  it('should let an administrator into an admin page', async () => {
    await signInAs('admin');
    expect(TestBed.runInInjectionContext(() => roleGuard('admin')(route, state))).toBeTrue();
  });

  it('should send a designer from an admin page to Designs', async () => {
    await signInAs('designer');
    const result = TestBed.runInInjectionContext(() => roleGuard('admin')(route, state));
    expect(serialized(result)).toBe('/designs');
  });
});
