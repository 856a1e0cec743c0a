import { DatePipe } from '@angular/common';
import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, ElementRef, computed, inject, input, signal } from '@angular/core';
import { rxResource, takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { MatButton } from '@angular/material/button';
import { ErrorStateMatcher } from '@angular/material/core';
import { MatDialog } from '@angular/material/dialog';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTab, MatTabGroup } from '@angular/material/tabs';
import { MatTooltip } from '@angular/material/tooltip';
import { RouterLink } from '@angular/router';
import type { Design } from '@shared/contracts/design';
import type { DesignSummary, Version, VersionSummary } from '@shared/contracts/designs-api';
import type { Finding } from '@shared/contracts/findings';
import { analyseDesign } from '@shared/engine/analyse';
import { formatQuantity } from '@shared/units/format';
import { catchError, debounceTime, firstValueFrom, of } from 'rxjs';
import { applyFieldErrors } from '../core/forms/apply-field-errors';
import { problemFrom } from '../core/http/api-problem';
import { downloadDocument, exportFileName } from '../designs/design-file';
import { DesignsApi } from '../designs/designs-api';
import { AuditTrail } from '../reviews/audit-trail';
import { latestReviewByVersion } from '../reviews/design-review-state';
import { reportUrl, ReviewsApi } from '../reviews/reviews-api';
import { ShareDialog, type ShareRequest } from '../reviews/share-dialog';
import { BudgetTab } from './budget-tab/budget-tab';
import { ChainTab } from './chain-tab/chain-tab';
import { controlAtPath, createDesignForm, documentOf, loadIntoForm, type DesignForm } from './design-form';
import { DraftStore, type Draft } from './draft-store';
import { EditedErrorStateMatcher } from './edited-error-state';
import { LevelsTab } from './levels-tab/levels-tab';
import { SimulationSession } from './simulation-tab/simulation-session';
import { SimulationTab } from './simulation-tab/simulation-tab';
import { SpectraTab } from './spectra-tab/spectra-tab';
import { SweepTab } from './sweep-tab/sweep-tab';
import { LiveEvaluation } from './live-evaluation';
import { SaveVersionDialog, type SaveVersionRequest } from './save-version-dialog';
import { VersionConflictDialog, type VersionConflict } from './version-conflict-dialog';
import { VersionHistory } from './version-history';

const CHAIN_TAB = 0;

/** The serialised document a design gives once it has been through the forms: what "unsaved" compares against. */
function formJson(design: Design): string {
  return JSON.stringify(documentOf(createDesignForm(design)));
}

/** A stored document as a design for the forms; an unsaved draft may not validate, and still goes into the forms as typed. */
function designFrom(document: Record<string, unknown>): Design {
  const analysis = analyseDesign(document);
  return analysis.ok ? analysis.design : (document as unknown as Design);
}

/** The design workbench: chain forms, live budget and levels, simulation, spectra and sweeps, versions. */
@Component({
  selector: 'qb-workbench',
  imports: [AuditTrail, BudgetTab, ChainTab, DatePipe, LevelsTab, MatButton, MatIcon, MatProgressBar, MatTab, MatTabGroup, MatTooltip, RouterLink, SimulationTab, SpectraTab, SweepTab, VersionHistory],
  templateUrl: './workbench.html',
  styleUrl: './workbench.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  providers: [LiveEvaluation, SimulationSession, { provide: ErrorStateMatcher, useClass: EditedErrorStateMatcher }],
})
export class Workbench {
  private readonly designs = inject(DesignsApi);
  private readonly drafts = inject(DraftStore);
  private readonly dialog = inject(MatDialog);
  private readonly reviewsApi = inject(ReviewsApi);
  private readonly snackBar = inject(MatSnackBar);
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly destroyRef = inject(DestroyRef);
  protected readonly evaluation = inject(LiveEvaluation);

  /** The design id, from the route. */
  readonly id = input.required<string>();

