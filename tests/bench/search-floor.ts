/**
 * The floor of the search benchmark: the same work as the search (filter, facet counts, the goal's
 * figure, worst case, verdict and headroom for every candidate, ranking, one page) done by bare loops
 * over plain arrays with the physics written inline — no index, no objects per listing, no checks.
 * Physics as in the fit engine: form 1.3 ℱ = π·ρ^¼/(1 − √ρ), ρ = R1·R2·(1 − L_rt) (Hecht, Optics 5th
 * ed. (2017) §9.6); stability 0 < g1·g2 < 1 with g = 1 − L/R (Kogelnik & Li, Appl. Opt. 5, 1550
 * (1966)); ring-down 1 − R = L/(c·τ) (form 1.10); squeezing V− = 1 − η·k with η_el = s/(1 + s),
 * s = 2e·η_QE·(eλ/hc)·P_LO/i_n² (physics.md 5.1, 12.2–12.3; Appel et al., PRA 75, 035802 (2007)).
 */
import type { MirrorSpec, PhotodiodeSpec } from '../../src/lib/fit';
import { ELEMENTARY_CHARGE, PLANCK, SPEED_OF_LIGHT } from '../../src/lib/fit';
import type { SearchDoc } from '../../src/server/search/documents';
import { facetMasks } from '../../src/server/search/facets';

const FACETS = 6;
const VALUES = 8;

/** Facet counting with no filter: every candidate counts every value it has. */
function countFacets(counts: Int32Array, masks: Int32Array, i: number): void {
  for (let f = 0; f < FACETS; f++) {
    let m = masks[i * FACETS + f]!;
    while (m !== 0) {
      const low = m & -m;
      counts[f * VALUES + 31 - Math.clz32(low)]!++;
      m ^= low;
    }
  }
}

/**
 * Indices of the best `k` by (rank desc, headroom desc, price asc): those with a headroom sorted, the
 * others (NaN headroom: nothing at the wavelength) by price only when the page reaches them.
 */
function topK(n: number, rank: Int8Array, headroom: Float64Array, price: Float64Array, k: number): number[] {
  const scored: number[] = [];
  const rest: number[] = [];
  for (let i = 0; i < n; i++) (Number.isNaN(headroom[i]!) ? rest : scored).push(i);
  scored.sort((a, b) => rank[b]! - rank[a]! || headroom[b]! - headroom[a]! || price[a]! - price[b]!);
  if (scored.length >= k) return scored.slice(0, k);
  rest.sort((a, b) => price[a]! - price[b]!);
  return [...scored, ...rest.slice(0, k - scored.length)];
}

export interface MirrorArrays {
  n: number;
  ids: string[];
  quantity: Int32Array;
  bandLo: Float64Array;
  bandHi: Float64Array;
  /** Spec T + loss at nominal and at +tol, ppm. */
  total: Float64Array;
  totalWorst: Float64Array;
  tNominal: Float64Array;
  aSpec: Float64Array;
  aSpecHigh: Float64Array;
  /** Radius in m; NaN for flat. */
  roc: Float64Array;
  oblique: Uint8Array;
  price: Float64Array;
  masks: Int32Array;
  spectrum: ({ x: Float64Array; t: Float64Array; a: Float64Array | null } | null)[];
  ringdownNm: Float64Array;
  ringdownPpm: Float64Array;
}

export function mirrorArrays(docs: readonly SearchDoc[]): MirrorArrays {
  const ms = docs.filter((d) => d.candidate.kind === 'mirror');
  const n = ms.length;
  const A: MirrorArrays = {
    n,
    ids: ms.map((d) => d.id),
    quantity: new Int32Array(n),
    bandLo: new Float64Array(n),
    bandHi: new Float64Array(n),
    total: new Float64Array(n),
    totalWorst: new Float64Array(n),
    tNominal: new Float64Array(n),
    aSpec: new Float64Array(n),
    aSpecHigh: new Float64Array(n),
    roc: new Float64Array(n),
    oblique: new Uint8Array(n),
    price: new Float64Array(n),
    masks: new Int32Array(n * FACETS),
    spectrum: [],
    ringdownNm: new Float64Array(n).fill(NaN),
    ringdownPpm: new Float64Array(n),
  };
  ms.forEach((d, i) => {
    const s = (d.candidate as { spec: MirrorSpec }).spec;
    A.quantity[i] = d.quantity;
    A.bandLo[i] = s.bandMinNm;
    A.bandHi[i] = s.bandMaxNm;
    const t = s.transmissionPpm;
    const a = s.lossPpm;
    A.tNominal[i] = t.value;
    A.aSpec[i] = a.value;
    A.aSpecHigh[i] = a.value + (a.tol ?? 0);
    A.total[i] = t.value + a.value;
    // the engine's order of additions, so equal specs give equal keys to the last bit
    A.totalWorst[i] = Math.min(t.value + (t.tol ?? 0) + (a.value + (a.tol ?? 0)), 999_999);
    A.roc[i] = s.rocMm === null ? NaN : s.rocMm / 1000;
    A.oblique[i] = s.aoiDeg > 5 ? 1 : 0;
    A.price[i] = d.euroCents;
    A.masks.set(facetMasks(d), i * FACETS);
    const pts = s.spectrum ? [...s.spectrum.points].sort((p, q) => p.wavelengthNm - q.wavelengthNm) : null;
    A.spectrum.push(
      pts && {
        x: Float64Array.from(pts, (p) => p.wavelengthNm),
        t: Float64Array.from(pts, (p) => p.transmissionPpm),
        a: pts.every((p) => p.lossPpm !== undefined) ? Float64Array.from(pts, (p) => p.lossPpm as number) : null,
      },
    );
    if (s.ringdown) {
      A.ringdownNm[i] = s.ringdown.wavelengthNm;
      A.ringdownPpm[i] = s.ringdown.lengthM / SPEED_OF_LIGHT / s.ringdown.tauS / 1e-6;
    }
  });
  return A;
}

