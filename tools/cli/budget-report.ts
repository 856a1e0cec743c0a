import type { Budget } from '../../shared/contracts/figures';
import { formatQuantity } from '../../shared/units/format';
import type { DimensionName } from '../../shared/units/dimensions';
import { textTable } from './table';

const show = (value: number | null, dimension: DimensionName) => (value === null ? '-' : formatQuantity(value, dimension));
const plain = (value: number | null, digits = 3) => (value === null ? '-' : String(Number(value.toPrecision(digits))));
const percent = (value: number | null) => (value === null ? '-' : `${plain(value * 100)} %`);

/** The budget as a readable terminal report, in engineering units. */
export function budgetReport(budget: Budget): string {
  const band = `${formatQuantity(budget.noise.bandLow, 'frequency')} to ${formatQuantity(budget.noise.bandHigh, 'frequency')}`;
  const flow = budget.mode === 'flow';
  const summary: string[][] = [
    ['mode', budget.mode],
    ['sensitivity', `${show(budget.sensitivity.voltsPerFarad, 'voltsPerFarad')}, ${show(budget.sensitivity.voltsPerPascal, 'voltsPerPascal')}${flow ? `, ${show(budget.sensitivity.voltsPerCubicMetrePerSecond, 'voltsPerVolumeFlow')}` : ''}`],
    ['demodulator gain D', `${plain(budget.demodulatorGain, 4)} (${budget.demodulatorHarmonics} odd harmonics; best phase ${plain(budget.bestDemodulatorPhase)} deg)`],
    ['offset untrimmed', `${show(budget.offset.untrimmedVolts, 'voltage')} (${show(budget.offset.untrimmedFarad, 'capacitance')})`],
    ['offset at setting', show(budget.offset.settingVolts, 'voltage')],
    ['ideal trim', `${plain(budget.offset.idealTrim, 6)}, nearest code ${budget.offset.trimCode ?? '-'} = ${plain(budget.offset.trimAtCode, 6)}`],
    ['offset trimmed', `${show(budget.offset.trimmedVolts, 'voltage')} (${show(budget.offset.residualFarad, 'capacitance')}, ${percent(budget.offset.residualFullScale)} FS)`],
    ['output noise', `${show(budget.noise.outputRms, 'voltage')} rms in ${band} (${budget.harmonicsSummed} odd harmonics folded)`],
    ['baseband ENBW', show(budget.noise.basebandEnbw, 'frequency')],
    ['resolution', `${show(budget.resolution.farad, 'capacitance')}, ${show(budget.resolution.pascal, 'pressure')}${flow ? `, ${show(budget.resolution.cubicMetrePerSecond, 'volumeFlow')}` : ''} rms in ${band}`],
    ['SNR / dynamic range', `${plain(budget.snr)} dB / ${plain(budget.dynamicRange)} dB`],
    ['ENOB', plain(budget.enob)],
    ['carrier ripple', `${show(budget.ripple.outputPeak, 'voltage')} peak at ${formatQuantity(budget.ripple.frequency, 'frequency')}`],
    ['step response', `rise ${show(budget.stepResponse.riseTime, 'time')}, overshoot ${percent(budget.stepResponse.overshoot)}, settles to 1 % in ${show(budget.stepResponse.settlingTime1Percent, 'time')}, to 0.1 % in ${show(budget.stepResponse.settlingTime01Percent, 'time')}`],
  ];
  if (flow) {
    summary.push(
      ['capillary', `${show(budget.fluidics.hydraulicResistance, 'hydraulicResistance')}, ${show(budget.fluidics.pressureDropAtFullScale, 'pressure')} at full scale, Reynolds ${plain(budget.fluidics.reynoldsAtFullScale)}`],
      ['common-mode rejection', `${plain(budget.fluidics.commonModeRejection)} dB`],
    );
  }
  const sections = [
    textTable(['figure', 'value'], summary),
    textTable(
      ['stage', 'noise source', 'output rms', 'share', 'input-referred'],
      budget.noise.contributions.map((c) => [c.stage, c.source, show(c.outputRms, 'voltage'), percent(c.share), `${show(c.inputReferred.farad, 'capacitance')}, ${show(c.inputReferred.pascal, 'pressure')}${flow ? `, ${show(c.inputReferred.cubicMetrePerSecond, 'volumeFlow')}` : ''}`]),
    ),
    textTable(
      ['node', 'kind', 'peak', 'swing', 'used'],
      budget.levels.map((l) => [l.node, l.kind, show(l.peak, 'voltage'), l.swingLow === null || l.swingHigh === null ? 'passive' : `${plain(l.swingLow)} to ${plain(l.swingHigh)} V`, percent(l.usedFraction)]),
    ),
    budget.findings.length === 0
      ? 'findings: none'
      : textTable(['severity', 'where', 'finding', 'suggestion'], budget.findings.map((f) => [f.severity, f.path, f.message, f.suggestion ?? ''])),
  ];
  return sections.join('\n\n');
}
