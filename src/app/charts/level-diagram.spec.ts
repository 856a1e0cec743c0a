import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import type { NodeLevel } from '@shared/contracts/figures';
import { LevelDiagram } from './level-diagram';

const levels: NodeLevel[] = [
  { node: 'ca', kind: 'chargeAmplifier', domain: 'carrier', peak: 1, centre: 2.5, swingLow: 0.1, swingHigh: 4.9, usedFraction: 1 / 2.4 },
  { node: 'hp', kind: 'highPass', domain: 'carrier', peak: 1.2, centre: 2.5, swingLow: null, swingHigh: null, usedFraction: null },
  { node: 'g1', kind: 'gain', domain: 'carrier', peak: 3, centre: 2.5, swingLow: 0.1, swingHigh: 4.9, usedFraction: 1.25 },
];

describe('LevelDiagram', () => {
  let fixture: ComponentFixture<LevelDiagram>;
  let element: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({ imports: [LevelDiagram], providers: [provideHttpClient(), provideHttpClientTesting()] });
    fixture = TestBed.createComponent(LevelDiagram);
    element = fixture.nativeElement as HTMLElement;
    fixture.componentRef.setInput('levels', levels);
    fixture.componentRef.setInput('closestToClipping', 'g1');
    await fixture.whenStable();
  });

  it('should draw a swing band for every node that has a swing and a signal span for every node', () => {
    expect(element.querySelectorAll('g.node').length).toBe(3);
    expect(element.querySelectorAll('rect.swing-band').length).toBe(2);
    expect(element.querySelectorAll('rect.signal-span').length).toBe(3);
    expect(Array.from(element.querySelectorAll('.node-label'), (label) => label.textContent)).toEqual(['ca', 'hp', 'g1']);
  });

  it('should place the signal span at centre plus and minus peak on the voltage axis', () => {
    const band = element.querySelector('[data-node="ca"] rect.swing-band') as SVGRectElement;
    const span = element.querySelector('[data-node="ca"] rect.signal-span') as SVGRectElement;
    // Swing 0.1..4.9 V is 4.8 V tall, the span 1.5..3.5 V is 2 V tall.
    const ratio = Number(span.getAttribute('height')) / Number(band.getAttribute('height'));
    expect(ratio).toBeCloseTo(2 / 4.8, 6);
    const ticks = Array.from(element.querySelectorAll('.y-axis .tick text'), (text) => text.textContent);
    expect(ticks).toEqual(jasmine.arrayContaining(['0', '2', '4']));
  });

  it('should mark the clipping node in the alarm class and name the node closest to clipping', () => {
    const clipping = Array.from(element.querySelectorAll('g.node.clipping'), (node) => node.getAttribute('data-node'));
    expect(clipping).toEqual(['g1']);
    expect(element.querySelector('g.node.closest')?.getAttribute('data-node')).toBe('g1');
    expect(element.querySelectorAll('.closest-tag').length).toBe(1);
    expect(element.querySelector('[data-node="g1"] .used-label')?.textContent).toBe('125 %');
  });

  it('should emit the stage id of a clicked node and highlight the node it is given', async () => {
    const picked: string[] = [];
    fixture.componentInstance.nodePicked.subscribe((node) => picked.push(node));
    (element.querySelector('[data-node="hp"]') as SVGGElement).dispatchEvent(new MouseEvent('click', { bubbles: true }));
    expect(picked).toEqual(['hp']);

    fixture.componentRef.setInput('highlight', 'ca');
    await fixture.whenStable();
    expect(Array.from(element.querySelectorAll('g.node.highlighted'), (node) => node.getAttribute('data-node'))).toEqual(['ca']);
  });
});
