import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatDialogRef } from '@angular/material/dialog';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { ChangePasswordDialog } from './change-password-dialog';

describe('ChangePasswordDialog', () => {
  let fixture: ComponentFixture<ChangePasswordDialog>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  let close: jasmine.Spy;

  beforeEach(async () => {
    close = jasmine.createSpy('close');
    TestBed.configureTestingModule({
      imports: [ChangePasswordDialog],
      providers: [provideHttpClient(), provideHttpClientTesting(), { provide: MatDialogRef, useValue: { close } }],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ChangePasswordDialog);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  async function fill(current: string, next: string, confirm: string): Promise<void> {
    const values: Record<string, string> = { currentPassword: current, newPassword: next, confirmPassword: confirm };
    for (const [name, value] of Object.entries(values)) {
      await (await loader.getHarness(MatInputHarness.with({ selector: `[formControlName="${name}"]` }))).setValue(value);
    }
  }

  async function submit(): Promise<void> {
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Change password' }))).click();
    await fixture.whenStable();
  }

  async function errorsOf(label: string): Promise<string[]> {
    return (await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }))).getTextErrors();
  }

  it('should show the minimum length before anything is typed', async () => {
    const field = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'New password' }));
    expect((await field.getTextHints()).join(' ')).toContain('At least 10 characters');
  });

  it('should refuse a short password and a confirmation that differs, in place', async () => {
    await fill('old password 1', 'short', 'shirt');
    await submit();
    expect(await errorsOf('New password')).toEqual(['Use at least 10 characters.']);
    expect(await errorsOf('Confirm new password')).toEqual(['Does not match the new password.']);
    http.expectNone('/api/auth/password');
  });

  it('should send the current and the new password only, and close when accepted', async () => {
    await fill('old password 1', 'a much longer phrase', 'a much longer phrase');
    await submit();
    const request = http.expectOne('/api/auth/password');
    expect(request.request.body).toEqual({ currentPassword: 'old password 1', newPassword: 'a much longer phrase' });
    request.flush(null, { status: 204, statusText: 'No Content' });
    await fixture.whenStable();
    expect(close).toHaveBeenCalledWith(true);
  });

  it("should show the API's field errors on the matching fields", async () => {
    await fill('old password 1', 'password1234', 'password1234');
    await submit();
    http.expectOne('/api/auth/password').flush(
      {
        status: 400,
        title: 'Bad Request',
        detail: 'The password cannot be changed.',
        errors: [
          { path: 'currentPassword', message: 'Current password is wrong' },
          { path: 'newPassword', message: 'Password is too common' },
        ],
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    expect(await errorsOf('Current password')).toEqual(['Current password is wrong']);
    expect(await errorsOf('New password')).toEqual(['Password is too common']);
    expect(close).not.toHaveBeenCalled();
  });
});
