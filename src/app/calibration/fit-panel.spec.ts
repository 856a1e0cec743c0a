import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import type { BenchPoint, Dataset } from '@shared/contracts/calibration';
import { FitPanel } from './fit-panel';

/** y = x^2 on [0, 1] in a single run (ENGINE.md section 8 check case), stored as reference Pa and readout V. */
function checkCaseDataset(): Dataset {
  const points: BenchPoint[] = Array.from({ length: 11 }, (_, i) => ({ reference: i / 10, readout: (i / 10) ** 2, cell: 'C1', run: '1', direction: 'up', time: null, row: i + 2 }));
  return {
    id: '00000000-0000-4000-9000-0000000000d1',
    designId: '00000000-0000-4000-9000-000000000001',
    name: 'check case',
    notes: '',
    fileName: 'check.csv',
    fileSize: 100,
    pointCount: points.length,
    cells: ['C1'],
    runs: ['1'],
    units: { reference: 'Pa', referenceDisplay: 'Pa', readout: 'V', readoutDisplay: 'V' },
    referenceRange: { min: 0, max: 1 },
    mapping: {},
    createdBy: { id: '00000000-0000-4000-8000-000000000002', displayName: 'Demo Designer' },
    createdAt: '2026-12-01T10:00:00.000Z',
    points,
  };
}

describe('FitPanel', () => {
  let fixture: ComponentFixture<FitPanel>;
  const element = () => fixture.nativeElement as HTMLElement;
  const rows = (id: string) => [...element().querySelectorAll(`[data-testid="${id}"] tbody tr`)].map((row) => [...row.querySelectorAll('td')].map((cell) => cell.textContent?.trim() ?? ''));

  beforeEach(async () => {
    await TestBed.configureTestingModule({ imports: [FitPanel], providers: [provideHttpClient(), provideHttpClientTesting()] }).compileComponents();
    fixture = TestBed.createComponent(FitPanel);
    fixture.componentRef.setInput('dataset', checkCaseDataset());
    await fixture.whenStable();
  });

  it('should name the line each nonlinearity figure is measured against for a straight line', async () => {
    const component = fixture.componentInstance as unknown as { degree: { set(value: number): void }; direction: { set(value: string): void } };
    component.direction.set('characteristic');
    component.degree.set(1);
    await fixture.whenStable();
    const nonlinearity = rows('percent-figures').filter((row) => row[0] === 'nonlinearity');
    expect(nonlinearity.map((row) => row[2])).toEqual(['least-squares line', 'terminal-based line', 'minimax line']);
    // 11 points: terminal 25 %FS and minimax 12.5 %FS exactly (set points at 0, 0.5 and 1).
    expect(nonlinearity[1][1]).toBe('25.00');
    expect(nonlinearity[2][1]).toBe('12.50');
  });

  it('should fit the characteristic quadratic exactly and compare degrees 1-5', async () => {
    (fixture.componentInstance as unknown as { direction: { set(value: string): void } }).direction.set('characteristic');
    await fixture.whenStable();
    const coefficients = rows('coefficients');
    expect(coefficients.length).toBe(3);
    expect(element().querySelector('[data-testid="r2"]')?.textContent?.trim()).toBe('1.000000000');
    const comparison = rows('degree-comparison');
    expect(comparison.map((row) => row[0])).toEqual(['1', '2', '3', '4', '5']);
    expect(element().querySelectorAll('qb-line-chart').length).toBe(3);
  });
});
