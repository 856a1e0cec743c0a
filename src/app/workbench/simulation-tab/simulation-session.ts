import { DestroyRef, Injectable, inject, signal } from '@angular/core';
import type { Design } from '@shared/contracts/design';
import type { SimulationOptionsInput } from '@shared/contracts/simulation';
import type { SimulationResult } from '@shared/engine/simulation/result';
import type { Subscription } from 'rxjs';
import { SimulationRunner } from '../../simulation/simulation-runner';

/**
 * The workbench's last time-domain simulation, shared by the Simulation and Spectra tabs: one run
 * at a time, its progress, its result and the design it was run on. Provided by the workbench page,
 * so every open design has its own.
 */
@Injectable()
export class SimulationSession {
  private readonly runner = inject(SimulationRunner);
  private subscription: Subscription | null = null;

  private readonly resultState = signal<SimulationResult | null>(null);
  private readonly designState = signal<Design | null>(null);
  private readonly runningState = signal(false);
  private readonly fractionState = signal(0);
  private readonly errorState = signal<string | null>(null);

  /** Result of the last finished run; kept while a new one runs. */
  readonly result = this.resultState.asReadonly();
  /** The design the result belongs to. */
  readonly design = this.designState.asReadonly();
  readonly running = this.runningState.asReadonly();
  /** Fraction of the running simulation done, 0 to 1. */
  readonly fraction = this.fractionState.asReadonly();
  /** Why the last run failed, if it did. */
  readonly error = this.errorState.asReadonly();

  constructor() {
    inject(DestroyRef).onDestroy(() => this.subscription?.unsubscribe());
  }

  /** Starts a run in the worker, cancelling one that is still going. */
  run(design: Design, options: SimulationOptionsInput): void {
    this.subscription?.unsubscribe();
    this.runningState.set(true);
    this.fractionState.set(0);
    this.errorState.set(null);
    this.subscription = this.runner.run(design, options).subscribe({
      next: (event) => {
        if (event.type === 'progress') this.fractionState.set(event.fraction);
        else {
          this.resultState.set(event.result);
          this.designState.set(design);
        }
      },
      error: (error: unknown) => {
        this.runningState.set(false);
        this.errorState.set(error instanceof Error ? error.message : 'The simulation failed');
      },
      complete: () => this.runningState.set(false),
    });
  }

  /** Stops the running simulation; the previous result stays. */
  cancel(): void {
    this.subscription?.unsubscribe();
    this.subscription = null;
    this.runningState.set(false);
  }
}
