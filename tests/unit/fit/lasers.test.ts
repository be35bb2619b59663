import { describe, expect, test } from 'vitest';
import {
  FitInputError,
  coherenceLength,
  coherenceTime,
  frequencyWidth,
  laserHazardClass,
  linewidthForCoherenceLength,
  schawlowTownes,
} from '../../../src/lib/fit';
import { expectRel } from './helpers';

describe('physics.md A8 check values (lasers)', () => {
  test('A8.1 Lorentzian Δν = 1 MHz: τ_c = 318.31 ns, L_c = 95.427 m (c/Δν would give 299.79 m) — Saleh & Teich, Fundamentals of Photonics ch. 12 [M]; [D] form 8.1', () => {
    expectRel(coherenceTime({ linewidthHz: 1e6 }), 318.31e-9, 1e-4);
    expectRel(coherenceLength({ linewidthHz: 1e6 }), 95.427, 1e-4);
    expectRel(coherenceLength({ linewidthHz: 1e6 }) * Math.PI, 299.79, 1e-4);
    expectRel(linewidthForCoherenceLength({ coherenceLengthM: 95.427 }), 1e6, 1e-4);
  });

  test('A8.2 Lorentzian Δν = 1 kHz: L_c = 95.427 km — [D] form 8.1', () => {
    expectRel(coherenceLength({ linewidthHz: 1e3 }), 95.427e3, 1e-4);
  });

  test('A8.3 He-Ne 632.8 nm, Δν_c = 1 MHz, P = 1 mW: Δν_ST = 9.862e-4 Hz — Schawlow & Townes, Phys. Rev. 112, 1940 (1958) [M]; [D] form 8.2', () => {
    expectRel(schawlowTownes({ wavelengthM: 632.8e-9, cavityLinewidthHz: 1e6, powerW: 1e-3 }), 9.862e-4, 1e-3);
  });

  test('A8.4 CW 532 nm 50 mW → 3B; 633 nm 3 mW → 3R; 1064 nm 2 W → 4 — IEC 60825-1:2014 boundaries [C, secondary summaries]', () => {
    expect(laserHazardClass({ wavelengthM: 532e-9, powerW: 50e-3 }).hazardClass).toBe('3B');
    const heNe = laserHazardClass({ wavelengthM: 633e-9, powerW: 3e-3 });
    expect(heNe.hazardClass).toBe('3R');
    expect(heNe.caution).toMatch(/collimated/);
    const yag = laserHazardClass({ wavelengthM: 1064e-9, powerW: 2 });
    expect(yag.hazardClass).toBe('4');
    expect(yag.needsAelTables).toBe(false);
  });

  test('A8.5 1064 nm, Δν_c = 10 MHz, P = 1 W: Δν_ST = 5.865e-5 Hz — [D] form 8.2', () => {
    expectRel(schawlowTownes({ wavelengthM: 1064e-9, cavityLinewidthHz: 10e6, powerW: 1 }), 5.865e-5, 1e-3);
  });

  test('form 8.2 Henry factor n_sp·(1 + α²) — Henry, IEEE J. Quantum Electron. 18, 259 (1982) [M]', () => {
    const base = schawlowTownes({ wavelengthM: 1550e-9, cavityLinewidthHz: 1e9, powerW: 1e-2 });
    expectRel(schawlowTownes({ wavelengthM: 1550e-9, cavityLinewidthHz: 1e9, powerW: 1e-2, nsp: 2, alpha: 3 }), base * 20, 1e-12);
  });

  test('form 8.3 Δν = c·Δλ/λ²: 1 pm at 1550 nm ≈ 124.8 MHz — [D]', () => {
    expectRel(frequencyWidth({ wavelengthM: 1550e-9, wavelengthWidthM: 1e-12 }), 124.78e6, 1e-4);
  });
});

describe('laserHazardClass never classes the infrared from power alone', () => {
  test('IR below 0.5 W: unknown, at most 3B, AEL tables needed', () => {
    for (const powerW of [1e-4, 3e-3, 0.1, 0.5]) {
      const h = laserHazardClass({ wavelengthM: 1064e-9, powerW });
      expect(h.hazardClass).toBe('unknown');
      expect(h.atMostClass).toBe('3B');
      expect(h.needsAelTables).toBe(true);
      expect(h.caution).toMatch(/AEL tables of IEC 60825-1/);
    }
    expect(laserHazardClass({ wavelengthM: 1550e-9, powerW: 0.6 }).hazardClass).toBe('4');
  });

  test('visible ≤ 1 mW: at most Class 2, Class 1 needs the tables', () => {
    const h = laserHazardClass({ wavelengthM: 633e-9, powerW: 0.8e-3 });
    expect(h.hazardClass).toBe('unknown');
    expect(h.atMostClass).toBe('2');
    expect(h.needsAelTables).toBe(true);
  });

  test('below 315 nm no boundary is stated: unknown even at 1 W', () => {
    const h = laserHazardClass({ wavelengthM: 266e-9, powerW: 1 });
    expect(h.hazardClass).toBe('unknown');
    expect(h.needsAelTables).toBe(true);
  });

  test('every caution defers to the laser safety officer and IEC 60825-1 / local rules', () => {
    for (const [wavelengthM, powerW] of [
      [266e-9, 1],
      [532e-9, 0.05],
      [633e-9, 3e-3],
      [633e-9, 0.5e-3],
      [1064e-9, 2],
      [1064e-9, 0.01],
    ] as const) {
      expect(laserHazardClass({ wavelengthM, powerW }).caution).toMatch(/laser safety officer and IEC 60825-1 \/ local rules decide/);
    }
  });

  test('boundaries are inclusive: 5 mW visible is 3R, 0.5 W is 3B', () => {
    expect(laserHazardClass({ wavelengthM: 532e-9, powerW: 5e-3 }).hazardClass).toBe('3R');
    expect(laserHazardClass({ wavelengthM: 532e-9, powerW: 0.5 }).hazardClass).toBe('3B');
  });

  test('zero power and non-positive linewidth throw', () => {
    expect(() => laserHazardClass({ wavelengthM: 532e-9, powerW: 0 })).toThrow(FitInputError);
    expect(() => coherenceLength({ linewidthHz: 0 })).toThrow(/linewidthHz/);
  });
});
