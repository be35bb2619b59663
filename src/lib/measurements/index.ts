// Measurement files of a listing: CSV parsing with line/column errors, the ring-down fit, and the
// mapping of measured data onto the fit engine's inputs.

export { parseMeasurementCsv, DEFAULT_MAX_LINES } from './parse';
export type {
  MeasurementData,
  MeasurementResult,
  ParseOptions,
  SpectrumData,
  RingdownData,
  EfficiencyCurveData,
  TransmissionPoint,
  TransmissionLossPoint,
  ReflectancePoint,
  TracePoint,
  EfficiencyPoint,
  RingdownFit,
  RingdownFigures,
  Estimate,
} from './types';
export type { CsvError } from './csv';
export { fitRingdown, ringdownFigures, RingdownFitError, MIN_RINGDOWN_POINTS } from './ringdown-fit';
export { MIN_CURVE_POINTS } from './curve';
export { toMirrorSpectrum, toRingdownMeasurement, toQeCurve, toEfficiencyCurve, interpolateAt, curveOf } from './fit-inputs';
export { forStorage, STORED_POINTS_MAX } from './thin';
