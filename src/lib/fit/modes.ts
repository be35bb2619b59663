// Two-mirror resonator stability and its Gaussian TEM00 mode (physics.md A2, forms 2.1–2.7).
// Sources: H. Kogelnik and T. Li, "Laser Beams and Resonators", Appl. Opt. 5, 1550–1567 (1966),
// resonator section; A. E. Siegman, "Lasers" (1986), ch. 19.

import { SPEED_OF_LIGHT } from './constants';
import { FitInputError } from './errors';
import { finiteResult, positive } from './validate';

export interface GaussianModeInput {
  lengthM: number;
  /** Radius of curvature, positive for a mirror concave toward the cavity; Infinity for a flat mirror. */
  roc1M: number;
  roc2M: number;
  wavelengthM: number;
}

export interface GaussianMode {
  /** A finite Gaussian mode exists (strictly inside 0 < g1·g2 < 1, or symmetric confocal). */
  stable: boolean;
  /** On the stability edge (g1·g2 = 0 or 1, confocal included). */
  marginal: boolean;
  g1: number;
  g2: number;
  g1g2: number;
  reason: string | null;
  /** 1/e² intensity radius on mirror 1 (2.3); null without a finite mode. */
  w1M: number | null;
  w2M: number | null;
  w0M: number | null;
  waistFromMirror1M: number | null;
  rayleighRangeM: number | null;
  /** One-way Gouy phase ψ (2.5). */
  gouyPhaseRad: number | null;
  /** Δν_T = FSR·ψ/π (2.7). */
  transverseModeSpacingHz: number | null;
  /** What a scan shows: min(Δν_T, FSR − Δν_T). */
  transverseModeOffsetHz: number | null;
  fsrHz: number;
}

/*
 * Results are written as full object literals: in V8 an object spread followed by further
 * properties takes a slow path that costs microseconds per call, and search evaluates this for
 * every candidate pair.
 */

/**
 * Distance from the stability edges below which the geometry is reported as marginal: the spot
 * sizes diverge there (2.2), so a number would mislead rather than inform.
 */
const EDGE = 1e-9;

function radius(field: string, v: unknown): number {
  if (v === Infinity || v === -Infinity) return Infinity;
  if (typeof v !== 'number' || Number.isNaN(v) || v === 0) {
    throw new FitInputError(field, `must be a non-zero radius of curvature in metres or Infinity (flat), got ${String(v)}`);
  }
  return v;
}

function noMode(g1: number, g2: number, g1g2: number, fsrHz: number, marginal: boolean, reason: string): GaussianMode {
  return {
    g1,
    g2,
    g1g2,
    fsrHz,
    stable: false,
    marginal,
    reason,
    w1M: null,
    w2M: null,
    w0M: null,
    waistFromMirror1M: null,
    rayleighRangeM: null,
    gouyPhaseRad: null,
    transverseModeSpacingHz: null,
    transverseModeOffsetHz: null,
  };
}

/** Forms 2.1–2.7 for a two-mirror cavity in vacuum. */
export function gaussianMode(input: GaussianModeInput): GaussianMode {
  const L = positive('lengthM', input.lengthM);
  const lambda = positive('wavelengthM', input.wavelengthM);
  const r1 = radius('roc1M', input.roc1M);
  const r2 = radius('roc2M', input.roc2M);
  const g1 = finiteResult('lengthM', 1 - L / r1, 'g1');
  const g2 = finiteResult('lengthM', 1 - L / r2, 'g2');
  const g1g2 = finiteResult('lengthM', g1 * g2, 'g1·g2');
  const fsrHz = finiteResult('lengthM', SPEED_OF_LIGHT / (2 * L), 'free spectral range');
  const scale = (lambda * L) / Math.PI;

  if (Math.abs(g1) < EDGE && Math.abs(g2) < EDGE) {
    // Symmetric confocal (2.4): marginal but with a finite mode, w0 = √(λL/2π), ψ = π/2.
    const w0M = finiteResult('lengthM', Math.sqrt(scale / 2), 'waist');
    return {
      g1,
      g2,
      g1g2,
      fsrHz,
      stable: true,
      marginal: true,
      reason: 'symmetric confocal: on the stability edge; the mode is finite but sensitive to length',
      w1M: finiteResult('lengthM', Math.sqrt(scale), 'spot radius'),
      w2M: finiteResult('lengthM', Math.sqrt(scale), 'spot radius'),
      w0M,
      waistFromMirror1M: L / 2,
      rayleighRangeM: L / 2,
      gouyPhaseRad: Math.PI / 2,
      transverseModeSpacingHz: fsrHz / 2,
      transverseModeOffsetHz: fsrHz / 2,
    };
  }
  if (g1g2 < -EDGE || g1g2 > 1 + EDGE) {
    return noMode(g1, g2, g1g2, fsrHz, false, `unstable: g1·g2 = ${g1g2.toFixed(2)} is outside 0…1`);
  }
  if (Math.abs(g1g2) <= EDGE || Math.abs(1 - g1g2) <= EDGE) {
    return noMode(g1, g2, g1g2, fsrHz, true, `marginal: g1·g2 = ${g1g2.toFixed(2)} is on the stability edge; the spot size diverges`);
  }

  const denom = g1 + g2 - 2 * g1g2;
  const w1sq = scale * Math.sqrt(g2 / (g1 * (1 - g1g2)));
  const w2sq = scale * Math.sqrt(g1 / (g2 * (1 - g1g2)));
  const w0sq = scale * Math.sqrt((g1g2 * (1 - g1g2)) / (denom * denom));
  const psi = Math.acos((g1 > 0 ? 1 : -1) * Math.sqrt(g1g2));
  const spacing = (fsrHz * psi) / Math.PI;
  return {
    g1,
    g2,
    g1g2,
    fsrHz,
    stable: true,
    marginal: false,
    reason: null,
    w1M: finiteResult('lengthM', Math.sqrt(w1sq), 'spot radius on mirror 1'),
    w2M: finiteResult('lengthM', Math.sqrt(w2sq), 'spot radius on mirror 2'),
    w0M: finiteResult('lengthM', Math.sqrt(w0sq), 'waist'),
    waistFromMirror1M: finiteResult('lengthM', (L * g2 * (1 - g1)) / denom, 'waist position'),
    rayleighRangeM: finiteResult('lengthM', (Math.PI * w0sq) / lambda, 'Rayleigh range'),
    gouyPhaseRad: psi,
    transverseModeSpacingHz: spacing,
    transverseModeOffsetHz: Math.min(spacing, fsrHz - spacing),
  };
}