function interp(x: Float64Array, y: Float64Array, at: number): number {
  let lo = 0;
  let hi = x.length - 1;
  if (at < x[0]! || at > x[hi]!) return NaN;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (x[mid]! <= at) lo = mid;
    else hi = mid;
  }
  const f = x[hi] === x[lo] ? 0 : (at - x[lo]!) / (x[hi]! - x[lo]!);
  return y[lo]! * (1 - f) + y[hi]! * f;
}

/** T + loss at the wavelength (nominal, worst) into out[0], out[1]; false when the mirror has none there. */
function readMirror(A: MirrorArrays, i: number, nm: number, out: Float64Array): boolean {
  if (A.oblique[i]) return false;
  let tot = NaN;
  let worst = NaN;
  const sp = A.spectrum[i];
  let tMeasured = NaN;
  if (sp) {
    tMeasured = interp(sp.x, sp.t, nm);
    if (!Number.isNaN(tMeasured)) {
      const a = sp.a ? interp(sp.x, sp.a, nm) : NaN;
      tot = tMeasured + (Number.isNaN(a) ? A.aSpec[i]! : a);
      worst = tMeasured + (Number.isNaN(a) ? A.aSpecHigh[i]! : a);
    }
  }
  if (Number.isNaN(tot) && nm >= A.bandLo[i]! && nm <= A.bandHi[i]!) {
    tot = A.total[i]!;
    worst = A.totalWorst[i]!;
  }
  if (Math.abs(A.ringdownNm[i]! - nm) <= 1) {
    // the ring-down's loss replaces T + loss; split into T and the rest as the engine does, then summed
    const total = A.ringdownPpm[i]!;
    const t = Math.min(Number.isNaN(tMeasured) ? A.tNominal[i]! : tMeasured, total);
    tot = t + (total - t);
    worst = tot;
  }
  if (Number.isNaN(tot)) return false;
  out[0] = tot;
  out[1] = worst;
  return true;
}

/** Form 1.3 from both mirrors' loss (ppm) and the extra round-trip loss (a fraction). */
function finesse(l1Ppm: number, l2Ppm: number, extra: number): number {
  const rho = (1 - l1Ppm * 1e-6) * (1 - l2Ppm * 1e-6) * (1 - extra);
  const r = Math.sqrt(rho);
  return (Math.PI * Math.sqrt(r)) / (1 - r);
}

/** 0 < g1·g2 < 1 off the edges, and the symmetric confocal case (g1 = g2 = 0), which has a finite mode. */
function stable(lengthM: number, roc1: number, roc2: number): boolean {
  const g1 = Number.isNaN(roc1) ? 1 : 1 - lengthM / roc1;
  const g2 = Number.isNaN(roc2) ? 1 : 1 - lengthM / roc2;
  const gg = g1 * g2;
  return (Math.abs(g1) < 1e-9 && Math.abs(g2) < 1e-9) || (gg > 1e-9 && gg < 1 - 1e-9);
}

export interface FloorCavityGoal {
  nm: number;
  lengthM: number;
  finesse: number;
  extraLoss: number;
}

