import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, Observable } from 'rxjs';
import type { ColumnMappingInput, Dataset, DatasetPreview, DatasetSummary } from '@shared/contracts/calibration';

/** The `/api/designs/:id/datasets` resource: bench calibration data of a design. */
@Injectable({ providedIn: 'root' })
export class CalibrationApi {
  private readonly http = inject(HttpClient);

  private base(designId: string): string {
    return `/api/designs/${encodeURIComponent(designId)}/datasets`;
  }

  list(designId: string): Observable<DatasetSummary[]> {
    return this.http.get<{ items: DatasetSummary[] }>(this.base(designId)).pipe(map((answer) => answer.items));
  }

  /** Parses the file on the server without storing it; the mapping may be partial. */
  preview(designId: string, file: File, mapping: Partial<ColumnMappingInput>): Observable<DatasetPreview> {
    return this.http.post<DatasetPreview>(`${this.base(designId)}/preview`, formData(file, mapping));
  }

  upload(designId: string, file: File, mapping: ColumnMappingInput): Observable<DatasetSummary> {
    return this.http.post<DatasetSummary>(this.base(designId), formData(file, mapping));
  }

  get(designId: string, datasetId: string): Observable<Dataset> {
    return this.http.get<Dataset>(`${this.base(designId)}/${encodeURIComponent(datasetId)}`);
  }

  delete(designId: string, datasetId: string): Observable<void> {
    return this.http.delete<void>(`${this.base(designId)}/${encodeURIComponent(datasetId)}`);
  }
}

function formData(file: File, mapping: Partial<ColumnMappingInput>): FormData {
  const form = new FormData();
  for (const [name, value] of Object.entries(mapping)) if (typeof value === 'string' && value !== '') form.append(name, value);
  form.append('file', file, file.name);
  return form;
}
