import { ApplicationRef, DestroyRef, Injectable, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { AbstractControl } from '@angular/forms';
import type { Design } from '@shared/contracts/design';
import type { Budget } from '@shared/contracts/figures';
import type { FieldError } from '@shared/contracts/problem';
import { analyseDesign } from '@shared/engine/analyse';
import { asapScheduler, debounceTime, startWith } from 'rxjs';
import { controlAtPath, documentOf, type DesignForm } from './design-form';

/**
 * The analytic budget of the design being edited, recomputed on the main thread right after a change
 * (in the microtask after the input event, well before the next frame is painted). Input that does not validate keeps the last good budget and lists the errors.
 */
@Injectable()
export class LiveEvaluation {
  private readonly appRef = inject(ApplicationRef);
  private readonly destroyRef = inject(DestroyRef);

  private readonly lastGood = signal<{ design: Design; budget: Budget } | null>(null);
  readonly design = computed(() => this.lastGood()?.design ?? null);
  readonly budget = computed(() => this.lastGood()?.budget ?? null);
  /** What is wrong with the input, by document path; empty when the budget is current. */
  readonly errors = signal<readonly FieldError[]>([]);
  readonly inputValid = computed(() => this.errors().length === 0);
  /** The document as last evaluated, serialised: what drafts and saves compare. */
  readonly documentJson = signal<string | null>(null);
  /** Main-thread time of the last evaluation [ms]. */
  readonly evaluationTime = signal<number | null>(null);

  private marked = new Set<AbstractControl>();

  /** Evaluates the form now, then again after each change; the changes of one task (a patch of many fields) give one evaluation. */
  attach(form: DesignForm): void {
    form.valueChanges
      .pipe(startWith(null), debounceTime(0, asapScheduler), takeUntilDestroyed(this.destroyRef))
      .subscribe(() => {
        this.evaluate(form);
        // Render now rather than in a later task: the figures reach the page before the next frame is painted.
        this.appRef.tick();
      });
  }

  evaluate(form: DesignForm): void {
    const started = performance.now();
    const document = documentOf(form);
    const analysis = analyseDesign(document);
    this.documentJson.set(JSON.stringify(document));
    if (analysis.ok) {
      this.lastGood.set({ design: analysis.design, budget: analysis.budget });
      this.errors.set([]);
    } else {
      this.errors.set(analysis.errors.map((error) => this.ownMessage(form, error)));
    }
    this.markControls(form, analysis.ok ? [] : analysis.errors);
    this.evaluationTime.set(performance.now() - started);
  }

  /** Forgets the budget of another design (a different design opened in the same page). */
  reset(): void {
    this.lastGood.set(null);
    this.errors.set([]);
    this.marked = new Set();
  }

  /** The field's own reading error ("expected a capacitance, got a frequency") says more than the schema's "must be a number". */
  private ownMessage(form: DesignForm, error: FieldError): FieldError {
    const own = controlAtPath(form, error.path)?.getError('quantity');
    return typeof own === 'string' ? { path: error.path, message: own } : error;
  }

  /** Puts each design error on its field under the `design` key, and takes last time's off the fields that are fine now. */
  private markControls(form: DesignForm, errors: readonly FieldError[]): void {
    const next = new Map<AbstractControl, string>();
    for (const error of errors) {
      const control = controlAtPath(form, error.path);
      if (control !== null && !control.hasError('quantity') && !next.has(control)) next.set(control, error.message);
    }
    for (const control of this.marked) {
      if (next.has(control) || !control.hasError('design')) continue;
      const { design: _gone, ...rest } = control.errors ?? {};
      control.setErrors(Object.keys(rest).length > 0 ? rest : null);
    }
    for (const [control, message] of next) {
      if (control.getError('design') !== message) control.setErrors({ ...control.errors, design: message });
      control.markAsTouched();
    }
    this.marked = new Set(next.keys());
  }
}
