import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { rxResource, takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MatButtonToggle, MatButtonToggleChange, MatButtonToggleGroup } from '@angular/material/button-toggle';
import { MatChip, MatChipSet } from '@angular/material/chips';
import { MatDialog } from '@angular/material/dialog';
import { MatFormField, MatLabel, MatPrefix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatMenu, MatMenuItem, MatMenuTrigger } from '@angular/material/menu';
import { MatPaginator, PageEvent } from '@angular/material/paginator';
import { MatProgressBar } from '@angular/material/progress-bar';
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
import { MatTooltip } from '@angular/material/tooltip';
import { Router, RouterLink } from '@angular/router';
import { DESIGN_NAME_MAX_LENGTH } from '@shared/contracts/constants';
import type { DesignSummary } from '@shared/contracts/designs-api';
import type { FieldError } from '@shared/contracts/problem';
import { debounceTime, distinctUntilChanged, firstValueFrom } from 'rxjs';
import { problemFrom } from '../core/http/api-problem';
import { downloadDocument, exportFileName } from './design-file';
import { ArchivedFilter, DesignListQuery, DesignSortKey, DesignsApi } from './designs-api';
import { ImportProblemsDialog, type ImportProblems } from './import-problems-dialog';
import { headroomText, noiseText, resolutionText } from './key-figures';
import { NewDesignDialog } from './new-design-dialog';
import { RenameDesignDialog } from './rename-design-dialog';
import { DesignReviewState } from '../reviews/design-review-state';

const SORTABLE = new Set<string>(['name', 'latestVersion', 'updatedAt', 'createdAt']);

