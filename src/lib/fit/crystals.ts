// KTP refractive indices (three Sellmeier sets), thermo-optic correction, quasi-phase-matching
// periods, and fused silica (physics.md A9 forms 9.1–9.4 and A10).
// Sources: K. Kato and E. Takaoka, "Sellmeier and thermo-optic dispersion formulas for KTP", Appl.
// Opt. 41, 5040 (2002); K. Fradkin et al., Appl. Phys. Lett. 74, 914 (1999) (n_z); F. König and
// F. N. C. Wong, Appl. Phys. Lett. 84, 1644 (2004) (n_y); T. Y. Fan et al., Appl. Opt. 26, 2390
// (1987); S. Emanueli and A. Arie, Appl. Opt. 42, 6661 (2003) (thermo-optic coefficients and the
// grating expansion); I. H. Malitson, "Interspecimen comparison of the refractive index of fused
// silica", J. Opt. Soc. Am. 55, 1205–1208 (1965).

import { FitInputError } from './errors';
import { finite, finiteResult, inRange, oneOf, positive } from './validate';

export type KtpAxis = 'x' | 'y' | 'z';
export type KtpDataset = 'kato2002' | 'fradkin-koenig' | 'fan1987';
export type QpmType = 'type-0' | 'type-II';

const DATASETS = ['kato2002', 'fradkin-koenig', 'fan1987'] as const;
const AXES = ['x', 'y', 'z'] as const;

export interface DatasetInfo {
  dataset: KtpDataset;
  citation: string;
  axes: readonly KtpAxis[];
  /** Temperature the Sellmeier coefficients refer to; null when the source does not state one. */
  referenceTemperatureC: number | null;
  /** Whether temperatureC is accepted (Emanueli & Arie thermo-optic terms). */
  temperatureModel: boolean;
  /** Wavelength range of the fit, metres; null when physics.md does not give one. */
  fittedRangeM: readonly [number, number] | null;
  note: string;
}

const INFO: Record<KtpDataset, DatasetInfo> = {
  kato2002: {
    dataset: 'kato2002',
    citation: 'K. Kato and E. Takaoka, Appl. Opt. 41, 5040 (2002)',
    axes: AXES,
    referenceTemperatureC: 20,
    temperatureModel: false,
    fittedRangeM: [0.43e-6, 3.54e-6],
    note: 'Sellmeier at 20 °C; its thermo-optic formula is not included (unconfirmed).',
  },
  'fradkin-koenig': {
    dataset: 'fradkin-koenig',
    citation: 'K. Fradkin et al., APL 74, 914 (1999) (n_z); F. König and F. N. C. Wong, APL 84, 1644 (2004) (n_y)',
    axes: ['y', 'z'],
    referenceTemperatureC: 25,
    temperatureModel: true,
    fittedRangeM: null,
    note: 'Flux-grown KTP for PPKTP at 25 °C, with the Emanueli & Arie (2003) thermo-optic terms.',
  },
  fan1987: {
    dataset: 'fan1987',
    citation: 'T. Y. Fan et al., Appl. Opt. 26, 2390 (1987)',
    axes: AXES,
    referenceTemperatureC: null,
    temperatureModel: false,
    fittedRangeM: null,
    note: 'Fitted on visible and near-IR data; deviates by several per cent for telecom-band periods. The x coefficients are from memory.',
  },
};

/** KTP transparency window (about 0.35–4.5 µm, common datasheet value): outside it no set applies. */
const KTP_MIN_UM = 0.35;
const KTP_MAX_UM = 4.5;

/** Emanueli & Arie 2003 (9.3): n1 coefficients ×1e-6, n2 coefficients ×1e-8, λ in µm. */
const THERMO: Record<'y' | 'z', { n1: readonly number[]; n2: readonly number[] }> = {
  y: { n1: [6.2897, 6.3061, -6.0629, 2.6486], n2: [-0.14445, 2.2244, -3.577, 1.347] },
  z: { n1: [9.9587, 9.9228, -8.9603, 4.101], n2: [-1.1882, 10.459, -9.8136, 3.1481] },
};

