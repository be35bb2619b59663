// Input and result shapes of the goal evaluators. Listing specs use the stored form: base units
// named in the field (Mm, Nm, Ppm, Hz, W, S), toleranced numbers as { value, tol? } with tol a ± in
// the same unit. Goals use SI except where a field name says otherwise.

export interface TolerancedSpec {
  value: number;
  /** ± in the same unit. */
  tol?: number;
}

export type Verdict = 'fits' | 'marginal' | 'does-not-fit';

/** What every evaluator returns; the evaluators add their own details. */
export interface GoalResult {
  /** verdict === 'fits'. */
  pass: boolean;
  /** fits: the worst case meets the goal; marginal: only the nominal does; does-not-fit otherwise. */
  verdict: Verdict;
  /** The figure the buyer asked for at nominal specs; null when it cannot be computed. */
  figure: number | null;
  /** The same figure with every toleranced input at its pessimistic end. */
  worst: number | null;
  /** The goal in the figure's unit. */
  goal: number | null;
  /** worst/goal − 1 (more is better), goal/worst − 1 (less is better), worst − goal in dB (squeezing); null when a blocking reason applies. */
  headroom: number | null;
  unit: string;
  /** Plain-words reasons the listing misses the goal (or only marginally meets it). */
  reasons: string[];
  /** Validity remarks and cautions that do not change the verdict. */
  notes: string[];
  formula: string;
  source: string;
}

// ---- cavity ----

export interface MirrorSpectrumPoint {
  wavelengthNm: number;
  transmissionPpm: number;
  lossPpm?: number;
}

export interface MirrorSpectrum {
  points: MirrorSpectrumPoint[];
}

/** A seller's ring-down of a symmetric pair of these mirrors: intensity decay time τ at one wavelength. */
export interface RingdownMeasurement {
  wavelengthNm: number;
  lengthM: number;
  tauS: number;
}

export interface MirrorSpec {
  diameterMm: number;
  substrate: string;
  /** Radius of curvature, concave toward the cavity positive; null for a flat mirror. */
  rocMm: number | null;
  designWavelengthNm: number;
  bandMinNm: number;
  bandMaxNm: number;
  transmissionPpm: TolerancedSpec;
  /** Absorption + scatter. */
  lossPpm: TolerancedSpec;
  aoiDeg: number;
  roughnessNm?: number;
  spectrum?: MirrorSpectrum;
  ringdown?: RingdownMeasurement;
}

export type CavityTarget = { kind: 'finesse'; value: number } | { kind: 'linewidth'; hz: number } | { kind: 'storage-time'; s: number };

export type CavityConfiguration = 'pair' | 'with-own-mirror' | 'two-listings';

/** The buyer's own mirror (mirror 1 in with-own-mirror): R, or T + loss in ppm. */
export type OwnMirror = { reflectivity: number; rocMm: number | null } | { transmissionPpm: number; lossPpm: number; rocMm: number | null };

export interface AtomLine {
  wavelengthNm: number;
  /** Natural linewidth Γ/2π (FWHM of the transition), Hz. */
  gammaHz: number;
}

export interface CavityGoal {
  wavelengthNm: number;
  lengthM: number;
  target: CavityTarget;
  configuration: CavityConfiguration;
  ownMirror?: OwnMirror;
  /** Extra round-trip loss inside the cavity (crystal, AR surfaces), ppm. */
  extraLossPpm?: number;
  atom?: AtomLine;
}

export type MirrorDataSource = 'ring-down' | 'spectrum' | 'spec' | 'own';

/** One mirror's transmission and loss at the buyer's wavelength, ppm, with where they came from. */
export interface MirrorAtWavelength {
  source: MirrorDataSource;
  transmissionPpm: number;
  lossPpm: number;
  /** T + loss at nominal, and at the pessimistic and optimistic ends of the tolerances. */
  totalPpm: number;
  totalWorstPpm: number;
  totalBestPpm: number;
  /** Radius of curvature, m; null for a flat mirror. */
  rocM: number | null;
}

export interface CavityGoalResult extends GoalResult {
  target: CavityTarget['kind'];
  /** best is null when the optimistic ends of the tolerances reach zero loss (finesse unbounded). */
  finesse: { nominal: number; worst: number; best: number | null } | null;
  goalFinesse: number;
  linewidthHz: { nominal: number; worst: number } | null;
  storageTimeS: { nominal: number; worst: number } | null;
  fsrHz: number;
  stable: boolean;
  /** g-parameters (2.1); null when a mirror has no values at the wavelength. */
  g1: number | null;
  g2: number | null;
  g1g2: number | null;
  /** TEM00 waist radius (1/e²), m; null without a finite mode. */
  waistM: number | null;
  waistFromMirror1M: number | null;
  spotOnMirror1M: number | null;
  spotOnMirror2M: number | null;
  mirrors: [MirrorAtWavelength | null, MirrorAtWavelength | null];
  /** With an atom line: g0, κ, γ (cyclic Hz, half-widths), C1 = g0²/(2κγ) and η = 2·C1 at the waist. */
  cooperativity: {
    g0Hz: number;
    kappaHz: number;
    gammaHz: number;
    c1: number;
    eta: number;
    strongCoupling: boolean;
  } | null;
}

// ---- squeezing ----

