import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import type { DesignSummary } from '@shared/contracts/designs-api';
import { RenameDesignDialog } from './rename-design-dialog';

const person = { id: '00000000-0000-4000-8000-000000000002', displayName: 'Demo Designer', email: 'designer@example.com' };
const design: DesignSummary = {
  id: '00000000-0000-4000-9000-000000000001',
  name: 'Line sensor, pressure',
  owner: person,
  archived: false,
  latestVersion: 3,
  createdAt: '2026-11-02T09:00:00.000Z',
  updatedAt: '2026-11-03T10:30:00.000Z',
  latest: {
    number: 3,
    message: 'Lower the low-pass corner',
    author: person,
    createdAt: '2026-11-03T10:30:00.000Z',
    formatVersion: 1,
    engineVersion: '0.1.0',
    figures: {
      voltsPerFarad: 3.79e13,
      resolution: { farad: 1.94e-18, pascal: 6.48, cubicMetrePerSecond: null, bandLow: 0.1, bandHigh: 15800 },
      outputNoiseRms: 7.37e-5,
      worstHeadroom: { node: 'adc', usedFraction: 0.268 },
      ripplePeak: 3.8e-6,
      findings: { error: 0, warning: 0, note: 0 },
    },
  },
  latestReview: null,
};
const url = `/api/designs/${design.id}`;

describe('RenameDesignDialog', () => {
  let fixture: ComponentFixture<RenameDesignDialog>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  let close: jasmine.Spy;

  beforeEach(async () => {
    close = jasmine.createSpy('close');
    TestBed.configureTestingModule({
      imports: [RenameDesignDialog],
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MatDialogRef, useValue: { close } },
        { provide: MAT_DIALOG_DATA, useValue: design },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(RenameDesignDialog);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  const nameInput = () => loader.getHarness(MatInputHarness.with({ selector: '[data-testid="rename-design-name"]' }));
  const saveButton = () => loader.getHarness(MatButtonHarness.with({ text: 'Save' }));
  const nameField = () => loader.getHarness(MatFormFieldHarness);

  async function type(value: string): Promise<void> {
    await (await nameInput()).setValue(value);
    await fixture.whenStable();
  }

  it('should start with the current name and Save disabled until it changes', async () => {
    expect(await (await nameInput()).getValue()).toBe('Line sensor, pressure');
    expect(await (await saveButton()).isDisabled()).toBeTrue();
    await type('  Line sensor, pressure  ');
    expect(await (await saveButton()).isDisabled()).withContext('the same name once trimmed').toBeTrue();
    await type('Line sensor, pressure B');
    expect(await (await saveButton()).isDisabled()).toBeFalse();
  });

  it('should refuse an empty or blank name and one longer than 200 characters, as the contract does', async () => {
    await type('   ');
    expect(await (await saveButton()).isDisabled()).toBeTrue();
    expect(await (await nameField()).getTextErrors()).toEqual(['Name is required']);

    await type('x'.repeat(201));
    expect(await (await saveButton()).isDisabled()).toBeTrue();
    expect(await (await nameField()).getTextErrors()).toEqual(['Name must be at most 200 characters']);

    await type(`  ${'x'.repeat(200)}  `);
    expect(await (await saveButton()).isDisabled()).withContext('200 characters after trimming').toBeFalse();
    expect(await (await nameField()).getTextErrors()).toEqual([]);
    http.expectNone(url);
  });

  it('should send PATCH with the trimmed name and close with the renamed design', async () => {
    await type('  Line sensor, pressure (rev B)  ');
    await (await saveButton()).click();
    const request = http.expectOne(url);
    expect(request.request.method).toBe('PATCH');
    expect(request.request.body).toEqual({ name: 'Line sensor, pressure (rev B)' });
    expect(await (await saveButton()).isDisabled()).withContext('while the request is out').toBeTrue();
    const renamed = { ...design, name: 'Line sensor, pressure (rev B)' };
    request.flush(renamed);
    await fixture.whenStable();
    expect(close).toHaveBeenCalledOnceWith(renamed);
  });

  it('should show the server field error under the field and keep the dialog open', async () => {
    await type('Line sensor, pressure (rev B)');
    await (await saveButton()).click();
    http.expectOne(url).flush(
      {
        status: 400,
        title: 'Bad request',
        detail: 'The request body is not valid: name: Name must not contain control characters.',
        errors: [{ path: 'name', message: 'Name must not contain control characters' }],
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    expect(await (await nameField()).getTextErrors()).toEqual(['Name must not contain control characters']);
    expect(fixture.nativeElement.querySelector('[role="alert"]')).toBeNull();
    expect(await (await saveButton()).isDisabled()).toBeTrue();
    expect(close).not.toHaveBeenCalled();

    await type('Line sensor, pressure rev B');
    expect(await (await nameField()).getTextErrors()).withContext('gone after the next edit').toEqual([]);
    expect(await (await saveButton()).isDisabled()).toBeFalse();
  });

  it('should say so when the design is not there any more', async () => {
    await type('Line sensor, pressure (rev B)');
    await (await saveButton()).click();
    http
      .expectOne(url)
      .flush(
        { status: 404, title: 'Not found', detail: 'No design with this id, or it is not shared with you.', errors: [] },
        { status: 404, statusText: 'Not Found' },
      );
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[role="alert"]')?.textContent).toContain('No design with this id, or it is not shared with you.');
    expect(close).not.toHaveBeenCalled();
  });
});
