import type { Budget } from '@shared/contracts/figures';
import { formatQuantity } from '@shared/units/format';

/** One row of the noise budget as the table shows it, each source with its share of the output noise power. */
export interface NoiseRow {
  source: string;
  stage: string;
  outputRms: number;
  share: number;
  inputFarad: number | null;
  /** Pa in pressure mode, m^3/s in flow mode. */
  inputMeasurand: number | null;
  outputText: string;
  faradText: string;
  measurandText: string;
  shareText: string;
}

export function noiseRows(budget: Budget): NoiseRow[] {
  const flow = budget.mode === 'flow';
  return budget.noise.contributions
    .map((contribution) => {
      const measurand = flow ? contribution.inputReferred.cubicMetrePerSecond : contribution.inputReferred.pascal;
      return {
        source: contribution.source,
        stage: contribution.stage,
        outputRms: contribution.outputRms,
        share: contribution.share,
        inputFarad: contribution.inputReferred.farad,
        inputMeasurand: measurand,
        outputText: formatQuantity(contribution.outputRms, 'voltage'),
        faradText: contribution.inputReferred.farad === null ? 'undefined' : formatQuantity(contribution.inputReferred.farad, 'capacitance'),
        measurandText: measurand === null ? 'undefined' : formatQuantity(measurand, flow ? 'volumeFlow' : 'pressure'),
        shareText: shareText(contribution.share),
      };
    })
    .sort((a, b) => b.share - a.share);
}

export function shareText(share: number): string {
  const percent = share * 100;
  if (percent === 0) return '0 %';
  if (percent < 0.01) return '< 0.01 %';
  return `${percent < 10 ? percent.toFixed(2) : percent.toFixed(1)} %`;
}
