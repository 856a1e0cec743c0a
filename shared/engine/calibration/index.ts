export * from './points';
export * from './setpoints';
export * from './figure';
export * from './hysteresis';
export * from './cell-analysis';
export * from './degree-comparison';
export * from './batch';
export * from './export';
export { evaluateFit, fitPolynomial, fitSlope, FitInputError, type PolynomialFit, type PolynomialFitOptions } from '../fit/polynomial-fit';
