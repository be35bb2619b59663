/**
 * Synthetic measurement files and pictures for the demo and the tests: made up from a model with
 * seeded noise, never copied from a real part.
 */
import sharp from 'sharp';
import type { Category } from '../../lib/listings/constants';

const C = 299_792_458;

/** Mulberry32: a small seeded generator, so every run makes the same files. */
export function seededRandom(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal deviates by Box–Muller. */
export function gaussian(rand: () => number): () => number {
  return () => Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
}

/** Intensity ring-down of a symmetric cavity: τ = L/(c·(1 − R)) (physics.md 1.8b), with noise of `noise` × the amplitude. */
export function ringdownCsv(opts: {
  tauS: number;
  lengthM: number;
  wavelengthNm: number;
  noise?: number;
  points?: number;
  seed?: number;
}): string {
  const n = opts.points ?? 400;
  const normal = gaussian(seededRandom(opts.seed ?? 1));
  const amplitude = 1000;
  const offset = 4;
  const lines = [`# length_m=${opts.lengthM}`, `# wavelength_nm=${opts.wavelengthNm}`, 'time_us,intensity'];
  for (let i = 0; i < n; i++) {
    const t = (i / (n - 1)) * 6 * opts.tauS;
    const v = amplitude * Math.exp(-t / opts.tauS) + offset + (opts.noise ?? 0.01) * amplitude * normal();
    lines.push(`${(t * 1e6).toFixed(5)},${v.toFixed(4)}`);
  }
  return lines.join('\n') + '\n';
}

export function tauForMirrorLoss(perMirrorLossPpm: number, lengthM: number): number {
  return lengthM / (C * perMirrorLossPpm * 1e-6);
}

/** A coating's transmission rising towards the band edges, loss nearly flat, with small noise. */
export function spectrumCsv(opts: {
  bandMinNm: number;
  bandMaxNm: number;
  transmissionPpm: number;
  lossPpm: number;
  seed?: number;
}): string {
  const rand = seededRandom(opts.seed ?? 2);
  const centre = (opts.bandMinNm + opts.bandMaxNm) / 2;
  const half = (opts.bandMaxNm - opts.bandMinNm) / 2;
  const lines = ['wavelength_nm,transmission_ppm,loss_ppm'];
  for (let i = 0; i <= 60; i++) {
    const wl = opts.bandMinNm + (i / 60) * (opts.bandMaxNm - opts.bandMinNm);
    const x = (wl - centre) / half;
    const t = opts.transmissionPpm * (1 + 2.5 * x * x) * (1 + 0.03 * (rand() - 0.5));
    const a = opts.lossPpm * (1 + 0.05 * (rand() - 0.5));
    lines.push(`${wl.toFixed(2)},${t.toFixed(3)},${a.toFixed(3)}`);
  }
  return lines.join('\n') + '\n';
}

/** A detector efficiency curve peaking at the quoted value near the design wavelength. */
export function efficiencyCsv(opts: { wavelengthNm: number; efficiency: number; widthNm?: number; seed?: number }): string {
  const rand = seededRandom(opts.seed ?? 3);
  const width = opts.widthNm ?? Math.max(80, opts.wavelengthNm * 0.2);
  const lines = ['wavelength_nm,efficiency_pct'];
  for (let i = 0; i <= 40; i++) {
    const wl = opts.wavelengthNm - width + (i / 40) * 2 * width;
    const x = (wl - opts.wavelengthNm) / width;
    const e = Math.min(0.999, opts.efficiency * (1 - 0.45 * x * x) * (1 + 0.004 * (rand() - 0.5)));
    lines.push(`${wl.toFixed(1)},${(e * 100).toFixed(3)}`);
  }
  return lines.join('\n') + '\n';
}

const SHAPES: Record<Category, (accent: string) => string> = {
  'cavity-mirror': (a) =>
    `<circle cx="600" cy="450" r="260" fill="#e9edf2" stroke="#8a94a6" stroke-width="18"/><circle cx="600" cy="450" r="190" fill="url(#coat)"/><ellipse cx="540" cy="380" rx="70" ry="34" fill="#ffffff" opacity="0.55"/><circle cx="600" cy="450" r="190" fill="none" stroke="${a}" stroke-width="4" opacity="0.5"/>`,
  photodiode: (a) =>
    `<rect x="430" y="300" width="340" height="300" rx="26" fill="#2b3342"/><circle cx="600" cy="450" r="80" fill="url(#coat)" stroke="${a}" stroke-width="6"/><rect x="520" y="600" width="14" height="170" fill="#b9b5a8"/><rect x="666" y="600" width="14" height="170" fill="#b9b5a8"/>`,
  'balanced-detector': (a) =>
    `<rect x="300" y="280" width="600" height="340" rx="20" fill="#3a4457"/><circle cx="480" cy="450" r="58" fill="url(#coat)" stroke="${a}" stroke-width="5"/><circle cx="720" cy="450" r="58" fill="url(#coat)" stroke="${a}" stroke-width="5"/><rect x="560" y="640" width="80" height="40" fill="#b9b5a8"/>`,
  'single-photon-detector': (a) =>
    `<rect x="340" y="250" width="520" height="400" rx="30" fill="#232a36"/><rect x="380" y="290" width="440" height="120" rx="10" fill="#0f1520"/><circle cx="460" cy="540" r="36" fill="${a}"/><circle cx="600" cy="540" r="36" fill="${a}" opacity="0.7"/><circle cx="740" cy="540" r="36" fill="${a}" opacity="0.4"/>`,
  laser: (a) =>
    `<rect x="260" y="340" width="560" height="220" rx="16" fill="#3b4252"/><rect x="820" y="420" width="70" height="60" fill="#8a94a6"/><rect x="890" y="440" width="150" height="20" fill="${a}" opacity="0.9"/>`,
  'nonlinear-crystal': (a) =>
    `<polygon points="420,360 780,330 820,540 460,570" fill="url(#coat)" stroke="#8a94a6" stroke-width="6"/><g stroke="${a}" stroke-width="3" opacity="0.6">${Array.from({ length: 12 }, (_, i) => `<line x1="${450 + i * 30}" y1="${358 - i * 2.5}" x2="${490 + i * 30}" y2="${568 - i * 2.5}"/>`).join('')}</g>`,
  other: (a) =>
    `<rect x="360" y="360" width="480" height="180" rx="90" fill="#4a5568"/><circle cx="360" cy="450" r="40" fill="${a}"/><circle cx="840" cy="450" r="40" fill="${a}"/>`,
};

/** A plain studio-style picture of the kind of part, drawn from shapes (no real product picture). */
export async function partPhoto(category: Category, seed: number): Promise<Buffer> {
  const hue = Math.round(seededRandom(seed)() * 360);
  const accent = `hsl(${hue}, 55%, 45%)`;
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="1200" height="900">
<defs><linearGradient id="bg" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="#f6f5f0"/><stop offset="1" stop-color="#dcd8cc"/></linearGradient>
<radialGradient id="coat" cx="0.4" cy="0.35" r="0.8"><stop offset="0" stop-color="#fdfcf9"/><stop offset="0.6" stop-color="hsl(${hue}, 40%, 70%)"/><stop offset="1" stop-color="hsl(${hue}, 45%, 40%)"/></radialGradient></defs>
<rect width="1200" height="900" fill="url(#bg)"/><ellipse cx="600" cy="790" rx="420" ry="40" fill="#000" opacity="0.08"/>${SHAPES[category](accent)}</svg>`;
  return sharp(Buffer.from(svg)).jpeg({ quality: 82 }).toBuffer();
}
