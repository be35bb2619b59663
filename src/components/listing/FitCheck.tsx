import { useMemo, useState } from 'react';
import {
  evaluateCavityGoal,
  evaluateCountingGoal,
  evaluateLaserGoal,
  evaluateSqueezingGoal,
  FitInputError,
  type CavityGoal,
  type CountingGoal,
  type GoalResult,
  type LaserGoal,
  type SqueezingGoal,
} from '../../lib/fit';
import type { FitCandidate } from '../../lib/listings/fit-input';
import { FitReport } from './FitReport';

type Values = Record<string, string>;
const n = (v: Values, k: string): number => Number((v[k] ?? '').trim().replace(',', '.'));
const opt = (v: Values, k: string): number | undefined => ((v[k] ?? '').trim() === '' ? undefined : n(v, k));

interface FieldSpec {
  key: string;
  label: string;
  unit?: string;
  options?: { value: string; label: string }[];
  show?: (v: Values) => boolean;
}

interface Mode {
  fields: FieldSpec[];
  defaults: Values;
  label: (v: Values) => string;
  run: (v: Values) => GoalResult;
}

function cavityMode(c: Extract<FitCandidate, { kind: 'mirror' }>, quantity: number): Mode {
  return {
    // a default length the radii can hold: 50 mm, or shorter than the mirrors' radius
    defaults: {
      wavelengthNm: String(c.spec.designWavelengthNm),
      lengthMm: String(c.spec.rocMm ? Math.min(50, Math.round(c.spec.rocMm * 0.8)) : 50),
      targetKind: 'finesse',
      target: '100000',
      configuration: quantity >= 2 ? 'pair' : 'with-own-mirror',
      ownR: '99.999',
      ownRocMm: '',
      extraLossPpm: '0',
      atomNm: '',
      atomGammaMHz: '',
    },
    fields: [
      { key: 'wavelengthNm', label: 'Wavelength', unit: 'nm' },
      { key: 'lengthMm', label: 'Cavity length', unit: 'mm' },
      {
        key: 'targetKind',
        label: 'Goal',
        options: [
          { value: 'finesse', label: 'finesse at least' },
          { value: 'linewidth', label: 'linewidth at most (kHz)' },
          { value: 'storage-time', label: 'storage time at least (µs)' },
        ],
      },
      { key: 'target', label: 'Goal value' },
      {
        key: 'configuration',
        label: 'Mirrors',
        options: [
          ...(quantity >= 2 ? [{ value: 'pair', label: 'a pair from this listing' }] : []),
          { value: 'with-own-mirror', label: 'one of these with my own mirror' },
        ],
      },
      { key: 'ownR', label: 'My mirror: reflectivity', unit: '%', show: (v) => v.configuration === 'with-own-mirror' },
      {
        key: 'ownRocMm',
        label: 'My mirror: radius of curvature (empty = flat)',
        unit: 'mm',
        show: (v) => v.configuration === 'with-own-mirror',
      },
      { key: 'extraLossPpm', label: 'Extra round-trip loss', unit: 'ppm' },
      { key: 'atomNm', label: 'Atom line (optional): wavelength', unit: 'nm' },
      { key: 'atomGammaMHz', label: 'Atom line: natural linewidth Γ/2π', unit: 'MHz' },
    ],
    label: (v) =>
      v.targetKind === 'finesse' ? 'Predicted finesse' : v.targetKind === 'linewidth' ? 'Predicted linewidth' : 'Predicted storage time',
    run: (v) => {
      const t = n(v, 'target');
      const goal: CavityGoal = {
        wavelengthNm: n(v, 'wavelengthNm'),
        lengthM: n(v, 'lengthMm') / 1000,
        target:
          v.targetKind === 'finesse'
            ? { kind: 'finesse', value: t }
            : v.targetKind === 'linewidth'
              ? { kind: 'linewidth', hz: t * 1e3 }
              : { kind: 'storage-time', s: t * 1e-6 },
        configuration: v.configuration === 'pair' ? 'pair' : 'with-own-mirror',
        extraLossPpm: opt(v, 'extraLossPpm') ?? 0,
        ...(v.configuration === 'with-own-mirror'
          ? { ownMirror: { reflectivity: n(v, 'ownR') / 100, rocMm: opt(v, 'ownRocMm') ?? null } }
          : {}),
        ...(opt(v, 'atomNm') && opt(v, 'atomGammaMHz')
          ? { atom: { wavelengthNm: n(v, 'atomNm'), gammaHz: n(v, 'atomGammaMHz') * 1e6 } }
          : {}),
      };
      return evaluateCavityGoal(goal, c.spec);
    },
  };
}