/** Emanueli & Arie 2003 (9.4): linear and quadratic thermal expansion of the grating along x. */
const EXPANSION_ALPHA = 6.7e-6;
const EXPANSION_BETA = 11e-9;

export function ktpDatasetInfo(dataset: KtpDataset): DatasetInfo {
  return INFO[oneOf('dataset', dataset, DATASETS)];
}

function fanForm(l2: number, a: number, b: number, c: number, d: number): number {
  return a + b / (1 - c / l2) - d * l2;
}

function sellmeierSquared(dataset: KtpDataset, axis: KtpAxis, um: number): number {
  const l2 = um * um;
  if (dataset === 'kato2002') {
    if (axis === 'x') return 3.291 + 0.0414 / (l2 - 0.03978) + 9.35522 / (l2 - 31.45571);
    if (axis === 'y') return 3.45018 + 0.04341 / (l2 - 0.04597) + 16.98825 / (l2 - 39.43799);
    return 4.59423 + 0.06206 / (l2 - 0.04763) + 110.80672 / (l2 - 86.12171);
  }
  if (dataset === 'fradkin-koenig') {
    if (axis === 'y') return 2.0993 + 0.922683 / (1 - 0.0467695 / l2) - 0.0138408 * l2;
    return 2.12725 + 1.18431 / (1 - 0.0514852 / l2) + 0.6603 / (1 - 100.00507 / l2) - 0.00968956 * l2;
  }
  if (axis === 'x') return fanForm(l2, 2.16747, 0.83733, 0.04611, 0.01713);
  if (axis === 'y') return fanForm(l2, 2.19229, 0.83547, 0.0497, 0.01621);
  return fanForm(l2, 2.25411, 1.06543, 0.05486, 0.0214);
}

function cubic(c: readonly number[], um: number): number {
  return (c[0] ?? 0) + (c[1] ?? 0) / um + (c[2] ?? 0) / (um * um) + (c[3] ?? 0) / (um * um * um);
}

function temperatureOf(dataset: KtpDataset, v: number | undefined): number | null {
  if (v === undefined) return null;
  const info = INFO[dataset];
  const t = finite('temperatureC', v);
  if (info.temperatureModel) {
    // A sanity guard around the usual 20–200 °C oven range, not the range of the thermo-optic fit.
    return inRange('temperatureC', t, -50, 250, 'must be a crystal temperature in °C');
  }
  if (info.referenceTemperatureC !== null && t === info.referenceTemperatureC) return null;
  throw new FitInputError(
    'temperatureC',
    `the ${dataset} set has no temperature model here${info.referenceTemperatureC === null ? '' : `; it holds at ${info.referenceTemperatureC} °C`}`,
  );
}

/** Sellmeier index of KTP along a principal axis (λ in µm inside the formulas), with 9.3 when temperatureC is given. */
export function refractiveIndex(input: {
  material: 'KTP';
  axis: KtpAxis;
  dataset: KtpDataset;
  wavelengthM: number;
  temperatureC?: number;
}): number {
  oneOf('material', input.material, ['KTP'] as const);
  const axis = oneOf('axis', input.axis, AXES);
  const dataset = oneOf('dataset', input.dataset, DATASETS);
  if (!INFO[dataset].axes.includes(axis)) {
    throw new FitInputError('axis', `the ${dataset} set has no ${axis} axis`);
  }
  const um = positive('wavelengthM', input.wavelengthM) * 1e6;
  if (um < KTP_MIN_UM || um > KTP_MAX_UM) {
    throw new FitInputError('wavelengthM', `KTP Sellmeier sets apply only inside the 0.35–4.5 µm transparency window, got ${um} µm`);
  }
  const n = Math.sqrt(sellmeierSquared(dataset, axis, um));
  const t = temperatureOf(dataset, input.temperatureC);
  if (t === null || axis === 'x') return n;
  const dt = t - 25;
  const c = THERMO[axis];
  return n + cubic(c.n1, um) * 1e-6 * dt + cubic(c.n2, um) * 1e-8 * dt * dt;
}

