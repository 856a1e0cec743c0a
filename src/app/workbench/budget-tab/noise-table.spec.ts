import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { analyseDesign } from '@shared/engine/analyse';
import demoPressure from '@shared/examples/demo-pressure.json';
import type { Budget, NoiseContribution } from '@shared/contracts/figures';
import { NoiseTable } from './noise-table';

function contribution(stage: string, source: string, outputRms: number, share: number, farad: number, pascal: number): NoiseContribution {
  return { stage, source, outputRms, share, inputReferred: { farad, pascal, cubicMetrePerSecond: null } };
}

/** The demo budget with a noise budget of known numbers: three sources whose shares are 64 %, 27 % and 9 %. */
function knownBudget(): Budget {
  const analysis = analyseDesign(demoPressure);
  if (!analysis.ok) throw new Error('the demo design must validate');
  return {
    ...analysis.budget,
    noise: {
      ...analysis.budget.noise,
      outputRms: 1e-4,
      bandLow: 0.1,
      bandHigh: 500,
      contributions: [
        contribution('adc', 'quantization noise', 3e-5, 0.09, 1e-18, 3),
        contribution('ca', 'voltage noise (times noise gain)', 8e-5, 0.64, 2.7e-18, 9),
        contribution('g1', 'voltage noise', 5.196e-5, 0.27, 1.75e-18, 5.8),
      ],
    },
    resolution: { ...analysis.budget.resolution, farad: 3.3e-18, pascal: 11, bandLow: 0.1, bandHigh: 500 },
  };
}

describe('NoiseTable', () => {
  let fixture: ComponentFixture<NoiseTable>;
  let element: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({ imports: [NoiseTable], providers: [provideHttpClient(), provideHttpClientTesting()] });
    fixture = TestBed.createComponent(NoiseTable);
    fixture.componentRef.setInput('budget', knownBudget());
    await fixture.whenStable();
    element = fixture.nativeElement;
  });

  function rows(): string[][] {
    return Array.from(element.querySelectorAll('tr.mat-mdc-row')).map((row) => Array.from(row.querySelectorAll('td')).map((cell) => cell.textContent?.trim() ?? ''));
  }

  it('should list every source, largest share first, with output RMS and input-referred aF and Pa', () => {
    expect(rows()).toEqual([
      ['voltage noise (times noise gain)', 'ca', '80 uV', '2.7 aF', '9 Pa', '64.0 %'],
      ['voltage noise', 'g1', '52 uV', '1.75 aF', '5.8 Pa', '27.0 %'],
      ['quantization noise', 'adc', '30 uV', '1 aF', '3 Pa', '9.00 %'],
    ]);
  });

  it('should total the noise over its band and give the resolution in the footer', () => {
    const footer = Array.from(element.querySelectorAll('tr.mat-mdc-footer-row td')).map((cell) => cell.textContent?.trim());
    expect(footer).toEqual(['Total', '', '100 uV rms, 100 mHz to 500 Hz', '3.3 aF', '11 Pa', '100 %']);
  });

  it('should draw one bar per source with its share', () => {
    const labels = Array.from(element.querySelectorAll('qb-bar-chart .value-label')).map((label) => label.textContent?.trim());
    expect(labels.length).toBe(3);
    expect(element.querySelectorAll('qb-bar-chart rect.bar').length).toBe(3);
    const names = Array.from(element.querySelectorAll('qb-bar-chart .node-label')).map((label) => label.textContent?.trim());
    expect(names).toEqual(['ca · voltage noise (times noise gain)', 'g1 · voltage noise', 'adc · quantization noise']);
    expect(labels).toEqual(['64.0 %', '27.0 %', '9.0 %']);
  });

  it('should sort by another column when its header is clicked', async () => {
    const stageHeader = Array.from(element.querySelectorAll<HTMLElement>('th')).find((th) => th.textContent?.includes('Stage'));
    stageHeader?.querySelector<HTMLElement>('.mat-sort-header-container')?.click();
    await fixture.whenStable();
    expect(rows().map((row) => row[1])).toEqual(['adc', 'ca', 'g1']);
  });
});
