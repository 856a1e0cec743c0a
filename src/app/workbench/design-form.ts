import { AbstractControl, FormArray, FormControl, FormGroup, ValidationErrors, Validators } from '@angular/forms';
import { DESIGN_FORMAT, DESIGN_FORMAT_VERSION, type ChainStage, type Design } from '@shared/contracts/design';
import { parseDesignPath } from '@shared/engine/sweep/design-path';
import { stageFields, type StageKind } from './stage-fields';

export type NumberControl = FormControl<number | null>;

/** The control a value of a stage's field gets: a list of numbers (a voltage range), a number, or the value itself. */
type ControlFor<V> = V extends readonly number[] ? FormArray<NumberControl> : V extends number ? NumberControl : FormControl<V>;
type ControlsOf<S> = { [K in keyof S]-?: ControlFor<S[K]> };

/** One form group per stage kind, `kind` the discriminator. */
export type StageGroupOf<K extends StageKind> = FormGroup<ControlsOf<Extract<ChainStage, { kind: K }>>>;
export type StageGroup = { [K in StageKind]: StageGroupOf<K> }[StageKind];

export interface CellControls {
  baseCapacitance: NumberControl;
  /** c1, c2, c3 [F/Pa^k]; c2 and c3 may stay empty. */
  coefficients: FormArray<NumberControl>;
}

export type CapillaryKind = 'geometry' | 'resistance';

export interface SensorControls {
  mode: FormControl<'pressure' | 'flow'>;
  cellA: FormGroup<CellControls>;
  cellB: FormGroup<CellControls>;
  parasiticCapacitance: NumberControl;
  fullScale: NumberControl;
  /** Which description of the capillary the document carries (flow mode). */
  capillaryKind: FormControl<CapillaryKind>;
  capillary: FormGroup<{
    length: NumberControl;
    innerDiameter: NumberControl;
    viscosity: NumberControl;
    density: NumberControl;
    resistance: NumberControl;
  }>;
}

export interface ExcitationControls {
  frequency: NumberControl;
  amplitude: NumberControl;
  supply: NumberControl;
  referenceCapacitanceA: NumberControl;
  referenceCapacitanceB: NumberControl;
  trim: NumberControl;
  trimBits: NumberControl;
  amplitudeNoise: NumberControl;
}

export interface DesignControls {
  name: FormControl<string>;
  notes: FormControl<string>;
  environment: FormGroup<{ temperature: NumberControl }>;
  sensor: FormGroup<SensorControls>;
  excitation: FormGroup<ExcitationControls>;
  chain: FormArray<StageGroup>;
  analysis: FormGroup<{ bandLow: NumberControl; bandHigh: NumberControl; operatingPoint: NumberControl }>;
}

export type DesignForm = FormGroup<DesignControls>;

/** The capillary of the flow demo, offered when a pressure design switches to flow mode. */
const DEFAULT_CAPILLARY = { length: 0.02, innerDiameter: 2e-4, viscosity: 1.0016e-3, density: 998.2, resistance: 5.1e11 };

export function wholeNumberValidator(min: number, max: number) {
  return (control: AbstractControl<number | null>): ValidationErrors | null => {
    const value = control.value;
    if (value === null) return null;
    if (!Number.isInteger(value)) return { integer: true };
    if (value < min) return { min: { min, actual: value } };
    if (value > max) return { max: { max, actual: value } };
    return null;
  };
}

const integerControl = (value: number, min: number, max: number): NumberControl =>
  new FormControl<number | null>(value, { validators: [Validators.required, wholeNumberValidator(min, max)] });

const numberControl = (value: number | null): NumberControl => new FormControl<number | null>(value);

const numbers = (values: readonly (number | null)[]): FormArray<NumberControl> => new FormArray(values.map(numberControl));

/** A stage's group, built from its field list so that every kind gets the same kind of controls. */
export function createStageGroup(stage: ChainStage): StageGroup {
  const values = stage as unknown as Record<string, unknown>;
  const controls: Record<string, AbstractControl> = {
    id: new FormControl(stage.id, { nonNullable: true, validators: [Validators.required] }),
    kind: new FormControl(stage.kind, { nonNullable: true }),
  };
  for (const field of stageFields[stage.kind]) {
    const value = values[field.key];
    if (field.type === 'range') controls[field.key] = numbers(value as number[]);
    else if (field.type === 'integer') controls[field.key] = integerControl(value as number, field.min, field.max);
    else if (field.type === 'response') controls[field.key] = new FormControl(value as string, { nonNullable: true });
    else controls[field.key] = numberControl(value as number);
  }
  return new FormGroup(controls) as unknown as StageGroup;
}

function cellGroup(cell: Design['sensor']['cellA']): FormGroup<CellControls> {
  const coefficients = [0, 1, 2].map((k) => cell.coefficients[k] ?? null);
  return new FormGroup({ baseCapacitance: numberControl(cell.baseCapacitance), coefficients: numbers(coefficients) });
}

function capillaryValues(design: Design): { kind: CapillaryKind; values: typeof DEFAULT_CAPILLARY } {
  const capillary = design.sensor.capillary;
  if (capillary === undefined) return { kind: 'geometry', values: DEFAULT_CAPILLARY };
  if ('resistance' in capillary) return { kind: 'resistance', values: { ...DEFAULT_CAPILLARY, resistance: capillary.resistance } };
  return { kind: 'geometry', values: { ...DEFAULT_CAPILLARY, ...capillary } };
}

