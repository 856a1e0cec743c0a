import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { rxResource, takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormField, MatLabel, MatPrefix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatPaginator, PageEvent } from '@angular/material/paginator';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatOption, MatSelect, MatSelectChange } from '@angular/material/select';
import { MatSlideToggle, MatSlideToggleChange } from '@angular/material/slide-toggle';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatSort, MatSortHeader, Sort } from '@angular/material/sort';
import {
  MatCell,
  MatCellDef,
  MatColumnDef,
  MatHeaderCell,
  MatHeaderCellDef,
  MatHeaderRow,
  MatHeaderRowDef,
  MatNoDataRow,
  MatRow,
  MatRowDef,
  MatTable,
} from '@angular/material/table';
import type { Role, UpdateUser, User } from '@shared/contracts/user';
import { debounceTime, distinctUntilChanged } from 'rxjs';
import { AuthService } from '../core/auth/auth-service';
import { roles as ROLES } from '@shared/contracts/constants';
import { problemFrom } from '../core/http/api-problem';
import { CreateAccountDialog } from './create-account-dialog';
import { UserListQuery, UserSortKey, UsersApi } from './users-api';

const SORTABLE = new Set<string>(['email', 'displayName', 'role', 'disabled', 'createdAt']);

/** Administrators list, search, open, re-role and disable accounts; the server sorts and pages. */
@Component({
  selector: 'qb-accounts',
  imports: [
    DatePipe,
    MatButton,
    MatCell,
    MatCellDef,
    MatColumnDef,
    MatFormField,
    MatHeaderCell,
    MatHeaderCellDef,
    MatHeaderRow,
    MatHeaderRowDef,
    MatIcon,
    MatInput,
    MatLabel,
    MatNoDataRow,
    MatOption,
    MatPaginator,
    MatPrefix,
    MatProgressBar,
    MatRow,
    MatRowDef,
    MatSelect,
    MatSlideToggle,
    MatSort,
    MatSortHeader,
    MatTable,
    ReactiveFormsModule,
  ],
  templateUrl: './accounts.html',
  styleUrl: './accounts.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Accounts {
  private readonly users = inject(UsersApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly roles = ROLES;
  protected readonly columns = ['email', 'displayName', 'role', 'disabled', 'createdAt'];
  protected readonly pageSizes = [10, 20, 50, 100];
  protected readonly me = inject(AuthService).currentUser;

  protected readonly search = new FormControl('', { nonNullable: true });
  protected readonly query = signal<UserListQuery>({ page: 0, pageSize: 20, sort: 'email', order: 'asc', q: '' });
  /** Ids of the rows with a change on its way to the server. */
  protected readonly saving = signal<ReadonlySet<string>>(new Set());

  protected readonly list = rxResource({
    params: () => this.query(),
    stream: ({ params }) => this.users.list(params),
  });
  protected readonly rows = computed<User[]>(() => (this.list.hasValue() ? this.list.value().items : []));
  protected readonly total = computed(() => (this.list.hasValue() ? this.list.value().total : 0));
  protected readonly loadError = computed(() => (this.list.error() ? problemFrom(this.list.error()).detail : null));

  /** Keeps a row, and the focus inside it, when a saved change replaces its account. */
  protected readonly trackById = (_index: number, user: User): string => user.id;

  constructor() {
    this.search.valueChanges
      .pipe(debounceTime(300), distinctUntilChanged(), takeUntilDestroyed())
      .subscribe((q) => this.query.update((query) => ({ ...query, q, page: 0 })));
  }

  protected sortBy(sort: Sort): void {
    const key: UserSortKey = SORTABLE.has(sort.active) ? (sort.active as UserSortKey) : 'email';
    this.query.update((query) => ({ ...query, sort: key, order: sort.direction === 'desc' ? 'desc' : 'asc', page: 0 }));
  }

  protected turnPage(event: PageEvent): void {
    this.query.update((query) => ({ ...query, page: event.pageIndex, pageSize: event.pageSize }));
  }

  protected openCreateDialog(): void {
    this.dialog
      .open(CreateAccountDialog, { width: '480px' })
      .afterClosed()
      .subscribe((user: User | undefined) => {
        if (!user) return;
        this.snackBar.open(`Account ${user.email} created.`, 'Close', { duration: 4000 });
        this.list.reload();
      });
  }

  protected changeRole(user: User, event: MatSelectChange<Role>): void {
    this.save(user, { role: event.value }, () => (event.source.value = user.role));
  }

  protected setEnabled(user: User, event: MatSlideToggleChange): void {
    this.save(user, { disabled: !event.checked }, () => (event.source.checked = !user.disabled));
  }

  private save(user: User, change: UpdateUser, undo: () => void): void {
    this.saving.update((ids) => new Set(ids).add(user.id));
    this.users.update(user.id, change).subscribe({
      next: (updated) => {
        this.done(user.id);
        this.list.update((list) => list && { ...list, items: list.items.map((row) => (row.id === updated.id ? updated : row)) });
      },
      error: (error: unknown) => {
        this.done(user.id);
        undo();
        this.snackBar.open(problemFrom(error).detail, 'Close', { duration: 8000, panelClass: 'qb-snack-error' });
      },
    });
  }

  private done(id: string): void {
    this.saving.update((ids) => {
      const next = new Set(ids);
      next.delete(id);
      return next;
    });
  }
}
