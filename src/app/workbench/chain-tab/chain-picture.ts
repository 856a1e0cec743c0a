import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import type { NodeLevel } from '@shared/contracts/figures';
import { formatQuantity } from '@shared/units/format';
import { stageTitles, type StageKind } from '../stage-fields';

export interface PictureStage {
  id: string;
  kind: StageKind;
}

interface Block {
  id: string;
  title: string;
  domain: 'carrier' | 'baseband';
  percent: number | null;
  state: 'ok' | 'warn' | 'clip' | 'passive';
  detail: string;
}

/** The chain as blocks from the bridge to the converter, each with its node's level against its swing. */
@Component({
  selector: 'qb-chain-picture',
  templateUrl: './chain-picture.html',
  styleUrl: './chain-picture.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ChainPicture {
  readonly stages = input.required<readonly PictureStage[]>();
  readonly levels = input<readonly NodeLevel[]>([]);
  readonly excitationFrequency = input<number | null>(null);
  /** Stage a finding points to, or "sensor"/"excitation" for the bridge. */
  readonly highlight = input<string | null>(null);
  readonly picked = output<string>();

  protected readonly bridgeDetail = computed(() => {
    const frequency = this.excitationFrequency();
    return frequency === null ? 'square wave' : `square wave, ${formatQuantity(frequency, 'frequency')}`;
  });
  protected readonly bridgeHighlighted = computed(() => ['sensor', 'excitation', 'environment'].includes(this.highlight() ?? ''));

  protected readonly blocks = computed<Block[]>(() => {
    const levels = new Map(this.levels().map((level) => [level.node, level]));
    let domain: Block['domain'] = 'carrier';
    return this.stages().map((stage) => {
      if (stage.kind === 'demodulator') domain = 'baseband';
      const level = levels.get(stage.id);
      const used = level?.usedFraction ?? null;
      const percent = used === null ? null : Math.round(used * 100);
      const state: Block['state'] = used === null ? 'passive' : used > 1 ? 'clip' : used >= 0.8 ? 'warn' : 'ok';
      const detail = level === undefined ? '' : `peak ${formatQuantity(level.peak, 'voltage')}`;
      return { id: stage.id, title: stageTitles[stage.kind], domain, percent, state, detail };
    });
  });

  protected barWidth(percent: number): number {
    return Math.min(100, Math.max(2, percent));
  }
}
