import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { AbstractControl, FormArray, FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatIconButton } from '@angular/material/button';
import { MatError, MatFormField, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatOption, MatSelect } from '@angular/material/select';
import { MatTooltip } from '@angular/material/tooltip';
import type { NodeLevel } from '@shared/contracts/figures';
import type { NumberControl, StageGroup } from '../design-form';
import { EngineeringInput, controlErrorMessage } from '../engineering-input/engineering-input';
import { filterResponses, stageFields, stageTitles } from '../stage-fields';

/** The form of one stage of the chain: its id, its fields by kind, and the moves the placement rules allow. */
@Component({
  selector: 'qb-stage-form',
  imports: [EngineeringInput, MatError, MatFormField, MatIcon, MatIconButton, MatInput, MatLabel, MatOption, MatSelect, MatTooltip, ReactiveFormsModule],
  templateUrl: './stage-form.html',
  styleUrl: './stage-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: {
    '[class.highlighted]': 'highlighted()',
    '[attr.data-stage]': 'group().controls.id.value',
    '[attr.data-testid]': '"stage-" + group().controls.kind.value',
  },
})
export class StageForm {
  readonly group = input.required<StageGroup>();
  readonly index = input.required<number>();
  readonly level = input<NodeLevel | null>(null);
  readonly highlighted = input(false);
  readonly canMoveUp = input(false);
  readonly canMoveDown = input(false);
  readonly canRemove = input(false);

  readonly moveUp = output<void>();
  readonly moveDown = output<void>();
  readonly remove = output<void>();

  protected readonly responses = filterResponses;
  protected readonly kind = computed(() => this.group().controls.kind.value);
  protected readonly title = computed(() => stageTitles[this.kind()]);
  protected readonly fields = computed(() => stageFields[this.kind()]);
  protected readonly usedPercent = computed(() => {
    const used = this.level()?.usedFraction;
    return used === null || used === undefined ? null : Math.round(used * 100);
  });
  protected readonly errorMessage = controlErrorMessage;

  protected number(key: string): NumberControl {
    return (this.group() as AbstractControl).get(key) as NumberControl;
  }

  protected range(key: string): FormArray<NumberControl> {
    return (this.group() as AbstractControl).get(key) as FormArray<NumberControl>;
  }

  protected text(key: string): FormControl<string> {
    return (this.group() as AbstractControl).get(key) as FormControl<string>;
  }

  protected path(key: string): string {
    return `chain[${this.index()}].${key}`;
  }
}