function squeezingMode(c: Extract<FitCandidate, { kind: 'photodiode' }>): Mode {
  return {
    defaults: {
      wavelengthNm: String(c.spec.wavelengthNm ?? 1550),
      targetDb: '10',
      sidebandMHz: '5',
      sourceKind: 'opo',
      initialDb: '15',
      pump: '0.8',
      opoLwMHz: '60',
      escape: '98',
      propagation: '98',
      visibility: '99',
      loMw: '5',
      phaseMrad: '10',
    },
    fields: [
      { key: 'wavelengthNm', label: 'Wavelength', unit: 'nm' },
      { key: 'targetDb', label: 'Goal: measured squeezing', unit: 'dB' },
      { key: 'sidebandMHz', label: 'Sideband frequency', unit: 'MHz' },
      {
        key: 'sourceKind',
        label: 'Source',
        options: [
          { value: 'opo', label: 'OPO (pump parameter, linewidth)' },
          { value: 'initial', label: 'initial squeezing' },
        ],
      },
      { key: 'initialDb', label: 'Initial squeezing', unit: 'dB', show: (v) => v.sourceKind === 'initial' },
      { key: 'pump', label: 'Pump parameter x', show: (v) => v.sourceKind === 'opo' },
      { key: 'opoLwMHz', label: 'OPO linewidth (FWHM)', unit: 'MHz', show: (v) => v.sourceKind === 'opo' },
      { key: 'escape', label: 'Escape efficiency', unit: '%' },
      { key: 'propagation', label: 'Propagation efficiency', unit: '%' },
      { key: 'visibility', label: 'Fringe visibility', unit: '%' },
      { key: 'loMw', label: 'Local-oscillator power', unit: 'mW' },
      { key: 'phaseMrad', label: 'Phase noise', unit: 'mrad' },
    ],
    label: () => 'Predicted measured squeezing',
    run: (v) => {
      const goal: SqueezingGoal = {
        wavelengthNm: n(v, 'wavelengthNm'),
        targetDb: n(v, 'targetDb'),
        sidebandHz: n(v, 'sidebandMHz') * 1e6,
        source:
          v.sourceKind === 'initial'
            ? { kind: 'initial', initialDb: n(v, 'initialDb') }
            : { kind: 'opo', pumpParameter: n(v, 'pump'), linewidthHz: n(v, 'opoLwMHz') * 1e6 },
        escapeEfficiency: n(v, 'escape') / 100,
        propagationEfficiency: n(v, 'propagation') / 100,
        visibility: n(v, 'visibility') / 100,
        loPowerW: n(v, 'loMw') / 1000,
        phaseNoiseRad: (opt(v, 'phaseMrad') ?? 0) / 1000,
      };
      return evaluateSqueezingGoal(goal, c.spec);
    },
  };
}

function countingMode(c: Extract<FitCandidate, { kind: 'counter' }>): Mode {
  return {
    defaults: {
      wavelengthNm: String(c.spec.wavelengthNm ?? 1550),
      targetKind: 'eberhard',
      heralding: '70',
      optical: '90',
      rateKHz: '100',
      windowNs: '1',
      carMin: '100',
    },
    fields: [
      { key: 'wavelengthNm', label: 'Wavelength', unit: 'nm' },
      {
        key: 'targetKind',
        label: 'Goal',
        options: [
          { value: 'eberhard', label: 'Bell test, Eberhard (2/3)' },
          { value: 'chsh', label: 'Bell test, CHSH (82.8 %)' },
          { value: 'heralding', label: 'heralding efficiency at least' },
        ],
      },
      { key: 'heralding', label: 'Heralding efficiency', unit: '%', show: (v) => v.targetKind === 'heralding' },
      { key: 'optical', label: 'Your optical efficiency per arm', unit: '%' },
      { key: 'rateKHz', label: 'Photon rate at each detector', unit: 'k/s' },
      { key: 'windowNs', label: 'Coincidence window (full width)', unit: 'ns' },
      { key: 'carMin', label: 'Coincidence-to-accidental ratio at least' },
    ],
    label: () => 'Limiting figure',
    run: (v) => {
      const goal: CountingGoal = {
        wavelengthNm: n(v, 'wavelengthNm'),
        target:
          v.targetKind === 'heralding'
            ? { kind: 'heralding', efficiency: n(v, 'heralding') / 100 }
            : { kind: 'bell', test: v.targetKind === 'chsh' ? 'chsh' : 'eberhard' },
        opticalEfficiency: n(v, 'optical') / 100,
        ...(opt(v, 'rateKHz') ? { countRateHz: n(v, 'rateKHz') * 1e3 } : {}),
        ...(opt(v, 'windowNs') ? { coincidenceWindowS: n(v, 'windowNs') * 1e-9 } : {}),
        ...(opt(v, 'carMin') ? { carMin: n(v, 'carMin') } : {}),
      };
      return evaluateCountingGoal(goal, c.spec);
    },
  };
}

