import { HttpClient, HttpParams } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, Observable } from 'rxjs';
import type {
  CreateDesign,
  DesignList,
  DesignSummary,
  SaveVersion,
  UpdateDesign,
  Version,
  VersionSummary,
  designSortKeys,
} from '@shared/contracts/designs-api';

export type DesignSortKey = (typeof designSortKeys)[number];
export type ArchivedFilter = 'false' | 'true' | 'all';

/** One page of the design list as the server sorts, filters and pages it. */
export interface DesignListQuery {
  page: number;
  pageSize: number;
  sort: DesignSortKey;
  order: 'asc' | 'desc';
  q: string;
  archived: ArchivedFilter;
}

/** The `/api/designs` resource: designs and their immutable versions. */
@Injectable({ providedIn: 'root' })
export class DesignsApi {
  private readonly http = inject(HttpClient);

  list(query: DesignListQuery): Observable<DesignList> {
    let params = new HttpParams()
      .set('page', query.page)
      .set('pageSize', query.pageSize)
      .set('sort', query.sort)
      .set('order', query.order)
      .set('archived', query.archived);
    const search = query.q.trim();
    if (search !== '') params = params.set('q', search);
    return this.http.get<DesignList>('/api/designs', { params });
  }

  get(id: string): Observable<DesignSummary> {
    return this.http.get<DesignSummary>(`/api/designs/${encodeURIComponent(id)}`);
  }

  create(design: CreateDesign): Observable<DesignSummary> {
    return this.http.post<DesignSummary>('/api/designs', design);
  }

  update(id: string, change: UpdateDesign): Observable<DesignSummary> {
    return this.http.patch<DesignSummary>(`/api/designs/${encodeURIComponent(id)}`, change);
  }

  versions(id: string): Observable<VersionSummary[]> {
    return this.http
      .get<{ items: VersionSummary[] }>(`/api/designs/${encodeURIComponent(id)}/versions`)
      .pipe(map((answer) => answer.items));
  }

  version(id: string, number: number): Observable<Version> {
    return this.http.get<Version>(`/api/designs/${encodeURIComponent(id)}/versions/${number}`);
  }

  saveVersion(id: string, save: SaveVersion): Observable<Version> {
    return this.http.post<Version>(`/api/designs/${encodeURIComponent(id)}/versions`, save);
  }
}
