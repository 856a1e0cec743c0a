import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatOption, MatSelect } from '@angular/material/select';
import { readoutUnits, referenceUnits, type ColumnMappingInput, type DatasetPreview, type DatasetSummary, type ReadoutUnit, type ReferenceUnit } from '@shared/contracts/calibration';
import { problemFrom } from '../core/http/api-problem';
import { CalibrationApi } from './calibration-api';
import { guessMapping, unitInHeader } from './column-guess';

const referenceUnitNames = Object.keys(referenceUnits) as ReferenceUnit[];
const readoutUnitNames = Object.keys(readoutUnits) as ReadoutUnit[];

/**
 * Upload of a bench file in two steps: choose the file (the server reads its header and first
 * rows), map the columns and units, check every row, and only then store it.
 */
@Component({
  selector: 'qb-upload-mapping',
  imports: [ReactiveFormsModule, MatButton, MatFormField, MatLabel, MatHint, MatInput, MatSelect, MatOption],
  templateUrl: './upload-mapping.html',
  styleUrl: './upload-mapping.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UploadMapping {
  private readonly api = inject(CalibrationApi);

  readonly designId = input.required<string>();
  readonly stored = output<DatasetSummary>();
  readonly cancelled = output<void>();

  protected readonly referenceUnitNames = referenceUnitNames;
  protected readonly readoutUnitNames = readoutUnitNames;
  protected readonly file = signal<File | null>(null);
  protected readonly preview = signal<DatasetPreview | null>(null);
  protected readonly busy = signal(false);
  protected readonly problem = signal<string | null>(null);
  protected readonly problemErrors = signal<string[]>([]);
  /** True once the rows were checked with the current mapping. */
  protected readonly checked = signal(false);

  protected readonly form = new FormGroup({
    name: new FormControl('', { nonNullable: true }),
    referenceColumn: new FormControl('', { nonNullable: true, validators: Validators.required }),
    referenceUnit: new FormControl<ReferenceUnit>('kPa', { nonNullable: true }),
    readoutColumn: new FormControl('', { nonNullable: true, validators: Validators.required }),
    readoutUnit: new FormControl<ReadoutUnit>('V', { nonNullable: true }),
    cellColumn: new FormControl('', { nonNullable: true, validators: Validators.required }),
    runColumn: new FormControl('', { nonNullable: true, validators: Validators.required }),
    directionColumn: new FormControl('', { nonNullable: true, validators: Validators.required }),
    timeColumn: new FormControl('', { nonNullable: true }),
  });

  protected readonly columns = computed(() => this.preview()?.columns ?? []);
  protected readonly canStore = computed(() => {
    const preview = this.preview();
    return this.checked() && preview !== null && preview.complete && preview.errorCount === 0 && !this.busy();
  });

  constructor() {
    this.form.valueChanges.pipe(takeUntilDestroyed()).subscribe(() => this.checked.set(false));
  }

  protected chooseFile(event: Event): void {
    const chosen = (event.target as HTMLInputElement).files?.[0] ?? null;
    this.file.set(chosen);
    this.preview.set(null);
    this.checked.set(false);
    if (chosen === null) return;
    this.form.controls.name.setValue(chosen.name.replace(/\.[^.]+$/, ''));
    this.request({}, (preview) => {
      const guess = guessMapping(preview.columns);
      this.form.patchValue({
        referenceColumn: guess.referenceColumn ?? '',
        readoutColumn: guess.readoutColumn ?? '',
        cellColumn: guess.cellColumn ?? '',
        runColumn: guess.runColumn ?? '',
        directionColumn: guess.directionColumn ?? '',
        timeColumn: guess.timeColumn ?? '',
        referenceUnit: unitInHeader(guess.referenceColumn, referenceUnitNames) ?? this.form.controls.referenceUnit.value,
        readoutUnit: unitInHeader(guess.readoutColumn, readoutUnitNames) ?? this.form.controls.readoutUnit.value,
      });
      this.checked.set(false);
    });
  }

  protected checkRows(): void {
    this.request(this.mapping(), () => this.checked.set(true));
  }

  protected store(): void {
    const file = this.file();
    if (file === null) return;
    this.busy.set(true);
    this.api.upload(this.designId(), file, this.mapping()).subscribe({
      next: (summary) => {
        this.busy.set(false);
        this.stored.emit(summary);
      },
      error: (error: unknown) => this.fail(error),
    });
  }

  private mapping(): ColumnMappingInput {
    const value = this.form.getRawValue();
    return { ...value, timeColumn: value.timeColumn === '' ? undefined : value.timeColumn, name: value.name === '' ? undefined : value.name };
  }

  private request(mapping: Partial<ColumnMappingInput>, then: (preview: DatasetPreview) => void): void {
    const file = this.file();
    if (file === null) return;
    this.busy.set(true);
    this.problem.set(null);
    this.problemErrors.set([]);
    this.api.preview(this.designId(), file, mapping).subscribe({
      next: (preview) => {
        this.busy.set(false);
        this.preview.set(preview);
        then(preview);
      },
      error: (error: unknown) => this.fail(error),
    });
  }

  private fail(error: unknown): void {
    this.busy.set(false);
    const problem = problemFrom(error);
    this.problem.set(problem.detail);
    this.problemErrors.set(problem.errors.map((entry) => entry.message));
  }
}