function laserMode(c: Extract<FitCandidate, { kind: 'laser' }>): Mode {
  return {
    defaults: { wavelengthNm: String(c.spec.centreWavelengthNm), maxLinewidthKHz: '100', minPowerMw: '10' },
    fields: [
      { key: 'wavelengthNm', label: 'Wavelength', unit: 'nm' },
      { key: 'maxLinewidthKHz', label: 'Linewidth at most', unit: 'kHz' },
      { key: 'minPowerMw', label: 'Power at least', unit: 'mW' },
    ],
    label: () => 'Limiting figure',
    run: (v) => {
      const goal: LaserGoal = {
        wavelength: { kind: 'fixed', nm: n(v, 'wavelengthNm') },
        ...(opt(v, 'maxLinewidthKHz') ? { coherence: { kind: 'linewidth', maxHz: n(v, 'maxLinewidthKHz') * 1e3 } } : {}),
        ...(opt(v, 'minPowerMw') ? { minPowerW: n(v, 'minPowerMw') / 1000 } : {}),
      };
      return evaluateLaserGoal(goal, c.spec);
    },
  };
}

/** "Check against my setup": the buyer's goal, evaluated in the browser as they type. */
export default function FitCheck({ candidate, quantity }: { candidate: FitCandidate; quantity: number }) {
  const mode = useMemo(() => {
    switch (candidate.kind) {
      case 'mirror':
        return cavityMode(candidate, quantity);
      case 'photodiode':
        return squeezingMode(candidate);
      case 'counter':
        return countingMode(candidate);
      case 'laser':
        return laserMode(candidate);
      default:
        return null;
    }
  }, [candidate, quantity]);
  const [values, setValues] = useState<Values>(mode?.defaults ?? {});
  const outcome = useMemo(() => {
    if (!mode) return null;
    try {
      return { result: mode.run(values) };
    } catch (e) {
      if (e instanceof FitInputError) return { error: `Check ${e.field}: ${e.message.replace(`${e.field}: `, '')}` };
      throw e;
    }
  }, [mode, values]);
  if (!mode) return null;
  return (
    <div className="grid gap-4 md:grid-cols-2">
      <div>
        {mode.fields
          .filter((f) => !f.show || f.show(values))
          .map((f) => (
            <div className="mb-2.5" key={f.key}>
              <label className="field-label" htmlFor={`fc-${f.key}`}>
                {f.label}
              </label>
              {f.options ? (
                <select
                  id={`fc-${f.key}`}
                  className="field-input"
                  value={values[f.key]}
                  onChange={(e) => setValues({ ...values, [f.key]: e.target.value })}
                >
                  {f.options.map((o) => (
                    <option key={o.value} value={o.value}>
                      {o.label}
                    </option>
                  ))}
                </select>
              ) : (
                <div className="flex">
                  <input
                    id={`fc-${f.key}`}
                    inputMode="decimal"
                    className={`field-input num ${f.unit ? 'rounded-r-none' : ''}`}
                    value={values[f.key] ?? ''}
                    onChange={(e) => setValues({ ...values, [f.key]: e.target.value })}
                  />
                  {f.unit && <span className="rounded-r-sm border border-l-0 border-rule-strong bg-paper px-2 py-2 text-sm">{f.unit}</span>}
                </div>
              )}
            </div>
          ))}
      </div>
      <div aria-live="polite">
        {outcome && 'error' in outcome ? (
          <p className="notice notice-bad">{outcome.error}</p>
        ) : outcome ? (
          <FitReport result={outcome.result} figureLabel={mode.label(values)} />
        ) : null}
      </div>
    </div>
  );
}