/** Form 9.1: idler wavelength from energy conservation, 1/λ_i = 1/λ_p − 1/λ_s. */
export function idlerWavelength(input: { pumpM: number; signalM: number }): number {
  const p = positive('pumpM', input.pumpM);
  const s = positive('signalM', input.signalM);
  if (!(s > p)) throw new FitInputError('signalM', 'must be longer than the pump wavelength');
  return finiteResult('signalM', 1 / (1 / p - 1 / s), 'idler wavelength');
}

/**
 * Form 9.2, first-order QPM period Λ = 1/|n_p/λ_p − n_s/λ_s − n_i/λ_i| for x-cut PPKTP:
 * type-0 = z → z + z; type-II = y → y (signal) + z (idler). The idler follows from 9.1 when omitted;
 * a given idler must satisfy 9.1 to 1e-6.
 */
export function qpmPeriod(input: {
  pumpM: number;
  signalM: number;
  idlerM?: number;
  type: QpmType;
  dataset: KtpDataset;
  temperatureC?: number;
}): number {
  const type = oneOf('type', input.type, ['type-0', 'type-II'] as const);
  const computedIdler = idlerWavelength(input);
  let idler = computedIdler;
  if (input.idlerM !== undefined) {
    idler = positive('idlerM', input.idlerM);
    if (Math.abs(idler - computedIdler) > 1e-6 * computedIdler) {
      throw new FitInputError('idlerM', `breaks energy conservation: the pump and signal give ${computedIdler} m`);
    }
  }
  const index = (axis: KtpAxis, wavelengthM: number): number =>
    refractiveIndex({
      material: 'KTP',
      axis,
      dataset: input.dataset,
      wavelengthM,
      ...(input.temperatureC === undefined ? {} : { temperatureC: input.temperatureC }),
    });
  const pumpAndSignalAxis: KtpAxis = type === 'type-0' ? 'z' : 'y';
  const dk =
    index(pumpAndSignalAxis, input.pumpM) / input.pumpM -
    index(pumpAndSignalAxis, input.signalM) / input.signalM -
    index('z', idler) / idler;
  if (dk === 0) throw new FitInputError('signalM', 'the process is birefringently phase matched: no grating needed');
  return finiteResult('signalM', 1 / Math.abs(dk), 'QPM period');
}

/** Form 9.4: a grating period written at 25 °C, expanded to temperature T. */
export function gratingPeriodAt(input: { periodAt25CM: number; temperatureC: number }): number {
  const p = positive('periodAt25CM', input.periodAt25CM);
  const dt = inRange('temperatureC', input.temperatureC, -50, 250, 'must be a crystal temperature in °C') - 25;
  return finiteResult('periodAt25CM', p * (1 + EXPANSION_ALPHA * dt + EXPANSION_BETA * dt * dt), 'grating period');
}

/** Malitson 1965 Sellmeier for fused silica, 20 °C; valid 0.21–3.71 µm, confirmed to 6.7 µm (Tan 1998). */
export function fusedSilicaIndex(input: { wavelengthM: number }): number {
  const um = positive('wavelengthM', input.wavelengthM) * 1e6;
  if (um < 0.21 || um > 6.7) {
    throw new FitInputError('wavelengthM', `the Malitson formula holds for 0.21–6.7 µm, got ${um} µm`);
  }
  const l2 = um * um;
  const n2 =
    1 + (0.6961663 * l2) / (l2 - 0.0684043 ** 2) + (0.4079426 * l2) / (l2 - 0.1162414 ** 2) + (0.8974794 * l2) / (l2 - 9.896161 ** 2);
  return Math.sqrt(n2);
}
