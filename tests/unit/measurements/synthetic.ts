// Synthetic measurement files with a seeded random generator, so every run sees the same noise.

import { gaussian, seededRandom as mulberry32 } from '../../../src/server/db/synthetic';

export { gaussian, mulberry32 };

export interface TraceOptions {
  tauS: number;
  seed: number;
  points?: number;
  /** Trace length in units of τ. */
  spanTaus?: number;
  /** Flat part before the switch-off at t = 0, in units of τ. */
  preTriggerTaus?: number;
  amplitude?: number;
  offset?: number;
  /** Gaussian noise σ as a share of the amplitude. */
  noise?: number;
  timeUnit?: 's' | 'ms' | 'us' | 'ns';
  comments?: string[];
}

const UNIT_S = { s: 1, ms: 1e-3, us: 1e-6, ns: 1e-9 } as const;

/** A ring-down CSV: I(t) = A·exp(−t/τ) + B + noise for t ≥ 0, A + B before. */
export function ringdownCsv(o: TraceOptions): string {
  const n = o.points ?? 2000;
  const span = o.spanTaus ?? 8;
  const pre = o.preTriggerTaus ?? 0;
  const a = o.amplitude ?? 1;
  const b = o.offset ?? 0.02;
  const sigma = (o.noise ?? 0.01) * a;
  const unit = o.timeUnit ?? 'us';
  const normal = gaussian(mulberry32(o.seed));
  const lines = [...(o.comments ?? []), `time_${unit},intensity`];
  for (let i = 0; i < n; i++) {
    const t = (-pre + ((span + pre) * i) / n) * o.tauS;
    const clean = t < 0 ? a + b : a * Math.exp(-t / o.tauS) + b;
    lines.push(`${t / UNIT_S[unit]},${clean + sigma * normal()}`);
  }
  return lines.join('\n') + '\n';
}
