import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatPaginatorHarness } from '@angular/material/paginator/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatSlideToggleHarness } from '@angular/material/slide-toggle/testing';
import { MatSnackBarHarness } from '@angular/material/snack-bar/testing';
import { MatSortHarness } from '@angular/material/sort/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import type { User, UserList } from '@shared/contracts/user';
import { Accounts } from './accounts';

function account(n: number, role: User['role'], disabled = false): User {
  return {
    id: `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`,
    email: `${role}${n}@example.com`,
    displayName: `Demo ${role} ${n}`,
    role,
    disabled,
    createdAt: `2026-01-0${n}T09:00:00.000Z`,
    updatedAt: `2026-01-0${n}T09:00:00.000Z`,
  };
}

const firstPage: UserList = {
  items: [account(1, 'admin'), account(2, 'designer'), account(3, 'reviewer', true)],
  total: 45,
  page: 0,
  pageSize: 20,
};

describe('Accounts', () => {
  let fixture: ComponentFixture<Accounts>;
  let loader: HarnessLoader;
  let http: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [Accounts],
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(Accounts);
    loader = TestbedHarnessEnvironment.loader(fixture);
  });

  afterEach(() => http.verify());

  /**
   * Waits for the page to send a request. The list is a resource, and the page counts as busy until
   * it loads, so a harness action that reloads it settles only once the test has answered.
   */
  async function nextRequest(method: string, url: string): Promise<TestRequest> {
    for (let attempt = 0; attempt < 200; attempt++) {
      const [request, ...more] = http.match((candidate) => candidate.method === method && candidate.url === url);
      expect(more.length).withContext(`one ${method} ${url} at a time`).toBe(0);
      if (request) return request;
      await new Promise((resolve) => setTimeout(resolve, 10));
    }
    throw new Error(`the page sent no ${method} ${url}`);
  }

  function nextList(): Promise<TestRequest> {
    return nextRequest('GET', '/api/users');
  }

  function paramsOf(request: TestRequest): Record<string, string | null> {
    const params = request.request.params;
    return Object.fromEntries(params.keys().map((key) => [key, params.get(key)]));
  }

  async function showFirstPage(): Promise<void> {
    (await nextList()).flush(firstPage);
    await fixture.whenStable();
  }

  function rowTexts(): string[] {
    return Array.from((fixture.nativeElement as HTMLElement).querySelectorAll('tr.mat-mdc-row:not(.no-data)')).map(
      (row) => row.textContent ?? '',
    );
  }

  it('should ask the server for the first page sorted by e-mail', async () => {
    const request = await nextList();
    expect(paramsOf(request)).toEqual({ page: '0', pageSize: '20', sort: 'email', order: 'asc' });
    request.flush(firstPage);
  });

  it('should render one row per account of the answer', async () => {
    await showFirstPage();
    const rows = rowTexts();
    expect(rows.length).toBe(3);
    expect(rows[0]).toContain('admin1@example.com');
    expect(rows[0]).toContain('Demo admin 1');
    expect(rows[2]).toContain('reviewer3@example.com');
    const toggles = await loader.getAllHarnesses(MatSlideToggleHarness);
    expect(await Promise.all(toggles.map((toggle) => toggle.isChecked()))).toEqual([true, true, false]);
  });

  it('should send the sort column and order to the server', async () => {
    await showFirstPage();
    const sort = await loader.getHarness(MatSortHarness);
    const [displayName] = await sort.getSortHeaders({ label: 'Display name' });
    let clicked = displayName.click();
    const ascending = await nextList();
    expect(paramsOf(ascending)).toEqual(jasmine.objectContaining({ sort: 'displayName', order: 'asc', page: '0' }));
    ascending.flush(firstPage);
    await clicked;
    clicked = displayName.click();
    const descending = await nextList();
    expect(paramsOf(descending)).toEqual(jasmine.objectContaining({ sort: 'displayName', order: 'desc' }));
    descending.flush(firstPage);
    await clicked;
  });

  it('should send the page and page size to the server', async () => {
    await showFirstPage();
    const paginator = await loader.getHarness(MatPaginatorHarness);
    const turned = paginator.goToNextPage();
    const second = await nextList();
    expect(paramsOf(second)).toEqual(jasmine.objectContaining({ page: '1', pageSize: '20' }));
    second.flush({ ...firstPage, page: 1 });
    await turned;
    const resized = paginator.setPageSize(50);
    const larger = await nextList();
    expect(paramsOf(larger)).toEqual(jasmine.objectContaining({ pageSize: '50' }));
    larger.flush({ ...firstPage, pageSize: 50 });
    await resized;
  });

  it('should search on the server from the first page', async () => {
    await showFirstPage();
    const search = await loader.getHarness(MatInputHarness.with({ selector: '[type="search"]' }));
    await search.setValue('review');
    const request = await nextList();
    expect(paramsOf(request)).toEqual(jasmine.objectContaining({ q: 'review', page: '0' }));
    request.flush({ ...firstPage, items: [firstPage.items[2]], total: 1 });
    await fixture.whenStable();
    expect(rowTexts().length).toBe(1);
  });

  it('should change a role inline with a PATCH of that field only', async () => {
    await showFirstPage();
    const [, designerRole] = await loader.getAllHarnesses(MatSelectHarness);
    await designerRole.open();
    const chosen = designerRole.clickOptions({ text: 'reviewer' });
    const patch = await nextRequest('PATCH', `/api/users/${firstPage.items[1].id}`);
    expect(patch.request.body).toEqual({ role: 'reviewer' });
    patch.flush({ user: { ...firstPage.items[1], role: 'reviewer' } });
    await chosen;
    expect(await designerRole.getValueText()).toBe('reviewer');
    expect(await designerRole.isDisabled()).toBeFalse();
  });

  it('should put the toggle back and show why when the server refuses to disable the last admin', async () => {
    await showFirstPage();
    const [adminToggle] = await loader.getAllHarnesses(MatSlideToggleHarness);
    const toggled = adminToggle.toggle();
    const patch = await nextRequest('PATCH', `/api/users/${firstPage.items[0].id}`);
    expect(patch.request.body).toEqual({ disabled: true });
    patch.flush(
      { status: 409, title: 'Conflict', detail: 'At least one enabled administrator must remain.', errors: [] },
      { status: 409, statusText: 'Conflict' },
    );
    await toggled;
    expect(await adminToggle.isChecked()).toBeTrue();
    const snackBar = await TestbedHarnessEnvironment.documentRootLoader(fixture).getHarness(MatSnackBarHarness);
    expect(await snackBar.getMessage()).toBe('At least one enabled administrator must remain.');
  });

  it('should show the problem detail when the list cannot be loaded', async () => {
    (await nextList()).flush(
      { status: 403, title: 'Forbidden', detail: 'Only administrators manage accounts.', errors: [] },
      { status: 403, statusText: 'Forbidden' },
    );
    await fixture.whenStable();
    const alert: HTMLElement = fixture.nativeElement.querySelector('[data-testid="accounts-error"]');
    expect(alert.textContent).toContain('Only administrators manage accounts.');
  });
});