/** The designs a designer may open: sorted, searched and paged by the server, with each latest version's key figures. */
@Component({
  selector: 'qb-designs',
  imports: [
    DatePipe,
    DesignReviewState,
    MatButton,
    MatButtonToggle,
    MatButtonToggleGroup,
    MatCell,
    MatCellDef,
    MatChip,
    MatChipSet,
    MatColumnDef,
    MatFormField,
    MatHeaderCell,
    MatHeaderCellDef,
    MatHeaderRow,
    MatHeaderRowDef,
    MatIcon,
    MatIconButton,
    MatInput,
    MatLabel,
    MatMenu,
    MatMenuItem,
    MatMenuTrigger,
    MatNoDataRow,
    MatPaginator,
    MatPrefix,
    MatProgressBar,
    MatRow,
    MatRowDef,
    MatSort,
    MatSortHeader,
    MatTable,
    MatTooltip,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './designs.html',
  styleUrl: './designs.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Designs {
  private readonly designs = inject(DesignsApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly router = inject(Router);

  protected readonly columns = ['name', 'latestVersion', 'review', 'resolution', 'noise', 'headroom', 'findings', 'updatedAt', 'actions'];
  protected readonly pageSizes = [10, 20, 50, 100];
  protected readonly search = new FormControl('', { nonNullable: true });
  protected readonly query = signal<DesignListQuery>({ page: 0, pageSize: 20, sort: 'updatedAt', order: 'desc', q: '', archived: 'false' });
  protected readonly busy = signal<ReadonlySet<string>>(new Set());
  protected readonly importing = signal(false);

  protected readonly list = rxResource({
    params: () => this.query(),
    stream: ({ params }) => this.designs.list(params),
  });
  protected readonly rows = computed<DesignSummary[]>(() => (this.list.hasValue() ? this.list.value().items : []));
  protected readonly total = computed(() => (this.list.hasValue() ? this.list.value().total : 0));
  protected readonly loadError = computed(() => (this.list.error() ? problemFrom(this.list.error()).detail : null));
  /** No design at all (not merely none matching the search or the archive filter): the page explains how to start. */
  protected readonly empty = computed(
    () => this.list.hasValue() && this.total() === 0 && this.query().q === '' && this.query().archived === 'false' && this.query().page === 0,
  );

  protected readonly resolutionText = resolutionText;
  protected readonly noiseText = noiseText;
  protected readonly headroomText = headroomText;
  protected readonly trackById = (_index: number, design: DesignSummary): string => design.id;

  constructor() {
    this.search.valueChanges
      .pipe(debounceTime(300), distinctUntilChanged(), takeUntilDestroyed())
      .subscribe((q) => this.query.update((query) => ({ ...query, q, page: 0 })));
  }

  protected sortBy(sort: Sort): void {
    const key: DesignSortKey = SORTABLE.has(sort.active) ? (sort.active as DesignSortKey) : 'updatedAt';
    this.query.update((query) => ({ ...query, sort: key, order: sort.direction === 'asc' ? 'asc' : 'desc', page: 0 }));
  }

  protected turnPage(event: PageEvent): void {
    this.query.update((query) => ({ ...query, page: event.pageIndex, pageSize: event.pageSize }));
  }

  protected showArchived(event: MatButtonToggleChange): void {
    this.query.update((query) => ({ ...query, archived: event.value as ArchivedFilter, page: 0 }));
  }

  protected openNewDesign(): void {
    this.dialog
      .open(NewDesignDialog, { width: '520px' })
      .afterClosed()
      .subscribe((created: DesignSummary | undefined) => {
        if (created) void this.router.navigate(['/designs', created.id]);
      });
  }

  /** Checks a picked JSON file against the design format here first, then lets the server check and store it. */
  protected async importFile(input: HTMLInputElement): Promise<void> {
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    this.importing.set(true);
    try {
      const document = await this.readJson(file);
      if (document === null) return;
      const { analyseDesign } = await import('@shared/engine/index');
      const analysis = analyseDesign(document);
      if (!analysis.ok) {
        this.showImportProblems({ fileName: file.name, checkedBy: 'browser', summary: 'The file is not a valid design document:', errors: analysis.errors });
        return;
      }
      const created = await firstValueFrom(this.designs.create({ name: analysis.design.name, document, message: `Imported from ${file.name}` }));
      this.snackBar.open(`Imported “${created.name}” as version 1.`, 'Close', { duration: 4000 });
      void this.router.navigate(['/designs', created.id]);
    } catch (error) {
      const problem = problemFrom(error);
      this.showImportProblems({ fileName: file.name, checkedBy: 'server', summary: problem.detail, errors: problem.errors });
    } finally {
      this.importing.set(false);
    }
  }

  protected duplicate(design: DesignSummary): void {
    this.whileBusy(design.id, async () => {
      const version = await firstValueFrom(this.designs.version(design.id, design.latestVersion));
      const name = `Copy of ${design.name}`.slice(0, DESIGN_NAME_MAX_LENGTH);
      const created = await firstValueFrom(
        this.designs.create({ name, document: { ...version.document, name }, message: `Duplicated from “${design.name}” version ${version.number}` }),
      );
      this.snackBar.open(`Created “${created.name}”.`, 'Open', { duration: 6000 }).onAction().subscribe(() => void this.router.navigate(['/designs', created.id]));
      this.list.reload();
    });
  }

  /** Archived designs can be renamed too: the API refuses only new versions of them. */
  protected rename(design: DesignSummary): void {
    this.dialog
      .open(RenameDesignDialog, { width: '480px', data: design })
      .afterClosed()
      .subscribe((renamed: DesignSummary | undefined) => {
        if (!renamed) return;
        this.snackBar.open(`Renamed “${design.name}” to “${renamed.name}”.`, 'Close', { duration: 4000 });
        this.list.reload();
      });
  }

  protected setArchived(design: DesignSummary, archived: boolean): void {
    this.whileBusy(design.id, async () => {
      await firstValueFrom(this.designs.update(design.id, { archived }));
      this.snackBar.open(archived ? `Archived “${design.name}”.` : `Restored “${design.name}”.`, 'Close', { duration: 4000 });
      this.list.reload();
    });
  }

  protected exportLatest(design: DesignSummary): void {
    this.whileBusy(design.id, async () => {
      const version = await firstValueFrom(this.designs.version(design.id, design.latestVersion));
      downloadDocument(version.document, exportFileName(design.name, version.number));
    });
  }

  private async readJson(file: File): Promise<unknown> {
    try {
      return JSON.parse(await file.text()) as unknown;
    } catch (error) {
      const errors: FieldError[] = [{ path: '', message: error instanceof Error ? error.message : String(error) }];
      this.showImportProblems({ fileName: file.name, checkedBy: 'browser', summary: 'The file is not JSON:', errors });
      return null;
    }
  }

  private showImportProblems(problems: ImportProblems): void {
    this.dialog.open(ImportProblemsDialog, { width: '560px', data: problems });
  }

  private whileBusy(id: string, work: () => Promise<void>): void {
    this.busy.update((ids) => new Set(ids).add(id));
    work()
      .catch((error: unknown) => this.snackBar.open(problemFrom(error).detail, 'Close', { duration: 8000, panelClass: 'qb-snack-error' }))
      .finally(() =>
        this.busy.update((ids) => {
          const next = new Set(ids);
          next.delete(id);
          return next;
        }),
      );
  }
}
