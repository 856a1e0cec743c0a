/** An output RMS noise referred to the input: capacitance, pressure on cell A, volume flow. */
export interface InputReferred {
  farad: number | null;
  pascal: number | null;
  cubicMetrePerSecond: number | null;
}

/**
 * rms / S_C gives farads; over dC/dp pascals; over dC/dQ (flow mode) m^3/s. A zero slope leaves the
 * figure undefined (null); the budget reports a finding for it.
 */
export function referToInput(outputRms: number, voltsPerFarad: number, faradPerPascal: number, faradPerFlow: number | null): InputReferred {
  const farad = voltsPerFarad !== 0 ? outputRms / Math.abs(voltsPerFarad) : null;
  return {
    farad,
    pascal: farad !== null && faradPerPascal !== 0 ? farad / Math.abs(faradPerPascal) : null,
    cubicMetrePerSecond: farad !== null && faradPerFlow !== null && faradPerFlow !== 0 ? farad / Math.abs(faradPerFlow) : null,
  };
}
