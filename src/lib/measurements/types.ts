// What a parsed measurement file holds: points in base units named in the field, and for a
// ring-down trace its fit. Points are sorted by increasing wavelength (spectra and curves) or time.

import type { CsvError } from './csv';

export interface TransmissionPoint {
  wavelengthNm: number;
  transmissionPpm: number;
}

export interface TransmissionLossPoint extends TransmissionPoint {
  /** Absorption + scatter. */
  lossPpm: number;
}

export interface ReflectancePoint {
  wavelengthNm: number;
  reflectancePpm: number;
}

interface Notes {
  /** Plain-words remarks for the seller and the listing page (columns ignored, quantities derived). */
  notes: string[];
}

/**
 * transmission: T only. transmission-loss: T and loss, given or derived from R (loss = 1 − R − T,
 * or T = 1 − R − loss). reflectance: R only, kept as measured: without T it cannot be split into
 * transmission and loss, so the fit engine cannot use it.
 */
export type SpectrumData = Notes &
  (
    | { kind: 'spectrum'; quantity: 'transmission'; points: TransmissionPoint[] }
    | { kind: 'spectrum'; quantity: 'transmission-loss'; derivedFromReflectance: boolean; points: TransmissionLossPoint[] }
    | { kind: 'spectrum'; quantity: 'reflectance'; points: ReflectancePoint[] }
  );

export interface TracePoint {
  timeS: number;
  intensity: number;
}

/** Least-squares fit of I(t) = A·exp(−(t − t0)/τ) + B from t0 = fitStartS on. */
export interface RingdownFit {
  tauS: number;
  /** Standard (1σ) uncertainty of τ from the covariance s²·(JᵀJ)⁻¹; quote ±2σ (k = 2, about 95 %). */
  tauUncertaintyS: number;
  /** A, at the fit start t0, in the file's intensity unit. */
  amplitude: number;
  /** B, in the file's intensity unit. */
  offset: number;
  residualRms: number;
  pointsFitted: number;
  fitStartS: number;
  /** The fitted curve sampled for plotting over the fitted time span. */
  curve: TracePoint[];
}

export interface Estimate {
  value: number;
  /** Standard (1σ) uncertainty, propagated from τ. */
  uncertainty: number;
}

/** physics.md A1 form 1.10 for the stated cavity length: power fractions, symmetric mirrors. */
export interface RingdownFigures {
  lengthM: number;
  groupIndex: number;
  roundTripLoss: Estimate;
  perMirrorLoss: Estimate;
  finesse: Estimate;
}

export interface RingdownData extends Notes {
  kind: 'ringdown';
  points: TracePoint[];
  /** From the `# length_m=…` comment; null when the file does not say. */
  lengthM: number | null;
  /** From a `# wavelength_nm=…` comment; null when the file does not say. */
  wavelengthNm: number | null;
  /** From a `# group_index=…` comment; null means vacuum (1). */
  groupIndex: number | null;
  fit: RingdownFit;
  /** Loss and finesse when the file gives the cavity length. */
  figures: RingdownFigures | null;
}

export interface EfficiencyPoint {
  wavelengthNm: number;
  /** Quantum or detection efficiency, a fraction in (0, 1]. */
  efficiency: number;
}

export interface EfficiencyCurveData extends Notes {
  kind: 'efficiency-curve';
  points: EfficiencyPoint[];
}

export type MeasurementData = SpectrumData | RingdownData | EfficiencyCurveData;

export type MeasurementResult = { ok: true; data: MeasurementData } | { ok: false; error: CsvError };

export interface ParseOptions {
  /** Files with more lines are refused (default 200 000). */
  maxLines?: number;
}
