import { ChangeDetectionStrategy, Component, effect, inject, input, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatOption, MatSelect } from '@angular/material/select';
import { Router, RouterLink } from '@angular/router';
import type { Dataset, DatasetSummary } from '@shared/contracts/calibration';
import type { DesignSummary } from '@shared/contracts/designs-api';
import { problemFrom } from '../core/http/api-problem';
import { DesignsApi } from '../designs/designs-api';
import { BatchPanel } from './batch-panel';
import { CalibrationApi } from './calibration-api';
import { figure } from './display-units';
import { FitPanel } from './fit-panel';
import { UploadMapping } from './upload-mapping';

/** The Calibration screen: a design's bench datasets, their fits and the batch verdict. */
@Component({
  selector: 'qb-calibration-page',
  imports: [MatButton, MatFormField, MatLabel, MatSelect, MatOption, RouterLink, UploadMapping, FitPanel, BatchPanel],
  templateUrl: './calibration-page.html',
  styleUrl: './calibration-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CalibrationPage {
  private readonly api = inject(CalibrationApi);
  private readonly designsApi = inject(DesignsApi);
  private readonly router = inject(Router);

  /** Design id from the route; without one the page offers a design picker. */
  readonly id = input<string>();

  protected readonly figure = figure;
  protected readonly designs = signal<DesignSummary[]>([]);
  protected readonly design = signal<DesignSummary | null>(null);
  protected readonly datasets = signal<DatasetSummary[]>([]);
  protected readonly selected = signal<Dataset | null>(null);
  protected readonly uploading = signal(false);
  protected readonly confirmingDelete = signal<string | null>(null);
  protected readonly problem = signal<string | null>(null);

  constructor() {
    effect(() => {
      const id = this.id();
      this.design.set(null);
      this.datasets.set([]);
      this.selected.set(null);
      if (id === undefined) {
        this.designsApi.list({ page: 0, pageSize: 200, sort: 'name', order: 'asc', q: '', archived: 'false' }).subscribe({
          next: (list) => this.designs.set(list.items),
          error: (error: unknown) => this.problem.set(problemFrom(error).detail),
        });
        return;
      }
      this.designsApi.get(id).subscribe({ next: (design) => this.design.set(design), error: (error: unknown) => this.problem.set(problemFrom(error).detail) });
      this.reload(id);
    });
  }

  protected chooseDesign(id: string): void {
    void this.router.navigate(['/designs', id, 'calibration']);
  }

  protected open(summary: DatasetSummary): void {
    const id = this.id();
    if (id === undefined) return;
    this.api.get(id, summary.id).subscribe({ next: (dataset) => this.selected.set(dataset), error: (error: unknown) => this.problem.set(problemFrom(error).detail) });
  }

  protected stored(summary: DatasetSummary): void {
    this.uploading.set(false);
    const id = this.id();
    if (id !== undefined) this.reload(id);
    this.open(summary);
  }

  protected deleteDataset(summary: DatasetSummary): void {
    const id = this.id();
    if (id === undefined) return;
    this.api.delete(id, summary.id).subscribe({
      next: () => {
        this.confirmingDelete.set(null);
        if (this.selected()?.id === summary.id) this.selected.set(null);
        this.reload(id);
      },
      error: (error: unknown) => this.problem.set(problemFrom(error).detail),
    });
  }

  private reload(id: string): void {
    this.api.list(id).subscribe({ next: (items) => this.datasets.set(items), error: (error: unknown) => this.problem.set(problemFrom(error).detail) });
  }
}
