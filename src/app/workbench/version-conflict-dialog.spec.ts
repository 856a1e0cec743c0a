import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { Component, inject } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { HarnessLoader } from '@angular/cdk/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialog } from '@angular/material/dialog';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import type { Version } from '@shared/contracts/designs-api';
import demoPressure from '@shared/examples/demo-pressure.json';
import { VersionConflictDialog, type VersionConflict } from './version-conflict-dialog';

const designId = '00000000-0000-4000-9000-000000000001';
const person = { id: '00000000-0000-4000-8000-000000000002', displayName: 'Demo Designer', email: 'designer@example.com' };

function documentCopy(): typeof demoPressure {
  return structuredClone(demoPressure);
}

function version(number: number, document: Record<string, unknown>): Version {
  return {
    designId,
    number,
    message: 'Saved from another tab',
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
    document,
  };
}

/** Opens the dialog as the workbench does and keeps what it closes with. */
@Component({ selector: 'qb-conflict-host', template: '' })
class ConflictHost {
  private readonly dialog = inject(MatDialog);
  closedWith: unknown = 'open';

  open(data: VersionConflict): void {
    this.dialog
      .open(VersionConflictDialog, { width: '640px', data })
      .afterClosed()
      .subscribe((onTop: unknown) => (this.closedWith = onTop));
  }
}

describe('VersionConflictDialog', () => {
  let fixture: ComponentFixture<ConflictHost>;
  let overlays: HarnessLoader;
  let http: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [ConflictHost],
      providers: [provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ConflictHost);
    overlays = TestbedHarnessEnvironment.documentRootLoader(fixture);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  /** Opens the dialog and gives back its request for version 4 (harnesses wait for it to be answered). */
  async function open(draft: Record<string, unknown>): Promise<TestRequest> {
    fixture.componentInstance.open({ designId, baseVersion: 3, latestVersion: 4, draft });
    for (let attempt = 0; attempt < 200; attempt++) {
      const [request] = http.match(`/api/designs/${designId}/versions/4`);
      if (request) return request;
      await new Promise((resolve) => setTimeout(resolve, 10));
    }
    throw new Error('the dialog asked for no version');
  }

  async function openAnswered(draft: Record<string, unknown>, latest: Record<string, unknown> = documentCopy()): Promise<MatDialogHarness> {
    (await open(draft)).flush(version(4, latest));
    return overlays.getHarness(MatDialogHarness);
  }

  const saveOnTop = () => overlays.getHarness(MatButtonHarness.with({ text: 'Save on top of version 4' }));
  const keepEditing = () => overlays.getHarness(MatButtonHarness.with({ text: 'Keep editing' }));

  async function closed(): Promise<unknown> {
    for (let attempt = 0; attempt < 200 && fixture.componentInstance.closedWith === 'open'; attempt++) {
      await new Promise((resolve) => setTimeout(resolve, 10));
    }
    return fixture.componentInstance.closedWith;
  }

  it('should load the newer version and list what the draft changes against it', async () => {
    const draft = documentCopy();
    draft.chain[4].corner = 300;
    draft.excitation.amplitude = 1;
    const request = await open(draft);
    expect(request.request.method).toBe('GET');
    fixture.detectChanges();
    const button = document.querySelector<HTMLButtonElement>('[data-testid="save-on-top"]');
    expect(button?.disabled).withContext('while version 4 loads').toBeTrue();
    expect(document.querySelector('mat-progress-bar')).not.toBeNull();
    request.flush(version(4, documentCopy()));

    const dialog = await overlays.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toBe('Version 4 was saved meanwhile');

    const text = await dialog.getContentText();
    expect(text).toContain('You edited version 3; version 4 is newer. Nothing was overwritten.');
    expect(text).toContain('Your draft differs from version 4 in 2 fields:');
    const table = document.querySelector<HTMLTableElement>('[data-testid="conflict-changes"]');
    const cells = Array.from(table?.tBodies[0].rows ?? [], (row) => Array.from(row.cells, (cell) => cell.textContent?.trim()));
    expect(cells).toEqual([
      ['excitation · Excitation amplitude', '2 V', '1 V'],
      ['lp · Corner frequency', '500 Hz', '300 Hz'],
    ]);
    expect(await (await saveOnTop()).isDisabled()).toBeFalse();
  });

  it('should list a removed stage by its id and kind', async () => {
    const draft = documentCopy();
    draft.chain.splice(2, 1);
    await openAnswered(draft);
    const table = document.querySelector<HTMLTableElement>('[data-testid="conflict-changes"]');
    const first = Array.from(table?.tBodies[0].rows[0].cells ?? [], (cell) => cell.textContent?.trim());
    expect(first).toEqual(['hp (highPass)', 'position 3', '(removed)']);
  });

  it('should say so when the draft is the same as the newer version', async () => {
    const dialog = await openAnswered(documentCopy());
    expect(await dialog.getContentText()).toContain('Your draft is the same as version 4.');
    expect(document.querySelector('[data-testid="conflict-changes"]')).toBeNull();
  });

  it('should close with true for Save on top', async () => {
    await openAnswered(documentCopy());
    await (await saveOnTop()).click();
    expect(await closed()).toBeTrue();
  });

  it('should close with false for Keep editing', async () => {
    await openAnswered(documentCopy());
    await (await keepEditing()).click();
    expect(await closed()).toBeFalse();
  });

  it('should show why the newer version could not be loaded and still offer both choices', async () => {
    (await open(documentCopy())).flush(
      { status: 404, title: 'Not found', detail: 'This design has no version 4.', errors: [] },
      { status: 404, statusText: 'Not Found' },
    );
    const dialog = await overlays.getHarness(MatDialogHarness);
    expect(await dialog.getContentText()).toContain('This design has no version 4.');
    expect(await (await saveOnTop()).isDisabled()).toBeFalse();
    expect(await (await keepEditing()).isDisabled()).toBeFalse();
  });
});
