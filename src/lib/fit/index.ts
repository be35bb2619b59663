// The fit engine's public contract: formulas of physics.md A1–A12 and the goal evaluators. Every
// module names its own sources.

export { FitInputError } from './errors';
export { SPEED_OF_LIGHT, PLANCK, ELEMENTARY_CHARGE, HBAR } from './constants';

export {
  finesse,
  finesseFromMirrorLosses,
  coefficientOfFinesse,
  finesseFwhm,
  finesseLowLoss,
  freeSpectralRange,
  cavityLinewidth,
  cavityPole,
  storageTime,
  fieldDecayTime,
  qualityFactor,
  requiredReflectivity,
  lossBudgetLowLoss,
  lossFromRingdown,
  resonantTransmission,
  buildUp,
} from './cavity';
export type {
  MirrorPairInput,
  LowLossInput,
  TransmissionPairInput,
  CavityLengthInput,
  CavityFinesseInput,
  RequiredReflectivity,
  LossBudget,
  RingdownLoss,
} from './cavity';

export { gaussianMode } from './modes';
export type { GaussianModeInput, GaussianMode } from './modes';

export { totalIntegratedScatter, scatterLimitedFinesse } from './scatter';
export type { ScatterInput } from './scatter';

export { cqed, cqedFromRates, cooperativity } from './cqed';
export type { CqedInput, CqedResult, RatesInput, RatesResult } from './cqed';

export {
  varianceFromDb,
  lossyVariance,
  maxSqueezingDb,
  requiredEfficiency,
  electronicEfficiency,
  escapeEfficiency,
  totalEfficiency,
  opoQuadratures,
  optimumPump,
  sourceSlopes,
  requiredDetectorEfficiency,
} from './squeezing';
export type { Feasible, OpoInput, Quadratures, ElectronicNoiseInput, SqueezingSource, SourceSlopes } from './squeezing';

export { quantumEfficiencyFromResponsivity, responsivityFromQuantumEfficiency, shotNoiseCurrent, darkNoiseClearance } from './detectors';
export type { Clearance } from './detectors';

export {
  bellThresholds,
  deadTimeRate,
  trueRateFromMeasured,
  maxMeasuredRate,
  accidentalRate,
  coincidenceToAccidental,
  heraldingEfficiency,
  combinedJitter,
  erf,
  windowCapture,
  chEberhardJ,
} from './counting';
export type { DeadTimeModel, ChEberhardInput } from './counting';

export { G2_COHERENT, G2_THERMAL, g2Fock, mandelQ, signalFraction, g2WithBackground, g2HeraldedThermal } from './photon-stats';

export { coherenceTime, coherenceLength, linewidthForCoherenceLength, frequencyWidth, schawlowTownes, laserHazardClass } from './lasers';
export type { HazardClass, HazardSuggestion } from './lasers';

export { refractiveIndex, qpmPeriod, idlerWavelength, gratingPeriodAt, fusedSilicaIndex, ktpDatasetInfo } from './crystals';
export type { KtpAxis, KtpDataset, QpmType, DatasetInfo } from './crystals';

export { worstCase } from './tolerances';
export type { Toleranced, Better, WorstCase } from './tolerances';

export { interpolateCurve } from './interpolate';
export type { CurvePoint } from './interpolate';

export { evaluateCavityGoal, mirrorAtWavelength } from './goals/cavity';
export type { MirrorReading } from './goals/cavity';
export { bestPairs } from './goals/best-pairs';
export type { MirrorPair } from './goals/best-pairs';
export { evaluateSqueezingGoal } from './goals/squeezing';
export { evaluateCountingGoal } from './goals/counting';
export { evaluateLaserGoal } from './goals/laser';
export { SINGLE_WAVELENGTH_MATCH_NM } from './goals/spec';
export type * from './goals/types';
