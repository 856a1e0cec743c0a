import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { tableToCsv } from './chart-export';
import type { LineSeries, PickedPoint } from './chart-types';
import { LineChart } from './line-chart';

describe('LineChart', () => {
  let fixture: ComponentFixture<LineChart>;
  let element: HTMLElement;

  const squares: LineSeries = { name: 'output', x: [0, 1, 2, 3, 4], y: [0, 1, 4, 9, 16] };
  const envelope: LineSeries = {
    name: 'g1',
    x: Float64Array.from([0, 1, 2, 3, 4]),
    y: Float64Array.from([2, 2, 2, 2, 2]),
    yLow: Float64Array.from([1, 1.5, 1, 1.5, 1]),
    yHigh: Float64Array.from([3, 2.5, 3, 2.5, 3]),
  };

  beforeEach(() => {
    TestBed.configureTestingModule({ imports: [LineChart], providers: [provideHttpClient(), provideHttpClientTesting()] });
    fixture = TestBed.createComponent(LineChart);
    element = fixture.nativeElement as HTMLElement;
  });

  async function render(inputs: Record<string, unknown>): Promise<void> {
    for (const [name, value] of Object.entries(inputs)) fixture.componentRef.setInput(name, value);
    await fixture.whenStable();
  }

  function tickLabels(axis: 'x-axis' | 'y-axis'): string[] {
    return Array.from(element.querySelectorAll(`.${axis} .tick text`), (text) => text.textContent ?? '');
  }

  it('should draw one line per series and a band for an envelope', async () => {
    await render({ series: [squares, envelope], xLabel: 'Time [s]', yLabel: 'Voltage [V]' });
    expect(element.querySelectorAll('path.line').length).toBe(2);
    expect(element.querySelectorAll('path.band').length).toBe(1);
    const line = element.querySelector('path.line') as SVGPathElement;
    // Five points: a move and four segments.
    expect(line.getAttribute('d')?.match(/[ML]/g)?.length).toBe(5);
    expect(element.querySelectorAll('.legend .legend-label').length).toBe(2);
  });

  it('should label a linear axis at round values and a log axis at decades with SI prefixes', async () => {
    await render({ series: [squares] });
    expect(tickLabels('y-axis')).toEqual(['0', '5', '10', '15']);
    expect(tickLabels('x-axis')).toEqual(jasmine.arrayContaining(['0', '1', '2', '3', '4']));

    await render({ series: [{ name: 'psd', x: [1, 10, 100, 1000, 10000], y: [1e-9, 1e-8, 1e-7, 1e-8, 1e-9] }], xScale: 'log', yScale: 'log' });
    expect(tickLabels('x-axis')).toEqual(jasmine.arrayContaining(['1', '10', '100', '1k', '10k']));
    expect(element.querySelectorAll('.x-axis .tick').length).toBeGreaterThan(5);
    expect(tickLabels('y-axis')).toContain('100n');
  });

  it('should leave out points a log axis cannot place', async () => {
    await render({ series: [{ name: 'psd', x: [0, 1, 10, 100], y: [5, 1, 2, 3] }], xScale: 'log' });
    expect((element.querySelector('path.line') as SVGPathElement).getAttribute('d')?.match(/[ML]/g)?.length).toBe(3);
  });

  it('should draw a marker only where it lies inside the x range', async () => {
    await render({ series: [squares], markers: [{ x: 2, label: 'f0' }, { x: 9, label: '3 f0' }] });
    expect(element.querySelectorAll('line.marker').length).toBe(1);
    expect(element.querySelector('.marker-label')?.textContent).toBe('f0');
  });

  it('should read and pick the point nearest the pointer', async () => {
    await render({ series: [squares], xUnit: 's', yUnit: 'V' });
    const picked: PickedPoint[] = [];
    fixture.componentInstance.pointPicked.subscribe((point) => picked.push(point));
    const overlay = element.querySelector('rect.overlay') as SVGRectElement;
    const box = overlay.getBoundingClientRect();
    // x = 3 sits at three quarters of the width; y = 9 of a 0..16 axis at 9/16 of the height from the bottom.
    const at = { clientX: box.left + box.width * 0.75, clientY: box.top + box.height * (1 - 9 / 16), bubbles: true };
    overlay.dispatchEvent(new PointerEvent('pointermove', at));
    await fixture.whenStable();
    expect(element.querySelector('[data-testid="chart-readout"]')?.textContent?.trim()).toBe('output: 3 s, 9 V');
    overlay.dispatchEvent(new MouseEvent('click', at));
    expect(picked).toEqual([{ series: 'output', index: 3, x: 3, y: 9 }]);
  });

  it('should give every point of every series in its CSV, with the band where there is one', async () => {
    await render({ series: [squares, envelope], xLabel: 'Time [s]', yLabel: 'Voltage [V]' });
    const csv = tableToCsv((fixture.componentInstance as unknown as { table: () => Parameters<typeof tableToCsv>[0] }).table());
    const lines = csv.trimEnd().split('\r\n');
    expect(lines[0]).toBe('series,Time [s],Voltage [V],Voltage [V] low,Voltage [V] high');
    expect(lines.length).toBe(11);
    expect(lines[4]).toBe('output,3,9,,');
    expect(lines[6]).toBe('g1,0,2,1,3');
  });
});
