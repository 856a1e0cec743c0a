import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatSortHarness } from '@angular/material/sort/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatMenuHarness } from '@angular/material/menu/testing';
import { MatSnackBarHarness } from '@angular/material/snack-bar/testing';
import type { DesignList, DesignSummary, KeyFigures } from '@shared/contracts/designs-api';
import { Designs } from './designs';

const person = { id: '00000000-0000-4000-8000-000000000002', displayName: 'Demo Designer', email: 'designer@example.com' };

function figures(overrides: Partial<KeyFigures>): KeyFigures {
  return {
    voltsPerFarad: 3.79e13,
    resolution: { farad: 1.94e-18, pascal: 6.48, cubicMetrePerSecond: null, bandLow: 0.1, bandHigh: 15800 },
    outputNoiseRms: 7.37e-5,
    worstHeadroom: { node: 'adc', usedFraction: 0.268 },
    ripplePeak: 3.8e-6,
    findings: { error: 0, warning: 0, note: 0 },
    ...overrides,
  };
}

function design(n: number, name: string, keyFigures: KeyFigures, archived = false): DesignSummary {
  const id = `00000000-0000-4000-9000-${String(n).padStart(12, '0')}`;
  return {
    id,
    name,
    owner: person,
    archived,
    latestVersion: n + 2,
    createdAt: '2026-11-02T09:00:00.000Z',
    updatedAt: `2026-11-0${n}T10:30:00.000Z`,
    latest: {
      number: n + 2,
      message: 'Lower the low-pass corner',
      author: person,
      createdAt: `2026-11-0${n}T10:30:00.000Z`,
      formatVersion: 1,
      engineVersion: '0.1.0',
      figures: keyFigures,
    },
    latestReview: n === 1 ? { state: 'changes_requested', versionNumber: 2 } : null,
  };
}

const answer: DesignList = {
  items: [
    design(1, 'Line sensor, pressure', figures({ findings: { error: 1, warning: 2, note: 0 } })),
    design(
      2,
      'Line sensor, flow',
      figures({
        resolution: { farad: 1.2e-18, pascal: 3.99, cubicMetrePerSecond: 7.82e-12, bandLow: 0.1, bandHigh: 6300 },
        worstHeadroom: { node: 'g1', usedFraction: 1.25 },
      }),
    ),
  ],
  total: 2,
  page: 0,
  pageSize: 20,
};

