import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import type { Budget } from '@shared/contracts/figures';
import type { Finding } from '@shared/contracts/findings';
import { formatQuantity } from '@shared/units/format';
import { FindingsList } from './findings-list';
import { NoiseTable } from './noise-table';

export interface Figure {
  label: string;
  value: string;
  detail?: string;
  testId?: string;
}

const undefinedText = 'undefined';

function or(value: number | null, format: (value: number) => string): string {
  return value === null ? undefinedText : format(value);
}

function decibels(value: number): string {
  return `${value.toFixed(1)} dB`;
}

function percent(fraction: number): string {
  const p = fraction * 100;
  return `${Math.abs(p) < 1 ? p.toPrecision(2) : p.toFixed(1)} %`;
}

/** The analytic budget: key figures, the noise budget with its bar chart, and the findings. */
@Component({
  selector: 'qb-budget-tab',
  imports: [FindingsList, NoiseTable],
  templateUrl: './budget-tab.html',
  styleUrl: './budget-tab.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BudgetTab {
  readonly budget = input.required<Budget>();
  readonly fileName = input('design');
  readonly goToFinding = output<Finding>();

  protected readonly flow = computed(() => this.budget().mode === 'flow');

  protected readonly headline = computed<Figure[]>(() => {
    const b = this.budget();
    const band = `${formatQuantity(b.resolution.bandLow, 'frequency')} to ${formatQuantity(b.resolution.bandHigh, 'frequency')}`;
    const measurand = this.flow()
      ? or(b.resolution.cubicMetrePerSecond, (v) => formatQuantity(v, 'volumeFlow'))
      : or(b.resolution.pascal, (v) => formatQuantity(v, 'pressure'));
    return [
      { label: 'Resolution', value: or(b.resolution.farad, (v) => formatQuantity(v, 'capacitance')), detail: `${measurand} · ${band}`, testId: 'resolution' },
      { label: 'Output noise', value: `${formatQuantity(b.noise.outputRms, 'voltage')} rms`, detail: band, testId: 'output-noise' },
      {
        label: 'Sensitivity',
        value: formatQuantity(b.sensitivity.voltsPerFarad, 'voltsPerFarad'),
        detail: this.flow()
          ? or(b.sensitivity.voltsPerCubicMetrePerSecond, (v) => formatQuantity(v, 'voltsPerVolumeFlow'))
          : formatQuantity(b.sensitivity.voltsPerPascal, 'voltsPerPascal'),
        testId: 'sensitivity',
      },
      { label: 'SNR', value: or(b.snr, decibels), detail: `dynamic range ${or(b.dynamicRange, decibels)}` },
      { label: 'ENOB', value: or(b.enob, (v) => `${v.toFixed(2)} bits`), detail: 'across the full-scale span' },
    ];
  });

  protected readonly groups = computed<{ title: string; figures: Figure[] }[]>(() => {
    const b = this.budget();
    const o = b.offset;
    const s = b.stepResponse;
    const t = b.transfer;
    const unit = this.flow() ? 'voltsPerVolumeFlow' : 'voltsPerPascal';
    const groups = [
      {
        title: 'Demodulator',
        figures: [
          { label: 'Gain D', value: b.demodulatorGain.toFixed(4), detail: `${b.demodulatorHarmonics} odd harmonics summed` },
          { label: 'Noise folding', value: `${b.harmonicsSummed} harmonics`, detail: 'summed until the rest is below 1e-4' },
          { label: 'Best reference phase', value: `${b.bestDemodulatorPhase.toFixed(2)} deg` },
        ],
      },
      {
        title: 'Offset and trim',
        figures: [
          { label: 'Before trim', value: formatQuantity(o.untrimmedVolts, 'voltage'), detail: formatQuantity(o.untrimmedFarad, 'capacitance') },
          { label: 'With the set trim', value: formatQuantity(o.settingVolts, 'voltage') },
          { label: 'At the best code', value: or(o.trimmedVolts, (v) => formatQuantity(v, 'voltage')), detail: or(o.residualFarad, (v) => `${formatQuantity(v, 'capacitance')} left`) },
          { label: 'Residual', value: or(o.residualFullScale, percent), detail: 'of the full-scale span' },
          { label: 'Ideal trim', value: or(o.idealTrim, (v) => v.toFixed(5)), detail: o.trimCode === null ? undefinedText : `DAC code ${o.trimCode} gives ${or(o.trimAtCode, (v) => String(v))}` },
        ],
      },
      {
        title: 'Transfer and ripple',
        figures: [
          { label: 'Slope at zero', value: formatQuantity(t.voltsPerUnitAtZero, unit) },
          { label: 'Slope at full scale', value: formatQuantity(t.voltsPerUnitAtFullScale, unit) },
          { label: 'Output span', value: formatQuantity(t.outputSpanVolts, 'voltage'), detail: 'zero to full scale' },
          { label: 'Carrier ripple', value: `${formatQuantity(b.ripple.outputPeak, 'voltage')} peak`, detail: `at ${formatQuantity(b.ripple.frequency, 'frequency')}`, testId: 'ripple' },
          { label: 'Noise bandwidth', value: formatQuantity(b.noise.basebandEnbw, 'frequency'), detail: 'ENBW of the baseband path' },
        ],
      },
      {
        title: 'Step response',
        figures: [
          { label: 'Rise time 10-90 %', value: or(s.riseTime, (v) => formatQuantity(v, 'time')) },
          { label: 'Overshoot', value: or(s.overshoot, percent) },
          { label: 'Settling to 1 %', value: or(s.settlingTime1Percent, (v) => formatQuantity(v, 'time')) },
          { label: 'Settling to 0.1 %', value: or(s.settlingTime01Percent, (v) => formatQuantity(v, 'time')) },
        ],
      },
    ];
    if (this.flow()) {
      const f = b.fluidics;
      groups.push({
        title: 'Fluidics',
        figures: [
          { label: 'Hydraulic resistance', value: or(f.hydraulicResistance, (v) => formatQuantity(v, 'hydraulicResistance')) },
          { label: 'Pressure drop at full scale', value: or(f.pressureDropAtFullScale, (v) => formatQuantity(v, 'pressure')) },
          { label: 'Reynolds number at full scale', value: or(f.reynoldsAtFullScale, (v) => v.toFixed(0)), detail: 'laminar below 2000' },
          { label: 'Common-mode rejection', value: or(f.commonModeRejection, decibels) },
        ],
      });
    }
    return groups;
  });
}