export interface PhotodiodeSpec {
  material: string;
  activeDiameterMm?: number;
  /** Quantum efficiency (fraction) at wavelengthNm. */
  quantumEfficiency?: TolerancedSpec;
  /** The wavelength quantumEfficiency or responsivityAW refers to. */
  wavelengthNm?: number;
  responsivityAW?: TolerancedSpec;
  qeCurve?: { wavelengthNm: number; qe: number }[];
  bandwidthHz: number;
  darkCurrentA?: number;
  capacitanceF?: number;
  saturationPowerW?: number;
  /** Input-referred electronic noise current density, A/√Hz. */
  noiseCurrentAPerRtHz?: TolerancedSpec;
  nepWPerRtHz?: number;
  cmrrDb?: number;
}

export type SqueezingSourceSpec =
  | { kind: 'initial'; initialDb: number; antiSqueezingDb?: number }
  | {
      kind: 'opo';
      /** x = √(P_pump/P_threshold). */
      pumpParameter: number;
      /** OPO cavity linewidth, FWHM, Hz. */
      linewidthHz: number;
    };

export interface SqueezingGoal {
  wavelengthNm: number;
  /** Measured squeezing wanted, dB below shot noise. */
  targetDb: number;
  sidebandHz: number;
  source: SqueezingSourceSpec;
  escapeEfficiency: number;
  propagationEfficiency: number;
  /** Fringe visibility between local oscillator and signal (enters squared). */
  visibility: number;
  /** Local-oscillator power on the detector (both diodes together for a balanced detector), W. */
  loPowerW: number;
  /** Fixed quadrature-angle offset, rad. */
  phaseNoiseRad?: number;
}

export interface SqueezingGoalResult extends GoalResult {
  /** The quantum efficiency this detector would need (12.4) with its own electronic efficiency (worst case). */
  requiredQE: number | null;
  /** The quantum efficiency any detector needs with noiseless electronics: the search headline. */
  requiredQEIdealElectronics: number | null;
  quantumEfficiency: { nominal: number; worst: number } | null;
  electronicEfficiency: { nominal: number; worst: number } | null;
  clearanceDb: { nominal: number; worst: number } | null;
  totalEfficiency: { nominal: number; worst: number } | null;
  antiSqueezedDb: number | null;
  qeSource: 'curve' | 'spec' | 'responsivity' | null;
}

// ---- photon counting ----

export interface SinglePhotonDetectorSpec {
  technology: string;
  /** System detection efficiency (fraction) at wavelengthNm. */
  efficiency?: TolerancedSpec;
  wavelengthNm?: number;
  efficiencyCurve?: { wavelengthNm: number; efficiency: number }[];
  darkCountRateHz: TolerancedSpec;
  jitterFwhmS: number;
  deadTimeS: number;
  /** Afterpulsing probability per detection. */
  afterpulsing?: number;
  /** e.g. 'closed-cycle cryostat 2.5 K', 'TEC'. */
  cooling?: string;
}

export type CountingTarget = { kind: 'heralding'; efficiency: number } | { kind: 'bell'; test: 'chsh' | 'eberhard' };

export interface CountingGoal {
  wavelengthNm: number;
  target: CountingTarget;
  /** The buyer's optical efficiency from the source to the detector, per arm. */
  opticalEfficiency: number;
  /** Photon rate arriving at each detector (after the buyer's optics), /s. */
  countRateHz?: number;
  /** Full width of the coincidence window, s. */
  coincidenceWindowS?: number;
  /** Minimum coincidence-to-accidental ratio, (C − A)/A; needs countRateHz and coincidenceWindowS. */
  carMin?: number;
  /** Largest acceptable share of detections lost to dead time (default 0.1). */
  maxDeadTimeLoss?: number;
}

export interface Constraint {
  name: string;
  figure: number;
  worst: number;
  goal: number;
  unit: string;
  better: 'higher' | 'lower';
  headroom: number;
  verdict: Verdict;
  formula: string;
}

export interface CountingGoalResult extends GoalResult {
  constraints: Constraint[];
  detectionEfficiency: { nominal: number; worst: number } | null;
  windowCapture: number | null;
}

// ---- lasers ----

export interface LaserSpec {
  type: string;
  centreWavelengthNm: number;
  tuningMinNm?: number;
  tuningMaxNm?: number;
  /** FWHM linewidth, Hz. */
  linewidthHz: TolerancedSpec;
  /** Observation time the linewidth refers to, s. */
  linewidthTimeS?: number;
  powerW: TolerancedSpec;
  singleFrequency: boolean;
  fibreOutput: boolean;
  m2?: number;
}

export type LaserWavelengthGoal = { kind: 'fixed'; nm: number; toleranceNm?: number } | { kind: 'range'; minNm: number; maxNm: number };

export type LaserCoherenceGoal = { kind: 'linewidth'; maxHz: number } | { kind: 'coherence-length'; minM: number };

export interface LaserGoal {
  wavelength: LaserWavelengthGoal;
  coherence?: LaserCoherenceGoal;
  minPowerW?: number;
}

export interface LaserGoalResult extends GoalResult {
  constraints: Constraint[];
  coherenceLengthM: { nominal: number; worst: number };
  hazard: { hazardClass: string; atMostClass: string | null; needsAelTables: boolean; caution: string };
}
