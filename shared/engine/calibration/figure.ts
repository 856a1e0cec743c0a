/** A figure in % of full scale that names what it was measured against. */
export interface PercentFigure {
  /** The line, curve or comparison the figure is measured against, in the trade's words. */
  readonly against: string;
  /** The figure in % of full scale. */
  readonly percentFullScale: number;
  /** The same figure in the unit of the quantity it is a deviation of. */
  readonly value: number;
  /** Reference value of the set point where the figure is largest. */
  readonly atReference: number;
}

const curveNames = ['', 'line', 'quadratic', 'cubic', 'quartic', 'quintic'];

/** "least-squares line", "least-squares cubic", "least-squares polynomial of degree 7". */
export function leastSquaresCurveName(degree: number, throughOrigin: boolean): string {
  const name = curveNames[degree] ?? `polynomial of degree ${degree}`;
  return `least-squares ${name}${throughOrigin ? ' through the origin' : ''}`;
}