  protected readonly summary = signal<DesignSummary | null>(null);
  protected readonly versions = signal<readonly VersionSummary[]>([]);
  protected readonly form = signal<DesignForm | null>(null);
  /** The version the forms started from; a save goes on top of it. */
  protected readonly editedVersion = signal<number | null>(null);
  protected readonly loadError = signal<string | null>(null);
  protected readonly draftOffer = signal<Draft | null>(null);
  protected readonly saving = signal(false);
  protected readonly selectedTab = signal(CHAIN_TAB);
  protected readonly highlight = signal<string | null>(null);
  private readonly baselineJson = signal<string | null>(null);

  protected readonly design = this.evaluation.design;
  protected readonly budget = this.evaluation.budget;
  protected readonly dirty = computed(() => {
    const current = this.evaluation.documentJson();
    return current !== null && this.baselineJson() !== null && current !== this.baselineJson();
  });
  protected readonly latestVersion = computed(() => this.summary()?.latestVersion ?? null);
  protected readonly canSave = computed(() => this.dirty() && this.evaluation.inputValid() && !this.saving() && !(this.summary()?.archived ?? false));
  /** The reviews of this design's versions; a user who may not list them sees no review states. */
  protected readonly reviews = rxResource({ params: () => this.id(), stream: ({ params }) => this.reviewsApi.ofDesign(params).pipe(catchError(() => of([]))) });
  protected readonly reviewsByVersion = computed(() => latestReviewByVersion(this.reviews.hasValue() ? this.reviews.value() : []));
  protected readonly reportLink = computed(() => {
    const version = this.editedVersion();
    return version === null ? null : reportUrl(this.id(), version);
  });
  protected readonly fileName = computed(() => exportFileName(this.summary()?.name ?? 'design', this.editedVersion() ?? 0).replace(/\.json$/, ''));
  protected readonly stateText = computed(() => {
    if (!this.evaluation.inputValid()) return 'Input not valid';
    if (this.dirty()) return 'Unsaved changes, kept as a draft in this browser';
    return 'No unsaved changes';
  });

  /** The headline figure beside every tab: resolution in aF and in the measurand. */
  protected readonly liveResolution = computed(() => {
    const budget = this.budget();
    if (budget === null) return '';
    const { farad, pascal, cubicMetrePerSecond } = budget.resolution;
    const measurand = budget.mode === 'flow' ? (cubicMetrePerSecond === null ? null : formatQuantity(cubicMetrePerSecond, 'volumeFlow')) : pascal === null ? null : formatQuantity(pascal, 'pressure');
    return [farad === null ? 'undefined' : formatQuantity(farad, 'capacitance'), measurand].filter((part) => part !== null).join(' · ');
  });
  protected readonly findingCounts = computed(() => {
    const findings = this.budget()?.findings ?? [];
    const count = (severity: Finding['severity'], one: string, many: string) => {
      const n = findings.filter((finding) => finding.severity === severity).length;
      return n === 0 ? null : `${n} ${n === 1 ? one : many}`;
    };
    const parts = [count('error', 'error', 'errors'), count('warning', 'warning', 'warnings'), count('note', 'note', 'notes')].filter((part) => part !== null);
    return parts.length === 0 ? 'none' : parts.join(', ');
  });

  constructor() {
    toObservable(this.id)
      .pipe(takeUntilDestroyed())
      .subscribe((id) => void this.open(id));
  }

  private async open(id: string): Promise<void> {
    this.loadError.set(null);
    this.draftOffer.set(null);
    try {
      const [summary, versions] = await Promise.all([firstValueFrom(this.designs.get(id)), firstValueFrom(this.designs.versions(id))]);
      this.summary.set(summary);
      this.versions.set(versions);
      const version = await firstValueFrom(this.designs.version(id, summary.latestVersion));
      this.showVersion(version);
      const draft = this.drafts.newest(id);
      if (draft !== null && JSON.stringify(draft.document) !== this.baselineJson()) this.draftOffer.set(draft);
    } catch (error) {
      this.loadError.set(problemFrom(error).detail);
    }
  }

  /** Puts a version into the forms; the first one also creates them and starts the live evaluation. */
  private showVersion(version: Version): void {
    const design = designFrom(version.document);
    this.putIntoForms(design);
    this.baselineJson.set(formJson(design));
    this.editedVersion.set(version.number);
  }

