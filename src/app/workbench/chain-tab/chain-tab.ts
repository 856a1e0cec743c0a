import { ChangeDetectionStrategy, Component, DestroyRef, OnInit, computed, inject, input, output, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatButtonToggle, MatButtonToggleGroup } from '@angular/material/button-toggle';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatMenu, MatMenuItem, MatMenuTrigger } from '@angular/material/menu';
import type { Budget } from '@shared/contracts/figures';
import { stageRegistry } from '@shared/engine/stages/registry';
import { formatQuantity } from '@shared/units/format';
import { startWith } from 'rxjs';
import { canMove, canRemove, insertionIndex, newStageId } from '../chain-rules';
import { createStageGroup, type DesignForm, type StageGroup } from '../design-form';
import { EngineeringInput, controlErrorMessage } from '../engineering-input/engineering-input';
import { stageTitles, type StageKind } from '../stage-fields';
import type { ChainStage } from '@shared/contracts/design';
import { ChainPicture, type PictureStage } from './chain-picture';
import { StageForm } from './stage-form';

/** Sensor, excitation, chain and analysis forms, with the chain drawn as blocks above them. */
@Component({
  selector: 'qb-chain-tab',
  imports: [
    ChainPicture,
    EngineeringInput,
    MatButton,
    MatButtonToggle,
    MatButtonToggleGroup,
    MatError,
    MatFormField,
    MatHint,
    MatIcon,
    MatInput,
    MatLabel,
    MatMenu,
    MatMenuItem,
    MatMenuTrigger,
    ReactiveFormsModule,
    StageForm,
  ],
  templateUrl: './chain-tab.html',
  styleUrl: './chain-tab.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ChainTab implements OnInit {
  private readonly destroyRef = inject(DestroyRef);

  readonly form = input.required<DesignForm>();
  readonly budget = input<Budget | null>(null);
  readonly highlight = input<string | null>(null);
  readonly picked = output<string>();

  /** The chain's shape (ids and kinds), refreshed when stages are added, removed, moved or renamed. */
  protected readonly stages = signal<readonly PictureStage[]>([]);
  protected readonly mode = signal<'pressure' | 'flow'>('pressure');
  protected readonly capillaryKind = signal<'geometry' | 'resistance'>('geometry');
  protected readonly kinds = computed(() => this.stages().map((stage) => stage.kind));
  protected readonly levels = computed(() => this.budget()?.levels ?? []);
  protected readonly levelOf = computed(() => new Map(this.levels().map((level) => [level.node, level])));
  protected readonly addable = computed(() =>
    (stageRegistry.kinds as readonly StageKind[])
      .filter((kind) => insertionIndex(this.kinds(), kind) !== null)
      .map((kind) => ({ kind, title: stageTitles[kind], label: stageRegistry.get(kind)?.label ?? kind })),
  );
  protected readonly bandHighHint = computed(() => {
    const budget = this.budget();
    return budget === null || !budget.noise.bandHighFromChain ? 'Empty: set by the chain' : `Empty: set by the chain, now ${formatQuantity(budget.noise.bandHigh, 'frequency')}`;
  });
  protected readonly bestTrim = computed(() => this.budget()?.offset.trimAtCode ?? null);
  protected readonly errorMessage = controlErrorMessage;
  protected readonly formatQuantity = formatQuantity;

  protected readonly canMoveUp = (index: number) => canMove(this.kinds(), index, -1);
  protected readonly canMoveDown = (index: number) => canMove(this.kinds(), index, 1);
  protected readonly canRemove = (index: number) => canRemove(this.kinds(), index);

  ngOnInit(): void {
    const form = this.form();
    form.controls.chain.valueChanges.pipe(startWith(null), takeUntilDestroyed(this.destroyRef)).subscribe(() => {
      const next = form.controls.chain.controls.map((group) => ({ id: group.controls.id.value, kind: group.controls.kind.value }));
      const current = this.stages();
      const same = next.length === current.length && next.every((stage, i) => stage.id === current[i].id && stage.kind === current[i].kind);
      if (!same) this.stages.set(next);
    });
    const sensor = form.controls.sensor.controls;
    sensor.mode.valueChanges.pipe(startWith(sensor.mode.value), takeUntilDestroyed(this.destroyRef)).subscribe((mode) => this.mode.set(mode));
    sensor.capillaryKind.valueChanges
      .pipe(startWith(sensor.capillaryKind.value), takeUntilDestroyed(this.destroyRef))
      .subscribe((kind) => this.capillaryKind.set(kind));
  }

  protected stageGroups(): StageGroup[] {
    return this.form().controls.chain.controls;
  }

  protected addStage(kind: StageKind): void {
    const index = insertionIndex(this.kinds(), kind);
    const stageModule = stageRegistry.get(kind);
    if (index === null || stageModule === undefined) return;
    const id = newStageId(this.stages().map((stage) => stage.id), kind);
    const chain = this.form().controls.chain;
    chain.insert(index, createStageGroup(stageModule.defaults(id) as ChainStage));
    chain.markAsDirty();
    this.picked.emit(id);
  }

  protected moveStage(index: number, step: -1 | 1): void {
    const chain = this.form().controls.chain;
    const group = chain.at(index);
    chain.removeAt(index, { emitEvent: false });
    chain.insert(index + step, group);
    chain.markAsDirty();
  }

  protected removeStage(index: number): void {
    const chain = this.form().controls.chain;
    chain.removeAt(index);
    chain.markAsDirty();
  }

  protected setBestTrim(): void {
    const trim = this.bestTrim();
    if (trim === null) return;
    const control = this.form().controls.excitation.controls.trim;
    control.setValue(trim);
    control.markAsDirty();
  }
}
