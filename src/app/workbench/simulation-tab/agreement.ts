import type { Budget } from '@shared/contracts/figures';
import type { SimulationResult } from '@shared/engine/simulation/result';
import { formatQuantity, type DimensionName } from '@shared/units';

/** One figure measured on the simulation beside the analytic budget's. */
export interface AgreementRow {
  readonly figure: string;
  readonly simulated: string;
  readonly analytic: string;
  /** (simulated - analytic) / analytic, as text; "-" when either is missing. */
  readonly difference: string;
  /** |difference| as a number, for marking large ones; null when missing or not comparable. */
  readonly relative: number | null;
  /** Why the two figures are not compared, when they are not. */
  readonly note: string | null;
}

function row(figure: string, simulated: number | null, analytic: number | null, show: (value: number) => string): AgreementRow {
  const relative = simulated !== null && analytic !== null && analytic !== 0 && Number.isFinite(simulated) ? (simulated - analytic) / Math.abs(analytic) : null;
  return {
    figure,
    simulated: simulated === null ? '-' : show(simulated),
    analytic: analytic === null ? '-' : show(analytic),
    difference: relative === null ? '-' : `${relative >= 0 ? '+' : ''}${(relative * 100).toFixed(1)} %`,
    relative: relative === null ? null : Math.abs(relative),
    note: null,
  };
}

/** The two figures side by side without a difference: they describe different conditions. */
function uncompared(base: AgreementRow, note: string): AgreementRow {
  return { ...base, difference: '-', relative: null, note };
}

const quantity = (dimension: DimensionName) => (value: number) => formatQuantity(value, dimension, { significant: 4 });
const percent = (value: number) => `${(value * 100).toFixed(2)} %`;

/**
 * Simulated against analytic: output RMS noise (when the run had noise), DC sensitivity, ripple
 * (compared when the input is held at full scale, as the budget's is), and the step metrics when
 * the input was a step.
 */
export function agreementRows(result: SimulationResult, budget: Budget, fullScale: number): AgreementRow[] {
  const figures = result.figures;
  const rows: AgreementRow[] = [];
  if (result.noise) {
    const band = `${formatQuantity(figures.bandLow, 'frequency')} to ${formatQuantity(figures.bandHigh, 'frequency')}`;
    rows.push(row(`Output RMS noise (${band})`, figures.outputRms, budget.noise.outputRms, quantity('voltage')));
  }
  rows.push(row('DC sensitivity', figures.sensitivityVoltsPerFarad, budget.sensitivity.voltsPerFarad, quantity('voltsPerFarad')));
  // The budget's ripple is the one at full scale; the simulated one is at the run's input.
  const ripple = row(`Carrier ripple (peak, at ${figures.rippleNode})`, figures.ripplePeak, budget.ripple.outputPeak, quantity('voltage'));
  const atFullScale = result.input.kind === 'constant' && Math.abs(result.input.value - fullScale) <= 1e-9 * fullScale;
  rows.push(atFullScale ? ripple : uncompared(ripple, 'The analytic ripple is at full scale; run a constant full-scale input to compare.'));
  if (figures.step !== null) {
    const step = budget.stepResponse;
    rows.push(row('Step rise time (10-90 %)', figures.step.rise, step.riseTime, quantity('time')));
    rows.push(row('Step overshoot', figures.step.overshoot, step.overshoot, percent));
    rows.push(row('Settling to 1 %', figures.step.settle1, step.settlingTime1Percent, quantity('time')));
    rows.push(row('Settling to 0.1 %', figures.step.settle01, step.settlingTime01Percent, quantity('time')));
  }
  return rows;
}