  private putIntoForms(design: Design): void {
    const form = this.form();
    if (form === null) {
      const created = createDesignForm(design);
      this.evaluation.evaluate(created);
      this.form.set(created);
      this.evaluation.attach(created);
      created.valueChanges.pipe(debounceTime(300), takeUntilDestroyed(this.destroyRef)).subscribe(() => this.keepDraft());
    } else {
      loadIntoForm(form, design);
      this.evaluation.evaluate(form);
    }
  }

  /** Stores the edit as the draft of the version it was made on, or drops the draft once the edit is undone. */
  private keepDraft(): void {
    const form = this.form();
    const base = this.editedVersion();
    // An offered draft is not overwritten before the designer has said what to do with it.
    if (form === null || base === null || this.draftOffer() !== null) return;
    const document = documentOf(form);
    if (JSON.stringify(document) === this.baselineJson()) this.drafts.discard(this.id(), base);
    else this.drafts.save(this.id(), base, document);
  }

  protected async restoreDraft(draft: Draft): Promise<void> {
    this.draftOffer.set(null);
    try {
      const base = draft.baseVersion === this.editedVersion() ? null : await firstValueFrom(this.designs.version(this.id(), draft.baseVersion));
      const baseline = base === null ? this.baselineJson() : formJson(designFrom(base.document));
      this.putIntoForms(designFrom(draft.document));
      this.baselineJson.set(baseline);
      this.editedVersion.set(draft.baseVersion);
      this.form()?.markAsDirty();
    } catch (error) {
      this.snackBar.open(problemFrom(error).detail, 'Close', { duration: 8000, panelClass: 'qb-snack-error' });
    }
  }

  protected discardDraft(draft: Draft): void {
    this.drafts.discard(this.id(), draft.baseVersion);
    this.draftOffer.set(null);
  }

  protected async loadVersion(number: number): Promise<void> {
    const keptDraft = this.dirty();
    if (keptDraft) this.keepDraft();
    try {
      this.showVersion(await firstValueFrom(this.designs.version(this.id(), number)));
      if (keptDraft) {
        const draft = this.drafts.newest(this.id());
        this.snackBar
          .open(`Loaded version ${number}. Your unsaved edit is kept as a draft.`, 'Restore it', { duration: 10000 })
          .onAction()
          .subscribe(() => draft && void this.restoreDraft(draft));
      }
    } catch (error) {
      this.snackBar.open(problemFrom(error).detail, 'Close', { duration: 8000, panelClass: 'qb-snack-error' });
    }
  }

  protected async exportVersion(number: number): Promise<void> {
    try {
      const version = await firstValueFrom(this.designs.version(this.id(), number));
      downloadDocument(version.document, exportFileName(this.summary()?.name ?? 'design', number));
    } catch (error) {
      this.snackBar.open(problemFrom(error).detail, 'Close', { duration: 8000, panelClass: 'qb-snack-error' });
    }
  }

  protected shareForReview(): void {
    const version = this.editedVersion();
    if (version === null) return;
    const data: ShareRequest = { designId: this.id(), designName: this.summary()?.name ?? '', versionNumber: version };
    this.dialog
      .open(ShareDialog, { width: '520px', data })
      .afterClosed()
      .subscribe(() => this.reviews.reload());
  }

  protected saveVersion(): void {
    const base = this.editedVersion();
    if (!this.canSave() || base === null) return;
    const data: SaveVersionRequest = { designName: this.summary()?.name ?? '', baseVersion: base };
    this.dialog
      .open(SaveVersionDialog, { width: '520px', data })
      .afterClosed()
      .subscribe((message: string | undefined) => {
        if (message) this.post(message, base, base);
      });
  }

