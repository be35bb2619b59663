// Photodiode conversions: quantum efficiency from responsivity, shot noise, dark-noise clearance
// (physics.md A12, forms 12.1–12.3; the electronic efficiency is the same as A5 form 5.5c).
// Sources: CODATA 2018 exact constants (e, h, c); J. Appel et al., "Electronic noise in optical
// homodyne tomography", Phys. Rev. A 75, 035802 (2007).

import { ELEMENTARY_CHARGE, PLANCK, SPEED_OF_LIGHT } from './constants';
import { finiteResult, nonNegative, positive } from './validate';

export interface Clearance {
  /** s = 2·e·I/i_n², shot-noise power over electronic-noise power. */
  ratio: number;
  /** 10·log10(1 + s), as seen on the analyser. */
  clearanceDb: number;
  /** η_el = s/(1 + s). */
  efficiency: number;
}

/** Form 12.1: η_QE = ℜ·h·c/(e·λ). */
export function quantumEfficiencyFromResponsivity(input: { responsivityAW: number; wavelengthM: number }): number {
  const r = nonNegative('responsivityAW', input.responsivityAW);
  const lambda = positive('wavelengthM', input.wavelengthM);
  return finiteResult('wavelengthM', (r * PLANCK * SPEED_OF_LIGHT) / (ELEMENTARY_CHARGE * lambda), 'quantum efficiency');
}

/** Form 12.1 inverted: ℜ = η_QE·e·λ/(h·c), A/W. */
export function responsivityFromQuantumEfficiency(input: { quantumEfficiency: number; wavelengthM: number }): number {
  const qe = nonNegative('quantumEfficiency', input.quantumEfficiency);
  const lambda = positive('wavelengthM', input.wavelengthM);
  return finiteResult('wavelengthM', (qe * ELEMENTARY_CHARGE * lambda) / (PLANCK * SPEED_OF_LIGHT), 'responsivity');
}

/** Form 12.2: i_shot = √(2·e·I), A/√Hz (I = total photocurrent of a balanced pair). */
export function shotNoiseCurrent(input: { photocurrentA: number }): number {
  const i = nonNegative('photocurrentA', input.photocurrentA);
  return Math.sqrt(2 * ELEMENTARY_CHARGE * i);
}

/** Form 12.3: s = 2·e·I/i_n², C_dB = 10·log10(1 + s), η_el = s/(1 + s). */
export function darkNoiseClearance(input: { photocurrentA: number; noiseCurrentAPerRtHz: number }): Clearance {
  const i = positive('photocurrentA', input.photocurrentA);
  const n = positive('noiseCurrentAPerRtHz', input.noiseCurrentAPerRtHz);
  const ratio = finiteResult('noiseCurrentAPerRtHz', (2 * ELEMENTARY_CHARGE * i) / n / n, 'shot-to-dark ratio');
  return { ratio, clearanceDb: 10 * Math.log10(1 + ratio), efficiency: ratio / (1 + ratio) };
}
