import { computed, signal } from '@angular/core';
import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatMenuHarness } from '@angular/material/menu/testing';
import type { User } from '@shared/contracts/user';
import { of } from 'rxjs';
import { AuthService } from '../auth/auth-service';
import { Shell } from './shell';

function user(role: User['role']): User {
  return {
    id: '5b0c8f7e-3f52-4a1e-9a53-0d6c1f4f2a10',
    email: `${role}@example.com`,
    displayName: `Demo ${role}`,
    role,
    disabled: false,
    createdAt: '2026-01-05T09:00:00.000Z',
    updatedAt: '2026-01-05T09:00:00.000Z',
  };
}

class FakeAuth {
  readonly user = signal<User | null>(null);
  readonly currentUser = this.user.asReadonly();
  readonly isAdmin = computed(() => this.user()?.role === 'admin');
  readonly signOut = jasmine.createSpy('signOut').and.returnValue(of(undefined));
}

describe('Shell', () => {
  let auth: FakeAuth;

  async function render(signedIn: User | null) {
    auth = new FakeAuth();
    auth.user.set(signedIn);
    TestBed.configureTestingModule({
      imports: [Shell],
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting(), { provide: AuthService, useValue: auth }],
    });
    const fixture = TestBed.createComponent(Shell);
    await fixture.whenStable();
    return fixture;
  }

  function links(element: HTMLElement): string[] {
    return Array.from(element.querySelectorAll('nav a')).map((link) => link.textContent?.trim() ?? '');
  }

  it('should show the product name in the toolbar', async () => {
    const fixture = await render(user('designer'));
    expect(fixture.nativeElement.querySelector('mat-toolbar').textContent).toContain('Quietbridge');
  });

  it('should show Accounts and Mailbox to an administrator', async () => {
    const fixture = await render(user('admin'));
    expect(links(fixture.nativeElement)).toEqual(['Designs', 'Reviews', 'Calibration', 'Accounts', 'Mailbox', 'About']);
  });

  it('should hide Accounts and Mailbox from designers and reviewers, and show them Reviews', async () => {
    for (const role of ['designer', 'reviewer'] as const) {
      TestBed.resetTestingModule();
      const fixture = await render(user(role));
      expect(links(fixture.nativeElement)).toEqual(['Designs', 'Reviews', 'Calibration', 'About']);
    }
  });

  it('should show the display name and the role of the signed-in user', async () => {
    const fixture = await render(user('reviewer'));
    const button: HTMLElement = fixture.nativeElement.querySelector('.user-button');
    expect(button.textContent).toContain('Demo reviewer');
    expect(button.querySelector('[data-testid="role"]')?.textContent?.trim()).toBe('reviewer');
  });

  it('should offer sign-in instead of the user menu when nobody is signed in', async () => {
    const fixture = await render(null);
    expect(fixture.nativeElement.querySelector('.user-button')).toBeNull();
    expect(fixture.nativeElement.querySelector('a[href="/sign-in"]')).not.toBeNull();
  });

  it('should sign out through the service and go to the sign-in page', async () => {
    const fixture = await render(user('designer'));
    const router = TestBed.inject(Router);
    const navigate = spyOn(router, 'navigateByUrl').and.resolveTo(true);
    const menu = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatMenuHarness);
    await menu.open();
    await menu.clickItem({ text: /Sign out/ });
    expect(auth.signOut).toHaveBeenCalledTimes(1);
    expect(navigate).toHaveBeenCalledWith('/sign-in');
  });
});
