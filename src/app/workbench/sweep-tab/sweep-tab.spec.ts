import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { validateDesign, type Design } from '@shared/contracts/design';
import { evaluateBudget, sweepBudget } from '@shared/engine/index';
import demoPressure from '@shared/examples/demo-pressure.json';
import { bestWithinHeadroom, type SweepRow } from './sweep-figures';
import { sweepParameters } from './sweep-parameters';
import { SweepTab, type SweepApply } from './sweep-tab';

function demoDesign(): Design {
  const result = validateDesign(demoPressure);
  if (!result.ok) throw new Error(JSON.stringify(result.errors));
  return result.design;
}

function row(value: number, resolution: number | null, worst: number | null, error: string | null = null): SweepRow {
  return { value, resolutionFarad: resolution, resolutionMeasurand: resolution, worstUsedFraction: worst, worstNode: 'g1', ripple: 1e-6, error };
}

describe('bestWithinHeadroom', () => {
  it('should take the finest resolution among the points that clip nowhere', () => {
    const rows = [row(1, 5e-18, 0.4), row(2, 3e-18, 0.9), row(3, 1e-18, 1.3), row(4, 2e-18, 1.0), row(5, null, null, 'chain[0]: bad')];
    expect(bestWithinHeadroom(rows)?.value).toBe(4);
  });

  it('should find nothing when every point clips or fails', () => {
    expect(bestWithinHeadroom([row(1, 1e-18, 1.01), row(2, null, null, 'x')])).toBeNull();
  });
});

describe('sweepParameters', () => {
  it('should list the numbers of the design by path in the trade words', () => {
    const parameters = sweepParameters(demoDesign());
    const byPath = new Map(parameters.map((p) => [p.path, p]));
    expect(byPath.get('excitation.amplitude')?.label).toBe('Excitation amplitude');
    expect(byPath.get('chain[0].feedbackCapacitance')?.group).toBe('Charge amplifier ca');
    expect(byPath.get('chain[4].corner')?.label).toBe('Corner frequency');
    expect(byPath.get('chain[1].outputSwing[1]')?.label).toBe('Output swing high end');
    expect(byPath.get('sensor.cellA.baseCapacitance')?.label).toBe('Cell A base capacitance');
  });
});

describe('SweepTab', () => {
  let fixture: ComponentFixture<SweepTab>;
  let element: HTMLElement;
  let design: Design;
  const applied: SweepApply[] = [];

  beforeEach(async () => {
    TestBed.configureTestingModule({ imports: [SweepTab], providers: [provideHttpClient(), provideHttpClientTesting()] });
    design = demoDesign();
    fixture = TestBed.createComponent(SweepTab);
    element = fixture.nativeElement as HTMLElement;
    fixture.componentRef.setInput('design', design);
    fixture.componentRef.setInput('budget', evaluateBudget(design));
    applied.length = 0;
    fixture.componentInstance.apply.subscribe((change) => applied.push(change));
    await fixture.whenStable();
  });

  async function type(testId: string, text: string): Promise<void> {
    const input = element.querySelector(`[data-testid="${testId}"]`) as HTMLInputElement;
    input.value = text;
    input.dispatchEvent(new Event('input'));
    await fixture.whenStable();
  }

  async function until(condition: () => boolean): Promise<void> {
    for (let attempt = 0; attempt < 200 && !condition(); attempt++) {
      await new Promise((resolve) => setTimeout(resolve, 25));
      await fixture.whenStable();
    }
    expect(condition()).withContext('waited for the sweep').toBeTrue();
  }

  it('should start from a range around the excitation amplitude', () => {
    expect((element.querySelector('[data-testid="sweep-from"]') as HTMLInputElement).value).toBe('500 mV');
    expect((element.querySelector('[data-testid="sweep-to"]') as HTMLInputElement).value).toBe('8 V');
  });

  it('should emit the value with the best resolution that clips nowhere', async () => {
    await type('sweep-from', '0.5 V');
    await type('sweep-to', '10 V');
    await type('sweep-points', '20');
    (element.querySelector('[data-testid="sweep-run"]') as HTMLButtonElement).click();
    await until(() => element.querySelector('[data-testid="sweep-result"]') !== null);
    expect(element.querySelectorAll('qb-line-chart').length).toBe(3);

    // Resolution keeps improving with the amplitude; the gain stage clips above about 7.5 V.
    const reference = sweepBudget(design, { path: 'excitation.amplitude', from: 0.5, to: 10, points: 20, scale: 'log' });
    if (!reference.ok) throw new Error(reference.message);
    const fitting = reference.points.filter((p) => p.budget !== null && p.budget.levels.every((level) => (level.usedFraction ?? 0) <= 1));
    const resolution = (p: (typeof reference.points)[number]) => p.budget?.resolution.pascal ?? Infinity;
    const expected = fitting.reduce((best, p) => (resolution(p) < resolution(best) ? p : best));
    const finest = reference.points.reduce((best, p) => (resolution(p) < resolution(best) ? p : best));
    // The finest resolution of all lies past the clipping edge, so the choice has to skip it.
    expect(fitting.length).toBeLessThan(reference.points.length);
    expect(expected.value).toBeLessThan(finest.value);

    (element.querySelector('[data-testid="sweep-best"]') as HTMLButtonElement).click();
    expect(applied).toEqual([{ path: 'excitation.amplitude', value: expected.value }]);
  });

  it('should sweep more than 100 points in a worker and show its curves', async () => {
    await type('sweep-points', '120');
    expect(element.textContent).toContain('in a background worker');
    (element.querySelector('[data-testid="sweep-run"]') as HTMLButtonElement).click();
    await fixture.whenStable();
    await until(() => element.querySelector('[data-testid="sweep-result"]') !== null);
    const line = element.querySelector('[data-testid="sweep-chart-resolution"] path.line') as SVGPathElement;
    expect(line.getAttribute('d')?.match(/[ML]/g)?.length).toBe(120);
  });
});
