// The units people type in the listing form, each with its conversion to the stored unit. Most
// are a plain factor; a few depend on other specs of the same listing (QE from A/W needs the
// wavelength, noise current from NEP needs the responsivity, a linewidth in pm needs the centre
// wavelength), so a factor may be a function of the specs converted before it.

import { frequencyWidth, quantumEfficiencyFromResponsivity, responsivityFromQuantumEfficiency } from '../fit';
import { UNITS, type Dimension, type UnitKey, type UnitOption } from '../units';

/** Stored values converted so far, by field path (fields convert in the order they are listed). */
export type SpecDraft = Readonly<Record<string, unknown>>;

export interface UnitChoice {
  key: string;
  label: string;
  /** stored = typed × factor. A function when the factor depends on other specs; null when they are missing. */
  factor: number | ((draft: SpecDraft) => number | null);
  /** What a context-dependent conversion needs, in plain words (shown when it cannot be made). */
  needs?: string;
}

/** Twelve significant digits: drops the float noise of unit factors (0.78 µm → 780 nm, not 780.0000000000001). */
export function roundStored(x: number): number {
  return Number(x.toPrecision(12));
}

function fromUnits<D extends Dimension>(dimension: D, stored: UnitKey<D>, keys: UnitKey<D>[]): UnitChoice[] {
  const table = UNITS[dimension] as Record<string, UnitOption>;
  const base = (table[stored] as UnitOption).factor;
  return keys.map((key) => {
    const u = table[key] as UnitOption;
    return { key, label: u.label, factor: roundStored(u.factor / base) };
  });
}

function plain(key: string, label: string, factor: number): UnitChoice {
  return { key, label, factor };
}

function valueOf(draft: SpecDraft, path: string): number | null {
  const v = draft[path];
  if (typeof v === 'number') return v;
  if (v !== null && typeof v === 'object' && typeof (v as { value?: unknown }).value === 'number') return (v as { value: number }).value;
  return null;
}

function positiveOf(draft: SpecDraft, path: string): number | null {
  const v = valueOf(draft, path);
  return v !== null && v > 0 ? v : null;
}

/** Responsivity at the spec wavelength (A/W), from a stated responsivity or the QE (physics.md A12 form 12.1). */
function responsivityOf(draft: SpecDraft): number | null {
  const stated = positiveOf(draft, 'responsivityAW');
  if (stated !== null) return stated;
  const qe = positiveOf(draft, 'quantumEfficiency');
  const nm = positiveOf(draft, 'wavelengthNm');
  return qe === null || nm === null ? null : responsivityFromQuantumEfficiency({ quantumEfficiency: qe, wavelengthM: nm * 1e-9 });
}

/** A noise-equivalent power typed for the noise-current field: i_n = NEP·ℜ. */
function nep(key: string, label: string, scale: number): UnitChoice {
  return {
    key,
    label,
    factor: (draft: SpecDraft) => {
      const r = responsivityOf(draft);
      return r === null ? null : roundStored(scale * r);
    },
    needs:
      'a noise-equivalent power becomes an input-referred noise current through the responsivity (i_n = NEP·ℜ): enter the quantum efficiency or responsivity and its wavelength first',
  };
}

export const U = {
  wavelengthNm: fromUnits('length', 'nm', ['nm', 'um']),
  lengthMm: [...fromUnits('length', 'mm', ['mm', 'cm', 'm']), plain('in', 'inch', 25.4)],
  radiusMm: fromUnits('length', 'mm', ['mm', 'cm', 'm']),
  periodUm: fromUnits('length', 'um', ['um']),
  roughnessNm: [plain('nm', 'nm', 1), plain('angstrom', 'Å', 0.1)],
  ppm: fromUnits('fraction', 'ppm', ['ppm', 'pct']),
  reflectivityPpm: [plain('pct', '%', 1e4), plain('frac', 'fraction', 1e6)],
  fraction: fromUnits('fraction', 'frac', ['pct', 'frac']),
  quantumEfficiency: [
    ...fromUnits('fraction', 'frac', ['pct', 'frac']),
    {
      key: 'A/W',
      label: 'A/W',
      factor: (draft: SpecDraft) => {
        const nm = positiveOf(draft, 'wavelengthNm');
        return nm === null ? null : quantumEfficiencyFromResponsivity({ responsivityAW: 1, wavelengthM: nm * 1e-9 });
      },
      needs:
        'a responsivity in A/W becomes a quantum efficiency only at a given wavelength (η = ℜ·hc/(eλ), physics.md A12 form 12.1): enter the wavelength first',
    },
  ],
  frequencyHz: fromUnits('frequency', 'Hz', ['Hz', 'kHz', 'MHz', 'GHz']),
  linewidthHz: [
    ...fromUnits('frequency', 'Hz', ['Hz', 'kHz', 'MHz', 'GHz']),
    {
      key: 'pm',
      label: 'pm',
      factor: (draft: SpecDraft) => {
        const nm = positiveOf(draft, 'centreWavelengthNm');
        return nm === null ? null : frequencyWidth({ wavelengthM: nm * 1e-9, wavelengthWidthM: 1e-12 });
      },
      needs:
        'a linewidth in pm becomes a frequency width only at a given wavelength (Δν = cΔλ/λ², physics.md A8 form 8.3): enter the centre wavelength first',
    },
  ],
  rateHz: fromUnits('rate', 'perS', ['perS', 'kperS']),
  timeS: fromUnits('time', 's', ['ps', 'ns', 'us', 'ms', 's']),
  powerW: fromUnits('power', 'W', ['uW', 'mW', 'W']),
  currentA: [plain('pA', 'pA', 1e-12), plain('nA', 'nA', 1e-9), plain('uA', 'µA', 1e-6), plain('mA', 'mA', 1e-3)],
  capacitanceF: [plain('pF', 'pF', 1e-12), plain('nF', 'nF', 1e-9)],
  noiseCurrentAPerRtHz: [plain('pA/rtHz', 'pA/√Hz', 1e-12), nep('nep-pW/rtHz', 'NEP pW/√Hz', 1e-12), nep('nep-W/rtHz', 'NEP W/√Hz', 1)],
  nepWPerRtHz: [plain('pW/rtHz', 'pW/√Hz', 1e-12), plain('W/rtHz', 'W/√Hz', 1)],
  responsivityAW: [plain('A/W', 'A/W', 1)],
  db: [plain('dB', 'dB', 1)],
  voltageV: [plain('V', 'V', 1)],
  angleDeg: [plain('deg', '°', 1)],
  temperatureC: [plain('C', '°C', 1)],
} as const satisfies Record<string, readonly UnitChoice[]>;

/** The stored value per typed unit under `draft`, or null when the conversion lacks its inputs. */
export function factorOf(unit: UnitChoice, draft: SpecDraft): number | null {
  return typeof unit.factor === 'number' ? unit.factor : unit.factor(draft);
}
