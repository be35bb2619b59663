// Photon statistics: g⁽²⁾(0), Mandel Q, uncorrelated background, heralded SPDC photons
// (physics.md A7, forms 7.1–7.4).
// Sources: R. Loudon, "The Quantum Theory of Light", 3rd ed. (2000), ch. 3 and 5; M. Fox, "Quantum
// Optics: An Introduction" (2006), ch. 6; L. Mandel, Opt. Lett. 4, 205 (1979); R. Brouri,
// A. Beveratos, J.-P. Poizat, P. Grangier, "Photon antibunching in the fluorescence of individual
// color centers in diamond", Opt. Lett. 25, 1294 (2000) (background correction). Form 7.4 is
// derived in physics.md (heralded state p_h(n) ∝ n·P(n)), not a published formula.

import { finiteResult, integerAtLeast, nonNegative, unitInterval } from './validate';

/** Form 7.1: g⁽²⁾(0) of a coherent state. */
export const G2_COHERENT = 1;

/** Form 7.1: g⁽²⁾(0) of a single-mode thermal (chaotic) state. */
export const G2_THERMAL = 2;

/** Form 7.1: g⁽²⁾(0) = 1 − 1/n for the Fock state |n⟩, n ≥ 1. */
export function g2Fock(n: number): number {
  const k = integerAtLeast('n', n, 1);
  return 1 - 1 / k;
}

/** Form 7.2: Q = ⟨n⟩·(g⁽²⁾(0) − 1). */
export function mandelQ(input: { meanN: number; g2: number }): number {
  const meanN = nonNegative('meanN', input.meanN);
  const g2 = nonNegative('g2', input.g2);
  return finiteResult('meanN', meanN * (g2 - 1), 'Mandel Q');
}

/** ρ = S/(S + B) from signal and background (dark counts included) rates. */
export function signalFraction(input: { signalRate: number; backgroundRate: number }): number {
  const s = nonNegative('signalRate', input.signalRate);
  const b = nonNegative('backgroundRate', input.backgroundRate);
  return s === 0 ? 0 : 1 / (1 + b / s);
}

/** Form 7.3: g⁽²⁾_meas = 1 + ρ²·(g⁽²⁾_S − 1), the same ρ on both HBT detectors. */
export function g2WithBackground(input: { g2Source: number; signalFraction: number }): number {
  const g2 = nonNegative('g2Source', input.g2Source);
  const rho = unitInterval('signalFraction', input.signalFraction);
  return finiteResult('g2Source', 1 + rho * rho * (g2 - 1), 'g2');
}

/** Form 7.4: heralded single-mode SPDC photon, g⁽²⁾_h(0) = (6µ² + 4µ)/(2µ + 1)² (≈ 4µ for small µ). */
export function g2HeraldedThermal(input: { meanPairs: number }): number {
  const mu = nonNegative('meanPairs', input.meanPairs);
  const d = 2 * mu + 1;
  return finiteResult('meanPairs', ((6 * mu + 4) / d) * (mu / d), 'g2');
}
