import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import type { DimensionName } from '@shared/units';
import { EngineeringInput } from './engineering-input';

@Component({
  imports: [EngineeringInput, ReactiveFormsModule],
  template: `<qb-engineering-input label="Feedback capacitance" [dimension]="dimension()" path="chain[0].feedbackCapacitance" [formControl]="control" />`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {
  readonly control = new FormControl<number | null>(1e-12);
  readonly dimension = signal<DimensionName | null>('capacitance');
}

describe('EngineeringInput', () => {
  let fixture: ComponentFixture<Host>;
  let host: Host;
  let input: HTMLInputElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({ imports: [Host], providers: [provideHttpClient(), provideHttpClientTesting()] });
    fixture = TestBed.createComponent(Host);
    host = fixture.componentInstance;
    await fixture.whenStable();
    input = fixture.nativeElement.querySelector('input');
  });

  async function type(text: string): Promise<void> {
    input.value = text;
    input.dispatchEvent(new Event('input'));
    await fixture.whenStable();
  }

  function text(selector: string): string {
    return (fixture.nativeElement.querySelector(selector)?.textContent ?? '').trim();
  }

  it('should write the control value back in engineering units with the unit as a suffix', () => {
    expect(input.value).toBe('1 pF');
    expect(text('.unit')).toBe('F');
  });

  it('should parse "2.2 pF" and "2.2p" to 2.2e-12 and show the value it read', async () => {
    await type('2.2 pF');
    expect(host.control.value).toBeCloseTo(2.2e-12, 24);
    expect(host.control.valid).toBeTrue();
    expect(text('mat-hint')).toBe('= 2.2e-12 F');
    await type('2.2p');
    expect(host.control.value).toBeCloseTo(2.2e-12, 24);
  });

  it('should show the dimension error in place and make the control invalid', async () => {
    await type('50 kHz');
    expect(host.control.value).toBeNull();
    expect(host.control.hasError('quantity')).toBeTrue();
    expect(text('mat-error')).toBe('expected a capacitance, got a frequency');
    expect(fixture.nativeElement.querySelector('mat-form-field').classList).toContain('mat-form-field-invalid');
    await type('3.3 pF');
    expect(host.control.valid).toBeTrue();
    expect(fixture.nativeElement.querySelector('mat-error')).toBeNull();
  });

  it('should show the formatted value when the form sets one, and the canonical form when the field is left', async () => {
    host.control.setValue(4.7e-15);
    await fixture.whenStable();
    expect(input.value).toBe('4.7 fF');
    await type('0.0047p');
    input.dispatchEvent(new Event('blur'));
    await fixture.whenStable();
    expect(input.value).toBe('4.7 fF');
    expect(host.control.touched).toBeTrue();
  });

  it('should show an error the design check put on the control', async () => {
    host.control.setErrors({ design: 'Feedback capacitance must be above 0 F' });
    host.control.markAsTouched();
    await fixture.whenStable();
    expect(text('mat-error')).toBe('Feedback capacitance must be above 0 F');
  });

  it('should read plain numbers with an SI prefix when the field has no dimension', async () => {
    host.dimension.set(null);
    await fixture.whenStable();
    await type('1.5k');
    expect(host.control.value).toBe(1500);
    await type('four');
    expect(text('mat-error')).toBe('"four" is not a number');
  });
});
