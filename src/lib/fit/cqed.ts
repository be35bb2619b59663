// Cavity QED: single-atom coupling g0, cavity and atomic half-width decay rates, cooperativity,
// critical numbers (physics.md A4, forms 4.1–4.8). All rates here are returned as cyclic Hz
// (angular rate / 2π) in the half-width convention: κ = HWHM of the cavity line, γ = γ⊥ = Γ/2.
// Sources: H. J. Kimble, "Strong interactions of single atoms and photons in cavity QED", Phys.
// Scr. T76, 127 (1998) (n0, N0, C1 = g0²/(2κγ⊥)); H. Tanji-Suzuki, I. D. Leroux, M. H.
// Schleier-Smith, M. Cetina, A. T. Grier, J. Simon, V. Vuletić, "Interaction between atomic
// ensembles and optical resonators: classical description", Adv. At. Mol. Opt. Phys. 60, 201
// (2011) (η = 24ℱ/(πk²w0²) = 2·C1, re-derived in physics.md).

import { SPEED_OF_LIGHT } from './constants';
import { finiteResult, positive } from './validate';

export interface CqedInput {
  wavelengthM: number;
  /** Natural linewidth Γ/2π of the transition (population decay, FWHM), Hz. */
  gammaHz: number;
  lengthM: number;
  waistM: number;
  finesse: number;
}

export interface CqedResult {
  /** g0/2π for an atom at an antinode on the axis at the waist (4.3). */
  g0Hz: number;
  /** κ/2π, cavity field decay rate (HWHM) = c/(4Lℱ). */
  kappaHz: number;
  /** γ⊥/2π = Γ/4π. */
  gammaHz: number;
  /** Half-width cooperativity C1 = g0²/(2κγ) (4.4). */
  c1: number;
  /** Ensemble-convention cooperativity η = 2·C1 (4.5). */
  eta: number;
  n0: number;
  N0: number;
  /** Cavity β-factor η/(1 + η) (4.7). */
  beta: number;
  /** g0 > κ and g0 > γ (4.8). */
  strongCoupling: boolean;
}

export interface RatesInput {
  g0Hz: number;
  kappaHz: number;
  /** γ⊥/2π (half-width). */
  gammaHz: number;
}

export interface RatesResult {
  c1: number;
  n0: number;
  N0: number;
  /** g0/max(κ, γ). */
  couplingRatio: number;
  strongCoupling: boolean;
}

/** Forms 4.4, 4.6 and 4.8 from given half-width rates (any common unit). */
export function cqedFromRates(input: RatesInput): RatesResult {
  const g0 = positive('g0Hz', input.g0Hz);
  const kappa = positive('kappaHz', input.kappaHz);
  const gamma = positive('gammaHz', input.gammaHz);
  const c1 = finiteResult('g0Hz', ((g0 / kappa) * (g0 / gamma)) / 2, 'cooperativity');
  return {
    c1,
    n0: finiteResult('g0Hz', ((gamma / g0) * (gamma / g0)) / 2, 'critical photon number'),
    N0: finiteResult('g0Hz', 1 / c1, 'critical atom number'),
    couplingRatio: finiteResult('g0Hz', g0 / Math.max(kappa, gamma), 'coupling ratio'),
    strongCoupling: g0 > kappa && g0 > gamma,
  };
}

/** Form 4.4/4.5 from geometry alone: C1 = 12ℱ/(πk²w0²), η = 2·C1. */
export function cooperativity(input: { finesse: number; wavelengthM: number; waistM: number }): { c1: number; eta: number } {
  const f = positive('finesse', input.finesse);
  const lambda = positive('wavelengthM', input.wavelengthM);
  const w0 = positive('waistM', input.waistM);
  const kw = finiteResult('waistM', ((2 * Math.PI) / lambda) * w0, 'k·w0');
  const c1 = finiteResult('finesse', (12 * f) / (Math.PI * kw * kw), 'cooperativity');
  // η = 2·C1 can still leave the doubles when C1 is within a factor 2 of the largest one
  return { c1, eta: finiteResult('finesse', 2 * c1, 'cooperativity') };
}

/** Forms 4.3–4.8 for a standing-wave cavity in vacuum and a two-level cycling transition. */
export function cqed(input: CqedInput): CqedResult {
  const lambda = positive('wavelengthM', input.wavelengthM);
  const naturalHz = positive('gammaHz', input.gammaHz);
  const L = positive('lengthM', input.lengthM);
  const w0 = positive('waistM', input.waistM);
  const f = positive('finesse', input.finesse);
  const bigGamma = 2 * Math.PI * naturalHz;
  // 4.3: g0 = √(3·c·λ²·Γ/(2π²·w0²·L)), rad/s.
  const g0 = Math.sqrt((3 * SPEED_OF_LIGHT * (lambda / w0) * (lambda / w0) * bigGamma) / (2 * Math.PI * Math.PI * L));
  const g0Hz = finiteResult('waistM', g0 / (2 * Math.PI), 'g0');
  const kappaHz = finiteResult('lengthM', SPEED_OF_LIGHT / (4 * L * f), 'κ');
  const gammaHz = naturalHz / 2;
  const rates = cqedFromRates({ g0Hz, kappaHz, gammaHz });
  const eta = finiteResult('finesse', 2 * rates.c1, 'cooperativity');
  return {
    g0Hz,
    kappaHz,
    gammaHz,
    c1: rates.c1,
    eta,
    n0: rates.n0,
    N0: rates.N0,
    beta: eta / (1 + eta),
    strongCoupling: rates.strongCoupling,
  };
}