export function createDesignForm(design: Design): DesignForm {
  const capillary = capillaryValues(design);
  const { excitation, analysis } = design;
  return new FormGroup<DesignControls>({
    name: new FormControl(design.name, { nonNullable: true, validators: [Validators.required, Validators.maxLength(200)] }),
    notes: new FormControl(design.notes, { nonNullable: true }),
    environment: new FormGroup({ temperature: numberControl(design.environment.temperature) }),
    sensor: new FormGroup<SensorControls>({
      mode: new FormControl(design.sensor.mode, { nonNullable: true }),
      cellA: cellGroup(design.sensor.cellA),
      cellB: cellGroup(design.sensor.cellB),
      parasiticCapacitance: numberControl(design.sensor.parasiticCapacitance),
      fullScale: numberControl(design.sensor.fullScale),
      capillaryKind: new FormControl(capillary.kind, { nonNullable: true }),
      capillary: new FormGroup({
        length: numberControl(capillary.values.length),
        innerDiameter: numberControl(capillary.values.innerDiameter),
        viscosity: numberControl(capillary.values.viscosity),
        density: numberControl(capillary.values.density),
        resistance: numberControl(capillary.values.resistance),
      }),
    }),
    excitation: new FormGroup<ExcitationControls>({
      frequency: numberControl(excitation.frequency),
      amplitude: numberControl(excitation.amplitude),
      supply: numberControl(excitation.supply),
      referenceCapacitanceA: numberControl(excitation.referenceCapacitanceA),
      referenceCapacitanceB: numberControl(excitation.referenceCapacitanceB),
      trim: numberControl(excitation.trim),
      trimBits: integerControl(excitation.trimBits, 1, 16),
      amplitudeNoise: numberControl(excitation.amplitudeNoise),
    }),
    chain: new FormArray(design.chain.map(createStageGroup)),
    analysis: new FormGroup({
      bandLow: numberControl(analysis.bandLow),
      bandHigh: numberControl(analysis.bandHigh),
      operatingPoint: numberControl(analysis.operatingPoint),
    }),
  });
}

/**
 * Puts another design into the same form (a version loaded from the history, a restored draft),
 * rebuilding the chain, so the page's subscriptions keep working. Emits one value change.
 */
export function loadIntoForm(form: DesignForm, design: Design): void {
  const fresh = createDesignForm(design);
  const chain = form.controls.chain;
  chain.clear({ emitEvent: false });
  for (const group of fresh.controls.chain.controls) chain.push(group, { emitEvent: false });
  const { chain: _chain, ...rest } = fresh.getRawValue();
  form.patchValue(rest, { emitEvent: false });
  form.markAsPristine();
  form.markAsUntouched();
  form.updateValueAndValidity();
}

function cellDocument(cell: FormGroup<CellControls>) {
  const coefficients = cell.controls.coefficients.getRawValue();
  let last = coefficients.length - 1;
  while (last > 0 && coefficients[last] === null) last--;
  return { baseCapacitance: cell.controls.baseCapacitance.value, coefficients: coefficients.slice(0, last + 1).map((c) => c ?? 0) };
}

/** The design document the form describes (format version 1), for the engine, the draft and the API. */
export function documentOf(form: DesignForm): Record<string, unknown> {
  const { sensor, excitation, analysis, environment } = form.controls;
  const mode = sensor.controls.mode.value;
  const capillaryValues = sensor.controls.capillary.getRawValue();
  const capillary =
    sensor.controls.capillaryKind.value === 'resistance'
      ? { resistance: capillaryValues.resistance }
      : { length: capillaryValues.length, innerDiameter: capillaryValues.innerDiameter, viscosity: capillaryValues.viscosity, density: capillaryValues.density };
  return {
    format: DESIGN_FORMAT,
    version: DESIGN_FORMAT_VERSION,
    name: form.controls.name.value,
    notes: form.controls.notes.value,
    environment: environment.getRawValue(),
    sensor: {
      mode,
      cellA: cellDocument(sensor.controls.cellA),
      cellB: cellDocument(sensor.controls.cellB),
      parasiticCapacitance: sensor.controls.parasiticCapacitance.value,
      fullScale: sensor.controls.fullScale.value,
      ...(mode === 'flow' ? { capillary } : {}),
    },
    excitation: excitation.getRawValue(),
    chain: form.controls.chain.controls.map((group) => group.getRawValue()),
    analysis: analysis.getRawValue(),
  };
}

/**
 * The control a document path names: `chain[4].corner`, `sensor.cellA.coefficients[1]`,
 * `sensor.capillary.resistance`; a path to a whole range names its low end. Null when none does.
 */
export function controlAtPath(form: DesignForm, path: string): AbstractControl | null {
  const parts = parseDesignPath(path);
  if (parts === null) return null;
  const chain = form.controls.chain.controls;
  // `chain[lp]` names a stage by its id.
  const keys = parts.map((part) => (typeof part === 'string' && part.startsWith('#') ? String(chain.findIndex((group) => group.controls.id.value === part.slice(1))) : String(part)));
  let control = form.get(keys);
  if (control instanceof FormArray && control.length > 0 && !(control.at(0) instanceof FormGroup)) control = control.at(0);
  return control;
}