/** The pair goal (two units of one listing) over every mirror. */
export function floorPair(
  A: MirrorArrays,
  g: FloorCavityGoal,
  k = 20,
): { ids: string[]; headrooms: number[]; total: number; facets: Int32Array } {
  const counts = new Int32Array(FACETS * VALUES);
  const rank = new Int8Array(A.n);
  const headroom = new Float64Array(A.n);
  const price = new Float64Array(A.n);
  const index = new Int32Array(A.n);
  const out = new Float64Array(2);
  let n = 0;
  for (let i = 0; i < A.n; i++) {
    if (A.quantity[i]! < 2) continue;
    countFacets(counts, A.masks, i);
    index[n] = i;
    price[n] = A.price[i]!;
    rank[n] = 0;
    headroom[n] = NaN;
    if (readMirror(A, i, g.nm, out) && stable(g.lengthM, A.roc[i]!, A.roc[i]!)) {
      const f = finesse(out[0]!, out[0]!, g.extraLoss);
      const fw = finesse(out[1]!, out[1]!, g.extraLoss);
      rank[n] = fw >= g.finesse ? 2 : f >= g.finesse ? 1 : 0;
      headroom[n] = fw / g.finesse - 1;
    }
    n++;
  }
  const top = topK(n, rank, headroom, price, k);
  return { ids: top.map((j) => A.ids[index[j]!]!), headrooms: top.map((j) => headroom[j]!), total: n, facets: counts };
}

/** The best `k` pairs of two listings: mirrors in band sorted by worst-case loss, a best-first walk, stability checked per pair. */
export function floorTwoListings(A: MirrorArrays, g: FloorCavityGoal, k = 100): { pairs: [string, string][]; facets: Int32Array } {
  const counts = new Int32Array(FACETS * VALUES);
  const out = new Float64Array(2);
  const usable: number[] = [];
  const nominal: number[] = [];
  const worst: number[] = [];
  for (let i = 0; i < A.n; i++) {
    countFacets(counts, A.masks, i);
    if (readMirror(A, i, g.nm, out)) {
      usable.push(i);
      nominal[i] = out[0]!;
      worst[i] = out[1]!;
    }
  }
  usable.sort((a, b) => worst[a]! - worst[b]!);
  const m = usable.length;
  // max-heap of (i, j) by worst-case finesse; (i, j) is never better than (i, j − 1) or (i − 1, i)
  const heap: [number, number, number][] = [];
  const push = (i: number, j: number) => {
    heap.push([finesse(worst[usable[i]!]!, worst[usable[j]!]!, g.extraLoss), i, j]);
    let c = heap.length - 1;
    while (c > 0) {
      const p = (c - 1) >> 1;
      if (heap[p]![0] >= heap[c]![0]) break;
      [heap[p], heap[c]] = [heap[c]!, heap[p]!];
      c = p;
    }
  };
  const pop = () => {
    const top = heap[0]!;
    const last = heap.pop()!;
    if (heap.length > 0) {
      heap[0] = last;
      let c = 0;
      for (;;) {
        const l = 2 * c + 1;
        const r = l + 1;
        let b = c;
        if (l < heap.length && heap[l]![0] > heap[b]![0]) b = l;
        if (r < heap.length && heap[r]![0] > heap[b]![0]) b = r;
        if (b === c) break;
        [heap[b], heap[c]] = [heap[c]!, heap[b]!];
        c = b;
      }
    }
    return top;
  };
  const found: { a: number; b: number; rank: number; headroom: number; price: number }[] = [];
  if (m >= 2) push(0, 1);
  while (found.length < k && heap.length > 0) {
    const [fw, i, j] = pop();
    if (j + 1 < m) push(i, j + 1);
    if (j === i + 1 && i + 2 < m) push(i + 1, i + 2);
    const a = usable[i]!;
    const b = usable[j]!;
    if (!stable(g.lengthM, A.roc[a]!, A.roc[b]!)) continue;
    const f = finesse(nominal[a]!, nominal[b]!, g.extraLoss);
    found.push({
      a,
      b,
      rank: fw >= g.finesse ? 2 : f >= g.finesse ? 1 : 0,
      headroom: fw / g.finesse - 1,
      price: A.price[a]! + A.price[b]!,
    });
  }
  found.sort((x, y) => y.rank - x.rank || y.headroom - x.headroom || x.price - y.price);
  return { pairs: found.map((p) => [A.ids[p.a]!, A.ids[p.b]!]), facets: counts };
}

export interface DetectorArrays {
  n: number;
  ids: string[];
  at: Float64Array;
  qe: Float64Array;
  qeLow: Float64Array;
  noise: Float64Array;
  noiseHigh: Float64Array;
  bandwidth: Float64Array;
  saturation: Float64Array;
  price: Float64Array;
  masks: Int32Array;
  curve: ({ x: Float64Array; y: Float64Array } | null)[];
}