  /** Posts the forms' document as a new version on top of `onTop`; `draftBase` names the draft it replaces. */
  private post(message: string, onTop: number, draftBase: number): void {
    const form = this.form();
    if (form === null) return;
    const document = documentOf(form);
    this.saving.set(true);
    this.designs.saveVersion(this.id(), { document, message, baseVersion: onTop }).subscribe({
      next: (version) => {
        this.saving.set(false);
        this.drafts.discard(this.id(), draftBase);
        this.baselineJson.set(JSON.stringify(document));
        this.editedVersion.set(version.number);
        this.summary.update((summary) => summary && { ...summary, latestVersion: version.number });
        this.refreshHistory();
        this.snackBar.open(`Saved version ${version.number}.`, 'Close', { duration: 4000 });
      },
      error: (error: unknown) => {
        this.saving.set(false);
        const latest = error instanceof HttpErrorResponse && error.status === 409 ? (error.error as { latestVersion?: unknown } | null)?.latestVersion : undefined;
        if (typeof latest === 'number') {
          this.resolveConflict(message, onTop, latest, document, draftBase);
          return;
        }
        const problem = problemFrom(error);
        applyFieldErrors(form, problem.errors.map((e) => ({ path: e.path.replace(/^document\.?/, ''), message: e.message })));
        this.snackBar.open(problem.detail, 'Close', { duration: 10000, panelClass: 'qb-snack-error' });
      },
    });
  }

  private resolveConflict(message: string, baseVersion: number, latestVersion: number, draft: Record<string, unknown>, draftBase: number): void {
    this.refreshHistory();
    const data: VersionConflict = { designId: this.id(), baseVersion, latestVersion, draft };
    this.dialog
      .open(VersionConflictDialog, { width: '640px', data })
      .afterClosed()
      .subscribe((onTop: boolean | undefined) => {
        if (onTop) this.post(message, latestVersion, draftBase);
      });
  }

  private refreshHistory(): void {
    this.designs.versions(this.id()).subscribe({
      next: (versions) => {
        this.versions.set(versions);
        const newest = versions[0]?.number;
        if (newest !== undefined) this.summary.update((summary) => summary && { ...summary, latestVersion: Math.max(summary.latestVersion, newest) });
      },
      error: () => this.snackBar.open('The version history could not be refreshed.', 'Close', { duration: 6000 }),
    });
  }

  /** A sweep point applied to the design: the value goes into its field like a typed one. */
  protected applyAtPath(path: string, value: number): void {
    const form = this.form();
    const control = form === null ? null : controlAtPath(form, path);
    if (control === null) return;
    control.setValue(value);
    control.markAsDirty();
    this.snackBar.open(`Set ${path} to ${Number(value.toPrecision(4))}.`, 'Close', { duration: 4000 });
  }

  protected goToFinding(finding: Finding): void {
    this.goToField(finding.path, finding.stage);
  }

  /** Opens the Chain tab, highlights the stage and puts the cursor in the field. */
  protected goToField(path: string, stage: string | null): void {
    this.selectedTab.set(CHAIN_TAB);
    this.highlight.set(stage ?? this.stageOfPath(path));
    this.focusWhenShown(path, stage, 30);
  }

  protected pickStage(stage: string): void {
    this.highlight.set(stage);
    this.focusWhenShown('', stage, 30);
  }

  private stageOfPath(path: string): string | null {
    const index = /^chain\[(\d+)\]/.exec(path)?.[1];
    if (index === undefined) return path.split('.')[0] || null;
    return this.form()?.controls.chain.at(Number(index))?.controls.id.value ?? null;
  }

  /** The tab's content appears a frame or two after the switch: wait for the field, then scroll to it and focus it. */
  private focusWhenShown(path: string, stage: string | null, frames: number): void {
    requestAnimationFrame(() => {
      const root = this.host.nativeElement;
      const field =
        path === '' ? null : root.querySelector<HTMLElement>(`[data-path="${CSS.escape(path)}"]`) ?? root.querySelector<HTMLElement>(`[data-path="${CSS.escape(path + '[0]')}"]`);
      const stageElement = stage === null ? null : root.querySelector<HTMLElement>(`[data-stage="${CSS.escape(stage)}"]`);
      const target = field ?? stageElement;
      if (target === null) {
        if (frames > 0) this.focusWhenShown(path, stage, frames - 1);
        return;
      }
      target.scrollIntoView({ block: 'center', behavior: 'smooth' });
      field?.focus({ preventScroll: true });
    });
  }
}
