import { ChangeDetectionStrategy, Component, DestroyRef, OnInit, computed, effect, inject, input, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import {
  AbstractControl,
  ControlValueAccessor,
  FormControl,
  NgControl,
  PristineChangeEvent,
  ReactiveFormsModule,
  StatusChangeEvent,
  TouchedChangeEvent,
  ValidationErrors,
  ValidatorFn,
} from '@angular/forms';
import { ErrorStateMatcher } from '@angular/material/core';
import { MatError, MatFormField, MatHint, MatLabel, MatSuffix } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import type { DimensionName } from '@shared/units';
import { formatEngineeringValue, parseEngineeringValue, unitOf } from './engineering-value';

function siText(value: number): string {
  const magnitude = Math.abs(value);
  if (magnitude !== 0 && (magnitude >= 1e4 || magnitude < 1e-3)) return value.toExponential(3).replace(/\.?0+e/, 'e').replace('e+', 'e');
  return String(Number(value.toPrecision(4)));
}

/** The message of the first error on a control, in the order a designer should read them. */
export function controlErrorMessage(errors: ValidationErrors | null): string | null {
  if (errors === null) return null;
  if (typeof errors['quantity'] === 'string') return errors['quantity'];
  if (typeof errors['design'] === 'string') return errors['design'];
  if (typeof errors['server'] === 'string') return errors['server'];
  if (errors['required']) return 'A value is required';
  if (errors['min']) return `Must be at least ${errors['min'].min}`;
  if (errors['max']) return `Must be at most ${errors['max'].max}`;
  if (errors['integer']) return 'Must be a whole number';
  return 'Not valid';
}

/**
 * A number typed with engineering units on a Material form field: "2.2 pF", "2.2p", "50 kHz",
 * "8 nV/rtHz". The form control holds the SI value (null while the text cannot be read, with the
 * reason as its `quantity` error); the field shows the value it read, or the error, in place.
 */
@Component({
  selector: 'qb-engineering-input',
  imports: [MatError, MatFormField, MatHint, MatInput, MatLabel, MatSuffix, ReactiveFormsModule],
  templateUrl: './engineering-input.html',
  styleUrl: './engineering-input.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class EngineeringInput implements ControlValueAccessor, OnInit {
  private readonly ngControl = inject(NgControl, { self: true, optional: true });
  private readonly destroyRef = inject(DestroyRef);

  readonly label = input.required<string>();
  /** The physical quantity; null for a plain number such as a gain or a phase. */
  readonly dimension = input<DimensionName | null>(null);
  /** Unit shown for a plain number (V/V, deg). */
  readonly unit = input('');
  /** An empty field is a value (null) rather than an error. */
  readonly optional = input(false);
  /** Shown under an empty optional field. */
  readonly emptyHint = input('');
  /** Document path of the value (e.g. `chain[4].corner`), so that a finding can find and focus the field. */
  readonly path = input('');

  protected readonly text = new FormControl('', { nonNullable: true });
  protected readonly suffix = computed(() => unitOf(this.dimension(), this.unit()));
  /** What the text was read as, for the hint. */
  protected readonly reading = signal<string | null>(null);
  protected readonly empty = signal(true);
  /** The error shown in place: once the field has been edited or left, or when the design check put one on it. */
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly errorStateMatcher: ErrorStateMatcher = { isErrorState: () => this.errorMessage() !== null };

  private parseError: string | null = null;
  private value: number | null = null;
  private onChange: (value: number | null) => void = () => undefined;
  private onTouched: () => void = () => undefined;

  private readonly validator: ValidatorFn = () => (this.parseError === null ? null : { quantity: this.parseError });

  constructor() {
    if (this.ngControl) this.ngControl.valueAccessor = this;
    this.text.valueChanges.pipe(takeUntilDestroyed()).subscribe((text) => this.read(text));
    // A new dimension (full scale switching from Pa to m^3/s) rewrites the value in its unit.
    effect(() => {
      const dimension = this.dimension();
      if (this.value !== null && this.parseError === null) this.showValue(this.value, dimension);
    });
  }

  ngOnInit(): void {
    const control = this.outer();
    if (control === null) return;
    control.addValidators(this.validator);
    control.updateValueAndValidity({ emitEvent: false });
    this.showErrorOf(control);
    control.events.pipe(takeUntilDestroyed(this.destroyRef)).subscribe((event) => {
      if (event instanceof StatusChangeEvent || event instanceof TouchedChangeEvent || event instanceof PristineChangeEvent) this.showErrorOf(control);
    });
  }

  writeValue(value: number | null): void {
    this.parseError = null;
    this.value = value;
    this.showValue(value, this.dimension());
  }

  registerOnChange(onChange: (value: number | null) => void): void {
    this.onChange = onChange;
  }

  registerOnTouched(onTouched: () => void): void {
    this.onTouched = onTouched;
  }

  setDisabledState(disabled: boolean): void {
    if (disabled) this.text.disable({ emitEvent: false });
    else this.text.enable({ emitEvent: false });
  }

  /** On leaving the field, a readable value is written back in its canonical form ("2.2p" becomes "2.2 pF"). */
  protected leave(): void {
    if (this.parseError === null && this.value !== null) this.text.setValue(formatEngineeringValue(this.value, this.dimension()), { emitEvent: false });
    this.onTouched();
  }

  private read(text: string): void {
    if (this.optional() && text.trim() === '') {
      this.accept(null, null);
      return;
    }
    const parsed = parseEngineeringValue(text, this.dimension());
    if (parsed.ok) this.accept(parsed.value, null);
    else this.accept(null, parsed.message);
  }

  private accept(value: number | null, error: string | null): void {
    this.value = value;
    this.parseError = error;
    this.reading.set(this.describe(value));
    this.empty.set(this.text.value.trim() === '');
    this.onChange(value);
  }

  private showErrorOf(control: AbstractControl): void {
    const shown = control.invalid && (control.dirty || control.touched);
    this.errorMessage.set(shown ? controlErrorMessage(control.errors) : null);
  }

  private showValue(value: number | null, dimension: DimensionName | null): void {
    this.text.setValue(value === null ? '' : formatEngineeringValue(value, dimension), { emitEvent: false });
    this.reading.set(this.describe(value));
    this.empty.set(value === null);
  }

  /** The value as read, in SI units ("= 2.2e-12 F"); a plain number only when the text was not already that number. */
  private describe(value: number | null): string | null {
    if (value === null) return null;
    const dimension = this.dimension();
    if (dimension === null) return this.text.value.trim() === String(value) ? null : `= ${value}`;
    return `= ${siText(value)} ${unitOf(dimension, '')}`;
  }

  private outer(): AbstractControl | null {
    return this.ngControl?.control ?? null;
  }
}
