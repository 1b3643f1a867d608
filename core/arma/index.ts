/**
 * The ARMA engine's public surface. Sign convention: Box–Jenkins "ma-minus" (see types.ts).
 */
export { acfBand, sampleAcf, samplePacf, theoreticalAcf } from './autocorrelation';
export { fitArma } from './fitArma';
export { forecastArma, forecastIntervals, leadTimeMoments } from './forecast';
export { leadTimeSumVariance, windowSumVariance } from './leadTimeSum';
export { psiWeights } from './psi';
export { createRng, type Rng } from './random';
export { arRoots, type ComplexRoot, maRoots, polynomialRootModuli, polynomialRoots } from './roots';
export { type SimulationModel, simulateArma } from './simulate';
export type { ArmaFit, ArmaFitOptions, ArmaForecastState, ArmaStandardErrors } from './types';
