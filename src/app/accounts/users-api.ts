import { HttpClient, HttpParams } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, Observable } from 'rxjs';
import type { CreateUser, UpdateUser, User, UserList, userSortKeys } from '@shared/contracts/user';

export type UserSortKey = (typeof userSortKeys)[number];

/** One page of the account list as the server sorts, filters and pages it. */
export interface UserListQuery {
  page: number;
  pageSize: number;
  sort: UserSortKey;
  order: 'asc' | 'desc';
  q: string;
}

/** The `/api/users` resource (admins only). */
@Injectable({ providedIn: 'root' })
export class UsersApi {
  private readonly http = inject(HttpClient);

  list(query: UserListQuery): Observable<UserList> {
    let params = new HttpParams()
      .set('page', query.page)
      .set('pageSize', query.pageSize)
      .set('sort', query.sort)
      .set('order', query.order);
    const search = query.q.trim();
    if (search !== '') params = params.set('q', search);
    return this.http.get<UserList>('/api/users', { params });
  }

  create(account: CreateUser): Observable<User> {
    return this.http.post<{ user: User }>('/api/users', account).pipe(map((answer) => answer.user));
  }

  update(id: string, change: UpdateUser): Observable<User> {
    return this.http.patch<{ user: User }>(`/api/users/${encodeURIComponent(id)}`, change).pipe(map((answer) => answer.user));
  }
}
