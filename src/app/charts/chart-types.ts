/** One curve of a line chart; x ascending or descending, y (and the band) index by index with x. */
export interface LineSeries {
  readonly name: string;
  readonly x: ArrayLike<number>;
  readonly y: ArrayLike<number>;
  /** Lower edge of a min/max envelope band around y. */
  readonly yLow?: ArrayLike<number>;
  /** Upper edge of that band. */
  readonly yHigh?: ArrayLike<number>;
}

/** A vertical line at x with a label, e.g. the carrier frequency and its harmonics. */
export interface ChartMarker {
  readonly x: number;
  readonly label: string;
}

export interface PickedPoint {
  readonly series: string;
  readonly index: number;
  readonly x: number;
  readonly y: number;
}

export interface BarDatum {
  readonly label: string;
  readonly value: number;
  /** Shown as the bar's tooltip. */
  readonly detail?: string;
}

export type AxisScale = 'linear' | 'log';
