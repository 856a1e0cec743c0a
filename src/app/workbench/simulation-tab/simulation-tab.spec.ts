import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import type { Type } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { validateDesign, type Design } from '@shared/contracts/design';
import { evaluateBudget } from '@shared/engine/index';
import demoPressure from '@shared/examples/demo-pressure.json';
import { SpectraTab } from '../spectra-tab/spectra-tab';
import { SimulationSession } from './simulation-session';
import { SimulationTab } from './simulation-tab';

function demoDesign(): Design {
  const result = validateDesign(demoPressure);
  if (!result.ok) throw new Error(JSON.stringify(result.errors));
  return result.design;
}

describe('SimulationTab and SpectraTab', () => {
  let design: Design;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [SimulationSession, provideHttpClient(), provideHttpClientTesting()] });
    design = demoDesign();
  });

  async function create<T>(component: Type<T>): Promise<ComponentFixture<T>> {
    const fixture = TestBed.createComponent(component);
    fixture.componentRef.setInput('design', design);
    fixture.componentRef.setInput('budget', evaluateBudget(design));
    await fixture.whenStable();
    return fixture;
  }

  async function until(fixture: ComponentFixture<unknown>, condition: () => boolean): Promise<void> {
    for (let attempt = 0; attempt < 400 && !condition(); attempt++) {
      await new Promise((resolve) => setTimeout(resolve, 25));
      await fixture.whenStable();
    }
    expect(condition()).withContext('waited for the simulation').toBeTrue();
  }

  const find = (fixture: ComponentFixture<unknown>, testId: string) => (fixture.nativeElement as HTMLElement).querySelector(`[data-testid="${testId}"]`);

  it('should run in the worker with progress and a cancel button, then set the simulated figures beside the analytic ones', async () => {
    const fixture = await create(SimulationTab);
    const duration = find(fixture, 'simulation-duration') as HTMLInputElement;
    duration.value = '20 ms';
    duration.dispatchEvent(new Event('input'));
    await fixture.whenStable();

    (find(fixture, 'simulation-run') as HTMLButtonElement).click();
    await fixture.whenStable();
    expect(find(fixture, 'simulation-cancel')).not.toBeNull();
    expect(find(fixture, 'simulation-progress')).not.toBeNull();

    await until(fixture, () => find(fixture, 'simulation-result') !== null);
    expect(find(fixture, 'simulation-cancel')).toBeNull();
    const figures = Array.from(fixture.nativeElement.querySelectorAll('.agreement tbody th'), (cell: Element) => cell.textContent ?? '');
    expect(figures[0]).toMatch(/^Output RMS noise/);
    expect(figures).toContain('DC sensitivity');
    const sensitivity = Array.from(fixture.nativeElement.querySelectorAll('.agreement tbody tr') as NodeListOf<HTMLTableRowElement>).find(
      (row) => row.cells[0].textContent === 'DC sensitivity',
    );
    expect(sensitivity?.cells[3].textContent).toMatch(/^[+-]\d+\.\d %$/);
    // The run held the input at zero, the budget's ripple is at full scale: shown, not compared.
    const ripple = Array.from(fixture.nativeElement.querySelectorAll('.agreement tbody tr') as NodeListOf<HTMLTableRowElement>).find((row) =>
      row.cells[0].textContent?.startsWith('Carrier ripple'),
    );
    expect(ripple?.cells[3].textContent).toBe('-');
    // The last analog node and the output, one curve each, drawn a task after the figures.
    await until(fixture, () => fixture.nativeElement.querySelector('[data-testid="simulation-waveforms"]') !== null);
    expect(fixture.nativeElement.querySelectorAll('[data-testid="simulation-waveforms"] path.line').length).toBe(2);
  });

  it('should offer a noise-only run when nothing has run, then draw the spectrum with the carrier harmonics marked', async () => {
    const fixture = await create(SpectraTab);
    expect(find(fixture, 'spectrum-chart')).toBeNull();
    (find(fixture, 'spectrum-run') as HTMLButtonElement).click();
    await until(fixture, () => find(fixture, 'spectrum-chart')?.querySelector('path.line') != null);
    const chart = find(fixture, 'spectrum-chart') as HTMLElement;
    expect(chart.querySelectorAll('path.line').length).toBe(1);
    // lp runs at 64 x 50 kHz: f0 to 7 f0 all lie below its Nyquist frequency.
    expect(Array.from(chart.querySelectorAll('.marker-label'), (label) => label.textContent)).toEqual(['f0', '2 f0', '3 f0', '4 f0', '5 f0', '6 f0', '7 f0']);
    expect(Array.from(chart.querySelectorAll('.x-axis .tick text'), (text) => text.textContent)).toContain('100k');
  });
});
