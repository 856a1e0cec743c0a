import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import type { DatasetPreview } from '@shared/contracts/calibration';
import { UploadMapping } from './upload-mapping';

const designId = '00000000-0000-4000-9000-000000000001';
const columns = ['cell', 'run', 'direction', 'pressure_kPa', 'output_mV', 'time_s'];

function preview(overrides: Partial<DatasetPreview>): DatasetPreview {
  return {
    fileName: 'bench.csv',
    columns,
    delimiter: ',',
    rowCount: 3,
    rows: [{ cell: 'C1', run: '1', direction: 'up', pressure_kPa: '0', output_mV: '1.5', time_s: '0' }],
    points: [],
    errors: [],
    errorCount: 0,
    complete: false,
    ...overrides,
  };
}

describe('UploadMapping', () => {
  let fixture: ComponentFixture<UploadMapping>;
  let http: HttpTestingController;
  const element = () => fixture.nativeElement as HTMLElement;
  const button = (id: string) => element().querySelector<HTMLButtonElement>(`[data-testid="${id}"]`)!;

  async function chooseFile(): Promise<void> {
    const input = element().querySelector<HTMLInputElement>('[data-testid="bench-file"]')!;
    const transfer = new DataTransfer();
    transfer.items.add(new File(['cell,run\n'], 'bench.csv', { type: 'text/csv' }));
    input.files = transfer.files;
    input.dispatchEvent(new Event('change'));
    const request = http.expectOne(`/api/designs/${designId}/datasets/preview`);
    expect((request.request.body as FormData).get('referenceColumn')).toBeNull();
    request.flush(preview({}));
    await fixture.whenStable();
  }

  beforeEach(async () => {
    await TestBed.configureTestingModule({ imports: [UploadMapping], providers: [provideHttpClient(), provideHttpClientTesting()] }).compileComponents();
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(UploadMapping);
    fixture.componentRef.setInput('designId', designId);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  it('should guess the columns and units from the header and show the first rows', async () => {
    await chooseFile();
    expect(element().querySelector('[data-testid="map-reference"]')?.textContent).toContain('pressure_kPa');
    expect(element().querySelector('[data-testid="map-readout"]')?.textContent).toContain('output_mV');
    expect(element().querySelector('[data-testid="map-direction"]')?.textContent).toContain('direction');
    expect(element().textContent).toContain('kPa');
    expect(element().textContent).toContain('mV');
    const cells = [...element().querySelectorAll('[data-testid="preview-table"] tbody td')].map((cell) => cell.textContent?.trim());
    expect(cells).toEqual(['2', 'C1', '1', 'up', '0', '1.5', '0']);
    expect(button('store-dataset').disabled).toBeTrue();
  });

  it('should list the row errors and keep storing disabled until the rows read', async () => {
    await chooseFile();
    button('check-rows').click();
    const check = http.expectOne(`/api/designs/${designId}/datasets/preview`);
    const sent = check.request.body as FormData;
    expect(sent.get('referenceColumn')).toBe('pressure_kPa');
    expect(sent.get('referenceUnit')).toBe('kPa');
    expect(sent.get('readoutUnit')).toBe('mV');
    expect(sent.get('timeColumn')).toBe('time_s');
    check.flush(preview({ complete: true, errorCount: 1, errors: [{ path: 'file.rows[214].readout', message: 'row 214: readout is not a number ("x" in column "output_mV")' }] }));
    await fixture.whenStable();
    expect(element().querySelector('[data-testid="row-errors"]')?.textContent).toContain('row 214: readout is not a number');
    expect(button('store-dataset').disabled).toBeTrue();
  });

  it('should store the file once every row reads and report the stored dataset', async () => {
    await chooseFile();
    const stored: string[] = [];
    fixture.componentInstance.stored.subscribe((summary) => stored.push(summary.id));
    button('check-rows').click();
    http.expectOne(`/api/designs/${designId}/datasets/preview`).flush(preview({ complete: true }));
    await fixture.whenStable();
    expect(element().querySelector('[data-testid="rows-ok"]')?.textContent).toContain('All 3 rows read');
    button('store-dataset').click();
    const upload = http.expectOne({ method: 'POST', url: `/api/designs/${designId}/datasets` });
    expect((upload.request.body as FormData).get('file')).toBeInstanceOf(File);
    upload.flush({ id: 'stored-dataset' });
    expect(stored).toEqual(['stored-dataset']);
  });

  it('should show the server problem for a file it refuses', async () => {
    const input = element().querySelector<HTMLInputElement>('[data-testid="bench-file"]')!;
    const transfer = new DataTransfer();
    transfer.items.add(new File([''], 'empty.csv'));
    input.files = transfer.files;
    input.dispatchEvent(new Event('change'));
    http
      .expectOne(`/api/designs/${designId}/datasets/preview`)
      .flush({ status: 400, title: 'Bad request', detail: 'The file is empty: upload a CSV file with a header row and one row per point.', errors: [] }, { status: 400, statusText: 'Bad Request' });
    await fixture.whenStable();
    expect(element().querySelector('[data-testid="upload-problem"]')?.textContent).toContain('The file is empty');
  });
});