describe('Designs', () => {
  let fixture: ComponentFixture<Designs>;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [Designs],
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(Designs);
  });

  afterEach(() => http.verify());

  async function nextList(): Promise<TestRequest> {
    for (let attempt = 0; attempt < 200; attempt++) {
      const [request] = http.match((candidate) => candidate.method === 'GET' && candidate.url === '/api/designs');
      if (request) return request;
      await new Promise((resolve) => setTimeout(resolve, 10));
    }
    throw new Error('the page sent no GET /api/designs');
  }

  function params(request: TestRequest): Record<string, string | null> {
    const all = request.request.params;
    return Object.fromEntries(all.keys().map((key) => [key, all.get(key)]));
  }

  /** Waits for the dialog's closing animation to end; fails when a dialog is still open after two seconds. */
  async function closed(overlays: HarnessLoader): Promise<void> {
    for (let attempt = 0; attempt < 200; attempt++) {
      if ((await overlays.getAllHarnesses(MatDialogHarness)).length === 0) return;
      await new Promise((resolve) => setTimeout(resolve, 10));
    }
    fail('the dialog is still open');
  }

  function rows(): HTMLElement[] {
    return Array.from((fixture.nativeElement as HTMLElement).querySelectorAll<HTMLElement>('tr.mat-mdc-row:not(.no-data)'));
  }

  it('should ask for the active designs, most recently changed first', async () => {
    const request = await nextList();
    expect(params(request)).toEqual({ page: '0', pageSize: '20', sort: 'updatedAt', order: 'desc', archived: 'false' });
    request.flush(answer);
  });

  it('should show one row per design with its key figures formatted in engineering units', async () => {
    (await nextList()).flush(answer);
    await fixture.whenStable();
    const [pressure, flow] = rows();
    expect(rows().length).toBe(2);
    expect(pressure.textContent).toContain('Line sensor, pressure');
    expect(pressure.textContent).toContain('1.94 aF · 6.48 Pa');
    expect(pressure.textContent).toContain('73.7 uV rms');
    expect(pressure.textContent).toContain('27 % at adc');
    expect(pressure.textContent).toContain('1 error');
    expect(pressure.textContent).toContain('2 warnings');
    expect(flow.textContent).toContain('1.2 aF · 7.82 nL/s');
    expect(flow.textContent).toContain('none');
    expect(flow.querySelector('.clipping')?.textContent).toContain('125 % at g1');
    const link = pressure.querySelector<HTMLAnchorElement>('a[data-testid="design-link"]');
    expect(link?.getAttribute('href')).toBe(`/designs/${answer.items[0].id}`);
  });

  it('should show each design\'s latest review from the list answer, with no request per row', async () => {
    (await nextList()).flush(answer);
    await fixture.whenStable();
    const [pressure, flow] = rows();
    expect(pressure.querySelector('qb-design-review-state [data-state]')?.getAttribute('data-state')).toBe('changes_requested');
    expect(pressure.querySelector('qb-design-review-state')?.textContent).toContain('v2');
    expect(flow.querySelector('qb-design-review-state')?.textContent?.trim()).toBe('');
    // afterEach's verify() fails on any request left unanswered, such as one per row for its reviews.
    http.expectNone((request) => request.url.includes('/reviews'));
  });

  it('should send the sort column and the archive filter to the server', async () => {
    (await nextList()).flush(answer);
    await fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const [name] = await (await loader.getHarness(MatSortHarness)).getSortHeaders({ label: 'Name' });
    const sorted = name.click();
    const byName = await nextList();
    expect(params(byName)).toEqual(jasmine.objectContaining({ sort: 'name', order: 'asc' }));
    byName.flush(answer);
    await sorted;
    const archived = await loader.getHarness(MatButtonToggleHarness.with({ text: 'Archived' }));
    const toggled = archived.check();
    const onlyArchived = await nextList();
    expect(params(onlyArchived)).toEqual(jasmine.objectContaining({ archived: 'true', page: '0' }));
    onlyArchived.flush({ ...answer, items: [], total: 0 });
    await toggled;
    await fixture.whenStable();
    expect(fixture.nativeElement.textContent).toContain('No archived designs.');
  });

  it('should explain how to start when there are no designs at all', async () => {
    (await nextList()).flush({ items: [], total: 0, page: 0, pageSize: 20 });
    await fixture.whenStable();
    const empty: HTMLElement | null = fixture.nativeElement.querySelector('[data-testid="designs-empty"]');
    expect(empty?.textContent).toContain('No designs yet');
    expect(fixture.nativeElement.querySelector('table')).toBeNull();
  });

  it('should show the problem when the list cannot be loaded', async () => {
    (await nextList()).flush({ status: 500, title: 'Server error', detail: 'The database is not reachable.', errors: [] }, { status: 500, statusText: 'Server Error' });
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[data-testid="designs-error"]')?.textContent).toContain('The database is not reachable.');
  });
  it('should rename a design from its row menu and show the list again from the server', async () => {
    (await nextList()).flush(answer);
    await fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const overlays = TestbedHarnessEnvironment.documentRootLoader(fixture);
    const [menu] = await loader.getAllHarnesses(MatMenuHarness.with({ triggerText: 'more_vert' }));
    await menu.open();
    expect((await menu.getItems()).length).toBe(4);
    await menu.clickItem({ text: /Rename/ });

    const dialog = await overlays.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toBe('Rename design');
    const name = await overlays.getHarness(MatInputHarness.with({ selector: '[data-testid="rename-design-name"]' }));
    expect(await name.getValue()).toBe('Line sensor, pressure');
    await name.setValue(' Line sensor, pressure (rev B) ');
    await (await overlays.getHarness(MatButtonHarness.with({ text: 'Save' }))).click();

    const patch = http.expectOne(`/api/designs/${answer.items[0].id}`);
    expect(patch.request.method).toBe('PATCH');
    expect(patch.request.body).toEqual({ name: 'Line sensor, pressure (rev B)' });
    const renamed = { ...answer.items[0], name: 'Line sensor, pressure (rev B)' };
    patch.flush(renamed);

    const reload = await nextList();
    expect(params(reload)).toEqual({ page: '0', pageSize: '20', sort: 'updatedAt', order: 'desc', archived: 'false' });
    reload.flush({ ...answer, items: [renamed, answer.items[1]] });
    await fixture.whenStable();
    expect(rows()[0].textContent).toContain('Line sensor, pressure (rev B)');
    await closed(overlays);
    const snackBar = await overlays.getHarness(MatSnackBarHarness);
    expect(await snackBar.getMessage()).toBe('Renamed “Line sensor, pressure” to “Line sensor, pressure (rev B)”.');
  });

  it('should offer Rename for an archived design as well', async () => {
    (await nextList()).flush({ ...answer, items: [design(3, 'Old bench rig', figures({}), true)], total: 1 });
    await fixture.whenStable();
    const menu = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatMenuHarness.with({ triggerText: 'more_vert' }));
    await menu.open();
    const labels = Array.from(document.querySelectorAll('.mat-mdc-menu-panel [mat-menu-item] > span'), (label) => label.textContent?.trim());
    expect(labels).toEqual(['Rename', 'Duplicate', 'Export version 5 as JSON', 'Restore']);
    await menu.close();
  });

  it('should leave the list alone when the rename is cancelled', async () => {
    (await nextList()).flush(answer);
    await fixture.whenStable();
    const overlays = TestbedHarnessEnvironment.documentRootLoader(fixture);
    const [menu] = await TestbedHarnessEnvironment.loader(fixture).getAllHarnesses(MatMenuHarness.with({ triggerText: 'more_vert' }));
    await menu.open();
    await menu.clickItem({ text: /Rename/ });
    await (await overlays.getHarness(MatButtonHarness.with({ text: 'Cancel' }))).click();
    await closed(overlays);
    http.expectNone((request) => request.method === 'PATCH' || request.url === '/api/designs');
  });
});
