import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatDialogRef } from '@angular/material/dialog';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import type { User } from '@shared/contracts/user';
import { CreateAccountDialog } from './create-account-dialog';

describe('CreateAccountDialog', () => {
  let fixture: ComponentFixture<CreateAccountDialog>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  let close: jasmine.Spy;

  beforeEach(async () => {
    close = jasmine.createSpy('close');
    TestBed.configureTestingModule({
      imports: [CreateAccountDialog],
      providers: [provideHttpClient(), provideHttpClientTesting(), { provide: MatDialogRef, useValue: { close } }],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(CreateAccountDialog);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  async function fill(field: string, value: string): Promise<void> {
    await (await loader.getHarness(MatInputHarness.with({ selector: `[formControlName="${field}"]` }))).setValue(value);
  }

  async function create(): Promise<void> {
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Create account' }))).click();
    await fixture.whenStable();
  }

  async function fillValid(): Promise<void> {
    await fill('email', 'bench@example.com');
    await fill('displayName', 'Bench engineer');
    await fill('password', 'long enough phrase');
    const role = await loader.getHarness(MatSelectHarness);
    await role.open();
    await role.clickOptions({ text: 'reviewer' });
  }

  it('should ask for the minimum password length before sending', async () => {
    await fill('email', 'bench@example.com');
    await fill('displayName', 'Bench engineer');
    await fill('password', 'short');
    await create();
    expect(fixture.nativeElement.textContent).toContain('Use at least 10 characters.');
    http.expectNone('/api/users');
  });

  it('should send the new account and close with the created user', async () => {
    await fillValid();
    await create();
    const request = http.expectOne('/api/users');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({
      email: 'bench@example.com',
      displayName: 'Bench engineer',
      role: 'reviewer',
      password: 'long enough phrase',
    });
    const created: User = {
      id: '9a8b7c6d-5e4f-4a3b-8c2d-1e0f9a8b7c6d',
      email: 'bench@example.com',
      displayName: 'Bench engineer',
      role: 'reviewer',
      disabled: false,
      createdAt: '2026-01-06T10:00:00.000Z',
      updatedAt: '2026-01-06T10:00:00.000Z',
    };
    request.flush({ user: created }, { status: 201, statusText: 'Created' });
    await fixture.whenStable();
    expect(close).toHaveBeenCalledWith(created);
  });

  it("should show the API's field error on the e-mail field when the address is taken", async () => {
    await fillValid();
    await create();
    http.expectOne('/api/users').flush(
      {
        status: 409,
        title: 'Conflict',
        detail: 'An account with this e-mail exists.',
        errors: [{ path: 'email', message: 'An account with this e-mail exists' }],
      },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();
    const emailField: HTMLElement = fixture.nativeElement.querySelector('mat-form-field');
    expect(emailField.querySelector('mat-error')?.textContent).toContain('An account with this e-mail exists');
    expect(close).not.toHaveBeenCalled();
  });
});
