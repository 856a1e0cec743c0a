/** The time-domain simulator: what the worker, the CLI and the tests call. */
export { Simulation, simulate } from './simulator';
export type { SimulationResult, SimulatedNode, SimulationFigures, Envelope, StepMetrics } from './result';
export { minMaxEnvelope, EnvelopeRecorder } from './envelope';
export { nodeSpectrum, type NodeSpectrum } from './spectrum';
export { bandRms, ripplePeak, stepMetrics } from './measure';
export { createProfileSampler, profileValue } from './profile';
export { processorFactories, createStageProcessor } from './processors';
