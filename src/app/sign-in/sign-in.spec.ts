import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { HarnessLoader } from '@angular/cdk/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import type { Session } from '@shared/contracts/auth';
import { AuthService } from '../core/auth/auth-service';
import { SignIn } from './sign-in';

const session: Session = {
  user: {
    id: '0f1e2d3c-4b5a-4969-8877-665544332211',
    email: 'designer@example.com',
    displayName: 'Demo designer',
    role: 'designer',
    disabled: false,
    createdAt: '2026-01-05T09:00:00.000Z',
    updatedAt: '2026-01-05T09:00:00.000Z',
  },
  token: 'header.payload.signature',
  expiresAt: '2026-01-05T17:00:00.000Z',
};

describe('SignIn', () => {
  let fixture: ComponentFixture<SignIn>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  let navigate: jasmine.Spy;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [SignIn],
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    navigate = spyOn(TestBed.inject(Router), 'navigateByUrl').and.resolveTo(true);
    fixture = TestBed.createComponent(SignIn);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  async function fill(email: string, password: string): Promise<void> {
    await (await loader.getHarness(MatInputHarness.with({ selector: '[formControlName="email"]' }))).setValue(email);
    await (await loader.getHarness(MatInputHarness.with({ selector: '[formControlName="password"]' }))).setValue(password);
  }

  async function submit(): Promise<void> {
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Sign in' }))).click();
    await fixture.whenStable();
  }

  function text(): string {
    return (fixture.nativeElement as HTMLElement).textContent ?? '';
  }

  it('should say what is missing and send nothing when submitted empty', async () => {
    await submit();
    expect(text()).toContain('Enter your e-mail address.');
    expect(text()).toContain('Enter your password.');
    http.expectNone('/api/auth/sign-in');
  });

  it('should reject an e-mail without a domain in place', async () => {
    await fill('designer', 'a password');
    await submit();
    expect(text()).toContain('Enter an address like name@example.com.');
    http.expectNone('/api/auth/sign-in');
  });

  it('should submit the credentials and go to the return address', async () => {
    fixture.componentRef.setInput('returnUrl', '/accounts?page=2');
    await fill('designer@example.com', 'correct horse battery');
    await submit();
    const request = http.expectOne('/api/auth/sign-in');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({ email: 'designer@example.com', password: 'correct horse battery' });
    request.flush(session);
    await fixture.whenStable();
    expect(TestBed.inject(AuthService).currentUser()).toEqual(session.user);
    expect(navigate).toHaveBeenCalledWith('/accounts?page=2');
  });

  it('should not follow a return address that leaves the app', async () => {
    fixture.componentRef.setInput('returnUrl', '//elsewhere.example/phish');
    await fill('designer@example.com', 'correct horse battery');
    await submit();
    http.expectOne('/api/auth/sign-in').flush(session);
    await fixture.whenStable();
    expect(navigate).toHaveBeenCalledWith('/designs');
  });

  it("should show the API's problem detail when the credentials are refused", async () => {
    await fill('designer@example.com', 'wrong password');
    await submit();
    http
      .expectOne('/api/auth/sign-in')
      .flush(
        { status: 401, title: 'Unauthorized', detail: 'E-mail or password is wrong, or the account is disabled.', errors: [] },
        { status: 401, statusText: 'Unauthorized' },
      );
    await fixture.whenStable();
    const alert: HTMLElement = fixture.nativeElement.querySelector('[data-testid="sign-in-failure"]');
    expect(alert.textContent).toContain('E-mail or password is wrong, or the account is disabled.');
    expect(navigate).not.toHaveBeenCalled();
  });

  it('should tell how long to wait when the API limits attempts', async () => {
    await fill('designer@example.com', 'wrong password');
    await submit();
    http
      .expectOne('/api/auth/sign-in')
      .flush(
        { status: 429, title: 'Too Many Requests', detail: 'Too many sign-in attempts.', errors: [] },
        { status: 429, statusText: 'Too Many Requests', headers: { 'Retry-After': '42' } },
      );
    await fixture.whenStable();
    const wait: HTMLElement = fixture.nativeElement.querySelector('[data-testid="sign-in-wait"]');
    expect(wait.textContent).toContain('Too many attempts, try again in 42 s.');
    expect(await (await loader.getHarness(MatButtonHarness.with({ text: 'Sign in' }))).isDisabled()).toBeTrue();
  });
});
