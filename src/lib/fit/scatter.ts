// Scatter loss from surface roughness: total integrated scatter (physics.md A3, forms 3.1–3.4).
// Sources: H. Davies, "The reflection of electromagnetic waves from a rough surface", Proc. IEE 101,
// 209 (1954) (exact exponential form); H. E. Bennett and J. O. Porteus, "Relation between surface
// roughness and specular reflectance at normal incidence", J. Opt. Soc. Am. 51, 123 (1961)
// (smooth-surface form).

import { FitInputError } from './errors';
import { finiteResult, nonNegative, positive } from './validate';

export interface ScatterInput {
  /** rms surface height over the band that scatters into the hemisphere (periods ≈ λ to beam size). */
  roughnessM: number;
  /** Vacuum wavelength, reflection in air. */
  wavelengthM: number;
  /** Angle of incidence; 0 when omitted. */
  aoiRad?: number;
  /** true: form 3.2, 1 − exp(−x²); false (default): form 3.3, x². */
  exact?: boolean;
}

/** Fraction of the reflected power scattered out of the specular beam, x = 4π·σ·cosθ/λ. */
export function totalIntegratedScatter(input: ScatterInput): number {
  const sigma = nonNegative('roughnessM', input.roughnessM);
  const lambda = positive('wavelengthM', input.wavelengthM);
  const aoi = input.aoiRad === undefined ? 0 : nonNegative('aoiRad', input.aoiRad);
  if (aoi >= Math.PI / 2) throw new FitInputError('aoiRad', `must be below π/2 (grazing), got ${aoi}`);
  const x = finiteResult('roughnessM', (4 * Math.PI * sigma * Math.cos(aoi)) / lambda, 'phase roughness');
  const x2 = finiteResult('roughnessM', x * x, 'total integrated scatter');
  return input.exact === true ? -Math.expm1(-x2) : x2;
}

/** Form 3.4, the finesse cap π/S set by per-mirror scatter S alone on two equal mirrors. */
export function scatterLimitedFinesse(input: { scatterLoss: number }): number {
  const s = positive('scatterLoss', input.scatterLoss);
  if (s >= 1) throw new FitInputError('scatterLoss', `must be a power fraction below 1, got ${s}`);
  return finiteResult('scatterLoss', Math.PI / s, 'finesse');
}
