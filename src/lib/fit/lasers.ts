// Lasers: coherence time and length, Schawlow–Townes linewidth, wavelength ↔ frequency width, and a
// cautious hazard-class suggestion (physics.md A8, forms 8.1–8.3 and the IEC 60825-1 boundaries).
// Sources: B. E. A. Saleh and M. C. Teich, "Fundamentals of Photonics", ch. 12 (coherence);
// A. L. Schawlow and C. H. Townes, "Infrared and optical masers", Phys. Rev. 112, 1940 (1958);
// C. H. Henry, "Theory of the linewidth of semiconductor lasers", IEEE J. Quantum Electron. 18, 259
// (1982); IEC 60825-1:2014 "Safety of laser products" class boundaries as quoted in secondary
// summaries (the standard's own text was not read for physics.md).

import { PLANCK, SPEED_OF_LIGHT } from './constants';
import { finiteResult, nonNegative, positive } from './validate';

export type HazardClass = '1' | '2' | '3R' | '3B' | '4' | 'unknown';

export interface HazardSuggestion {
  hazardClass: HazardClass;
  /** The highest class the power alone allows, when the class itself needs the AEL tables. */
  atMostClass: HazardClass | null;
  needsAelTables: boolean;
  caution: string;
}

/** Form 8.1, Lorentzian line of FWHM Δν: τ_c = 1/(π·Δν), the 1/e time of |g⁽¹⁾|. */
export function coherenceTime(input: { linewidthHz: number }): number {
  const dv = positive('linewidthHz', input.linewidthHz);
  return finiteResult('linewidthHz', 1 / (Math.PI * dv), 'coherence time');
}

/** Form 8.1: L_c = c/(π·Δν) in vacuum (Lorentzian, 1/e of |g⁽¹⁾|). */
export function coherenceLength(input: { linewidthHz: number }): number {
  return finiteResult('linewidthHz', SPEED_OF_LIGHT * coherenceTime(input), 'coherence length');
}

/** Form 8.1 inverted: the Lorentzian FWHM whose coherence length is L_c, Δν = c/(π·L_c). */
export function linewidthForCoherenceLength(input: { coherenceLengthM: number }): number {
  const lc = positive('coherenceLengthM', input.coherenceLengthM);
  return finiteResult('coherenceLengthM', SPEED_OF_LIGHT / (Math.PI * lc), 'linewidth');
}

/** Form 8.3: Δν = c·Δλ/λ². */
export function frequencyWidth(input: { wavelengthM: number; wavelengthWidthM: number }): number {
  const lambda = positive('wavelengthM', input.wavelengthM);
  const dl = nonNegative('wavelengthWidthM', input.wavelengthWidthM);
  return finiteResult('wavelengthM', (SPEED_OF_LIGHT * dl) / lambda / lambda, 'frequency width');
}

/**
 * Form 8.2, modern Schawlow–Townes FWHM: Δν_L = π·h·ν·(Δν_c)²/P_out × n_sp·(1 + α²) (Henry), with
 * Δν_c the passive-cavity FWHM. Equals the 1958 paper's 4π·h·ν·(Δν_half)²/P.
 */
export function schawlowTownes(input: {
  wavelengthM: number;
  cavityLinewidthHz: number;
  powerW: number;
  nsp?: number;
  alpha?: number;
}): number {
  const lambda = positive('wavelengthM', input.wavelengthM);
  const dvc = positive('cavityLinewidthHz', input.cavityLinewidthHz);
  const p = positive('powerW', input.powerW);
  const nsp = input.nsp === undefined ? 1 : positive('nsp', input.nsp);
  const alpha = input.alpha === undefined ? 0 : nonNegative('alpha', input.alpha);
  const hv = (PLANCK * SPEED_OF_LIGHT) / lambda;
  return finiteResult('cavityLinewidthHz', ((Math.PI * hv * dvc) / p) * dvc * nsp * (1 + alpha * alpha), 'linewidth');
}

const DECIDES =
  "The buyer's laser safety officer and IEC 60825-1 / local rules decide the class and the controls; this is a suggestion for a CW beam from its power only.";

/**
 * A class suggestion for a CW beam from wavelength and power, using only the IEC 60825-1:2014
 * boundaries physics.md A8 states: visible (400–700 nm) Class 2 ≤ 1 mW, 3R ≤ 5 mW, and for
 * λ ≥ 315 nm Class 3B ≤ 0.5 W, Class 4 above. Outside the visible the Class 1 AEL depends on the
 * wavelength, exposure and beam geometry, so no class below 4 is given from power alone
 * (needsAelTables); the same holds for Class 1 against 2 in the visible. Below 315 nm no boundary is stated, so nothing is suggested there.
 */
export function laserHazardClass(input: { wavelengthM: number; powerW: number }): HazardSuggestion {
  const lambda = positive('wavelengthM', input.wavelengthM);
  const p = positive('powerW', input.powerW);
  const nm = lambda * 1e9;
  if (nm < 315 || nm > 1e6) {
    return {
      hazardClass: 'unknown',
      atMostClass: null,
      needsAelTables: true,
      caution: `${nm < 315 ? 'Ultraviolet below 315 nm' : 'Beyond 1 mm'}: the class requires the AEL tables of IEC 60825-1. ${DECIDES}`,
    };
  }
  if (p > 0.5) {
    return {
      hazardClass: '4',
      atMostClass: null,
      needsAelTables: false,
      caution: `Above the 0.5 W Class 3B limit: Class 4 (direct, specular and diffuse reflections hazardous; fire and skin hazard). ${DECIDES}`,
    };
  }
  const visible = nm >= 400 && nm <= 700;
  if (!visible) {
    return {
      hazardClass: 'unknown',
      atMostClass: '3B',
      needsAelTables: true,
      caution: `At most Class 3B (≤ 0.5 W). Outside 400–700 nm the lower classes require the AEL tables of IEC 60825-1 (wavelength, exposure time, beam geometry). ${DECIDES}`,
    };
  }
  if (p > 5e-3) {
    return {
      hazardClass: '3B',
      atMostClass: null,
      needsAelTables: false,
      caution: `Class 3B (5 mW to 0.5 W visible; US IIIb): direct and specular viewing hazardous. ${DECIDES}`,
    };
  }
  if (p > 1e-3) {
    return {
      hazardClass: '3R',
      atMostClass: null,
      needsAelTables: false,
      caution: `Class 3R (1–5 mW visible, for a collimated beam; US IIIa); a focused or divergent beam needs the AEL tables. ${DECIDES}`,
    };
  }
  return {
    hazardClass: 'unknown',
    atMostClass: '2',
    needsAelTables: true,
    caution: `At most Class 2 (≤ 1 mW visible, protection by the blink reflex); whether it is Class 1 requires the AEL tables of IEC 60825-1. ${DECIDES}`,
  };
}
