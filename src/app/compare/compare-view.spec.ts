import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import demoPressure from '@shared/examples/demo-pressure.json';
import { CompareView } from './compare-view';

function documentWith(edit: (document: typeof demoPressure) => void): typeof demoPressure {
  const document = structuredClone(demoPressure);
  edit(document);
  return document;
}

function rows(element: HTMLElement, testId: string): string[][] {
  return [...element.querySelectorAll(`[data-testid="${testId}"] tbody tr`)].map((row) =>
    [...row.querySelectorAll('th > div, th:not(:has(div)), td:not(.arrow)')].map((cell) => (cell.textContent ?? '').replace(/\s+/g, ' ').trim()),
  );
}

describe('CompareView', () => {
  let fixture: ComponentFixture<CompareView>;

  beforeEach(() => {
    TestBed.configureTestingModule({ imports: [CompareView], providers: [provideHttpClient(), provideHttpClientTesting()] });
    fixture = TestBed.createComponent(CompareView);
  });

  async function compare(older: unknown, newer: unknown): Promise<HTMLElement> {
    fixture.componentRef.setInput('older', older);
    fixture.componentRef.setInput('newer', newer);
    fixture.componentRef.setInput('olderLabel', 'v1');
    fixture.componentRef.setInput('newerLabel', 'v2');
    await fixture.whenStable();
    return fixture.nativeElement as HTMLElement;
  }

  it('should list the changed fields with old and new values in display units', async () => {
    const newer = documentWith((d) => {
      d.excitation.amplitude = 1;
      d.chain[4]['corner'] = 300;
    });
    const element = await compare(demoPressure, newer);
    expect(rows(element, 'compare-fields')).toEqual([
      ['Excitation amplitude', 'excitation · amplitude', '2 V', '1 V'],
      ['Corner frequency', 'lp · corner', '500 Hz', '300 Hz'],
    ]);
    const headers = [...element.querySelectorAll('[data-testid="compare-fields"] thead th')].map((cell) => cell.textContent?.trim());
    expect(headers).toEqual(['Field', 'v1', '', 'v2']);
  });

  it('should show the direction of each figure by its sense', async () => {
    const newer = documentWith((d) => {
      d.chain[4]['corner'] = 300;
    });
    const element = await compare(demoPressure, newer);
    const direction = (key: string) => element.querySelector(`[data-figure="${key}"] [data-direction]`)?.getAttribute('data-direction');
    expect(direction('ripple')).toBe('better');
    expect(direction('outputNoise')).toBe('better');
    expect(direction('sensitivity')).toBe('same');
    expect(rows(element, 'compare-figures').map((row) => row[0])).toEqual([
      'Sensitivity',
      'Resolution in capacitance',
      'Resolution in pressure',
      'Total output noise',
      'Worst headroom used',
      'Carrier ripple at the output',
    ]);
  });

  it('should name a removed stage once instead of listing shifted fields', async () => {
    const newer = documentWith((d) => {
      d.chain.splice(1, 1);
    });
    const element = await compare(demoPressure, newer);
    expect(element.querySelector('[data-testid="compare-stages"]')?.textContent?.replace(/\s+/g, ' ').trim()).toBe('g1 (gain) removed');
    expect(element.querySelector('[data-testid="compare-no-fields"]')).not.toBeNull();
  });

  it('should list a finding that appears in the newer version as added', async () => {
    const newer = documentWith((d) => {
      d.chain[4]['corner'] = 40000;
    });
    const element = await compare(demoPressure, newer);
    const added = [...element.querySelectorAll('[data-testid="compare-findings"] li.added')].map((item) => item.querySelector('.place')?.textContent?.trim());
    expect(added).toContain('lp · corner');
  });

  it('should say when a version does not validate and leave the figures out', async () => {
    const newer = documentWith((d) => {
      d.chain[4]['corner'] = -5;
    });
    const element = await compare(demoPressure, newer);
    expect(element.querySelector('[data-testid="compare-invalid"]')?.textContent).toContain('v2 does not validate');
    expect(element.querySelector('[data-testid="compare-figures"]')).toBeNull();
  });
});