export function detectorArrays(docs: readonly SearchDoc[]): DetectorArrays {
  const ds = docs.filter((d) => d.candidate.kind === 'photodiode');
  const n = ds.length;
  const A: DetectorArrays = {
    n,
    ids: ds.map((d) => d.id),
    at: new Float64Array(n),
    qe: new Float64Array(n),
    qeLow: new Float64Array(n),
    noise: new Float64Array(n),
    noiseHigh: new Float64Array(n),
    bandwidth: new Float64Array(n),
    saturation: new Float64Array(n),
    price: new Float64Array(n),
    masks: new Int32Array(n * FACETS),
    curve: [],
  };
  ds.forEach((d, i) => {
    const s = (d.candidate as { spec: PhotodiodeSpec }).spec;
    A.at[i] = s.wavelengthNm ?? NaN;
    A.qe[i] = s.quantumEfficiency?.value ?? NaN;
    A.qeLow[i] = Math.max(0, (s.quantumEfficiency?.value ?? NaN) - (s.quantumEfficiency?.tol ?? 0));
    A.noise[i] = s.noiseCurrentAPerRtHz?.value ?? NaN;
    A.noiseHigh[i] = (s.noiseCurrentAPerRtHz?.value ?? NaN) + (s.noiseCurrentAPerRtHz?.tol ?? 0);
    A.bandwidth[i] = s.bandwidthHz;
    A.saturation[i] = s.saturationPowerW ?? Infinity;
    A.price[i] = d.euroCents;
    A.masks.set(facetMasks(d), i * FACETS);
    const c = s.qeCurve ? [...s.qeCurve].sort((p, q) => p.wavelengthNm - q.wavelengthNm) : null;
    A.curve.push(c && { x: Float64Array.from(c, (p) => p.wavelengthNm), y: Float64Array.from(c, (p) => p.qe) });
  });
  return A;
}

export interface FloorSqueezingGoal {
  nm: number;
  targetDb: number;
  sidebandHz: number;
  loPowerW: number;
  /** η_esc·η_prop·V². */
  chain: number;
  /** Squeezed-quadrature slope of the source: V− = 1 − η·k. */
  k: number;
}

/** The squeezing goal over every photodiode and balanced detector. */
export function floorSqueezing(A: DetectorArrays, g: FloorSqueezingGoal, k = 20): { ids: string[]; total: number; facets: Int32Array } {
  const counts = new Int32Array(FACETS * VALUES);
  const rank = new Int8Array(A.n);
  const headroom = new Float64Array(A.n);
  const perQe = (ELEMENTARY_CHARGE * g.nm * 1e-9) / (PLANCK * SPEED_OF_LIGHT);
  for (let i = 0; i < A.n; i++) {
    countFacets(counts, A.masks, i);
    rank[i] = 0;
    headroom[i] = NaN;
    let qe = NaN;
    let qeLow = NaN;
    const c = A.curve[i];
    if (c) qe = qeLow = interp(c.x, c.y, g.nm);
    if (Number.isNaN(qe) && Math.abs(A.at[i]! - g.nm) <= 1) {
      qe = A.qe[i]!;
      qeLow = A.qeLow[i]!;
    }
    if (Number.isNaN(qe) || A.bandwidth[i]! < g.sidebandHz || A.saturation[i]! < g.loPowerW) continue;
    const sN = (2 * ELEMENTARY_CHARGE * qe * perQe * g.loPowerW) / (A.noise[i]! * A.noise[i]!);
    const sW = (2 * ELEMENTARY_CHARGE * qeLow * perQe * g.loPowerW) / (A.noiseHigh[i]! * A.noiseHigh[i]!);
    const figure = -10 * Math.log10(1 - g.chain * qe * (sN / (1 + sN)) * g.k);
    const worst = -10 * Math.log10(1 - g.chain * qeLow * (sW / (1 + sW)) * g.k);
    rank[i] = worst >= g.targetDb ? 2 : figure >= g.targetDb ? 1 : 0;
    headroom[i] = worst - g.targetDb;
  }
  return { ids: topK(A.n, rank, headroom, A.price, k).map((j) => A.ids[j]!), total: A.n, facets: counts };
}

/** Text: every word a substring of the listing's lower-cased text, newest first. */
export function floorText(
  haystacks: readonly string[],
  approvedAt: Float64Array,
  masks: Int32Array,
  terms: readonly string[],
  k = 20,
): { hits: number[]; facets: Int32Array } {
  const counts = new Int32Array(FACETS * VALUES);
  const hits: number[] = [];
  for (let i = 0; i < haystacks.length; i++) {
    const h = haystacks[i]!;
    let all = true;
    for (const t of terms) {
      if (!h.includes(t)) {
        all = false;
        break;
      }
    }
    if (!all) continue;
    countFacets(counts, masks, i);
    hits.push(i);
  }
  hits.sort((a, b) => approvedAt[b]! - approvedAt[a]!);
  return { hits: hits.slice(0, k), facets: counts };
}
