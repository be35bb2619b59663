import { useMemo, useState } from 'react';
import {
  buildUp,
  cavityLinewidth,
  finesse,
  finesseLowLoss,
  FitInputError,
  freeSpectralRange,
  gaussianMode,
  qualityFactor,
  resonantTransmission,
  storageTime,
} from '../../lib/fit';
import { formatCount, formatFraction, formatSI } from '../../lib/units';
import { Plot } from './Plot';
import { parseQuantity, QuantityInput, ResultRow, type Quantity } from './QuantityInput';

const HECHT = 'Hecht, Optics, 5th ed. (2017) §9.6 — standard finesse form (physics.md 1.3)';
const KOGELNIK = 'Kogelnik & Li, "Laser Beams and Resonators", Appl. Opt. 5, 1550 (1966) (physics.md A2)';

interface MirrorState {
  t: Quantity<'fraction'>;
  loss: Quantity<'fraction'>;
  roc: Quantity<'length'>;
  flat: boolean;
}

const initialMirror = (): MirrorState => ({
  t: { text: '2', unit: 'ppm' },
  loss: { text: '8', unit: 'ppm' },
  roc: { text: '1', unit: 'm' },
  flat: false,
});

type Errors = Record<string, string>;

function compute(wl: Quantity<'length'>, len: Quantity<'length'>, extra: Quantity<'fraction'>, m1: MirrorState, m2: MirrorState) {
  const errors: Errors = {};
  const need = <D extends 'length' | 'fraction'>(key: string, d: D, q: Quantity<D>, what: string) => {
    const v = parseQuantity(d, q);
    if (v === null) errors[key] = `Enter the ${what}.`;
    return v ?? NaN;
  };
  const wavelengthM = need('wl', 'length', wl, 'wavelength');
  const lengthM = need('len', 'length', len, 'cavity length');
  const extraLoss = parseQuantity('fraction', extra) ?? 0;
  const mirror = (m: MirrorState, n: string) => ({
    t: need(`${n}.t`, 'fraction', m.t, 'transmission'),
    a: need(`${n}.loss`, 'fraction', m.loss, 'loss'),
    roc: m.flat ? Infinity : need(`${n}.roc`, 'length', m.roc, 'radius of curvature'),
  });
  const a = mirror(m1, 'm1');
  const b = mirror(m2, 'm2');
  if (Object.keys(errors).length) return { errors };
  try {
    for (const [k, v] of [['m1', a] as const, ['m2', b] as const]) {
      if (v.t + v.a >= 1) errors[`${k}.t`] = 'Transmission plus loss must stay below 100 %.';
    }
    if (Object.keys(errors).length) return { errors };
    const r1 = 1 - a.t - a.a;
    const r2 = 1 - b.t - b.a;
    const F = finesse({ r1, r2, extraLoss });
    const FLow = finesseLowLoss({ t1: a.t, t2: b.t, a1: a.a, a2: b.a, extraLoss });
    const fsr = freeSpectralRange({ lengthM });
    const lw = cavityLinewidth({ lengthM, finesse: F });
    const tau = storageTime({ lengthM, finesse: F });
    const q = qualityFactor({ wavelengthM, linewidthHz: lw });
    const transmission = resonantTransmission({ t1: a.t, t2: b.t, extraLoss: a.a + b.a + extraLoss });
    const gain = buildUp({ t1: a.t, t2: b.t, extraLoss: a.a + b.a + extraLoss });
    const mode = gaussianMode({ lengthM, roc1M: a.roc, roc2M: b.roc, wavelengthM });
    const totalLoss = a.t + a.a + b.t + b.a + extraLoss;
    return {
      errors,
      result: {
        F,
        FLow,
        fsr,
        lw,
        tau,
        q,
        transmission,
        gain,
        mode,
        totalLoss,
        perMirrorLoss: (a.a + b.a) / 2,
        t1: a.t,
        t2: b.t,
        extraLoss,
        lengthM,
      },
    };
  } catch (e) {
    if (e instanceof FitInputError) return { errors: { [e.field]: e.message } };
    throw e;
  }
}

function MirrorFields({
  n,
  title,
  m,
  set,
  errors,
}: {
  n: string;
  title: string;
  m: MirrorState;
  set: (m: MirrorState) => void;
  errors: Errors;
}) {
  return (
    <fieldset className="rounded-md border border-rule p-3">
      <legend className="px-1 text-sm font-semibold">{title}</legend>
      <QuantityInput
        label="Transmission"
        dimension="fraction"
        units={['ppm', 'pct']}
        value={m.t}
        onChange={(t) => set({ ...m, t })}
        error={errors[`${n}.t`]}
      />
      <QuantityInput
        label="Loss (absorption + scatter)"
        dimension="fraction"
        units={['ppm', 'pct']}
        value={m.loss}
        onChange={(loss) => set({ ...m, loss })}
        error={errors[`${n}.loss`]}
      />
      <label className="mb-2 flex items-center gap-2 text-sm">
        <input type="checkbox" checked={m.flat} onChange={(e) => set({ ...m, flat: e.target.checked })} /> Flat mirror
      </label>
      {!m.flat && (
        <QuantityInput
          label="Radius of curvature"
          dimension="length"
          units={['mm', 'm']}
          value={m.roc}
          onChange={(roc) => set({ ...m, roc })}
          error={errors[`${n}.roc`]}
          hint="Concave toward the cavity."
        />
      )}
    </fieldset>
  );
}

export default function CavityCalculator() {
  const [wl, setWl] = useState<Quantity<'length'>>({ text: '852', unit: 'nm' });
  const [len, setLen] = useState<Quantity<'length'>>({ text: '5', unit: 'cm' });
  const [extra, setExtra] = useState<Quantity<'fraction'>>({ text: '0', unit: 'ppm' });
  const [m1, setM1] = useState(initialMirror);
  const [m2, setM2] = useState(initialMirror);
  const { errors, result } = useMemo(() => compute(wl, len, extra, m1, m2), [wl, len, extra, m1, m2]);

  const plot = useMemo(() => {
    if (!result) return null;
    const x: number[] = [];
    const ys: number[] = [];
    for (let i = 0; i <= 120; i++) {
      const lossPpm = 10 ** (-1 + (i / 120) * 4);
      x.push(lossPpm);
      ys.push(finesse({ r1: 1 - result.t1 - lossPpm * 1e-6, r2: 1 - result.t2 - lossPpm * 1e-6, extraLoss: result.extraLoss }));
    }
    return { x, ys, marker: Math.max(0.1, result.perMirrorLoss * 1e6) };
  }, [result]);

  return (
    <section className="sheet p-5" aria-labelledby="cavity-h">
      <h2 id="cavity-h" className="mb-1 text-lg font-semibold">
        Cavity: finesse, linewidth, mode
      </h2>
      <p className="mb-4 text-sm text-ink-soft">Two-mirror standing-wave cavity in vacuum. All losses are power fractions.</p>
      <div className="grid gap-5 md:grid-cols-2">
        <div>
          <QuantityInput
            label="Wavelength"
            dimension="length"
            units={['nm', 'um']}
            value={wl}
            onChange={setWl}
            error={errors.wl ?? errors.wavelengthM}
          />
          <QuantityInput
            label="Cavity length"
            dimension="length"
            units={['mm', 'cm', 'm']}
            value={len}
            onChange={setLen}
            error={errors.len ?? errors.lengthM}
          />
          <QuantityInput
            label="Extra round-trip loss"
            dimension="fraction"
            units={['ppm', 'pct']}
            value={extra}
            onChange={setExtra}
            error={errors.extraLoss}
            hint="Crystal, AR surfaces, clipping: anything not in the mirrors."
          />
          <div className="grid gap-3 sm:grid-cols-2">
            <MirrorFields n="m1" title="Mirror 1" m={m1} set={setM1} errors={errors} />
            <MirrorFields n="m2" title="Mirror 2" m={m2} set={setM2} errors={errors} />
          </div>
        </div>
        <div aria-live="polite">
          {result ? (
            <>
              <p className="text-sm text-ink-soft">Finesse</p>
              <p className="num text-4xl font-semibold" data-testid="cavity-finesse">
                {formatCount(result.F)}
              </p>
              <p className="mb-3 text-xs text-ink-faint">
                Low-loss approximation 2π/𝓛 = {formatCount(result.FLow)} with total round-trip loss {formatFraction(result.totalLoss)}
                {result.totalLoss > 1e-3 && ' — above 0.1 %, where 2π/𝓛 overestimates; the standard form above holds.'}
              </p>
              {!result.mode.stable && (
                <p className="notice notice-bad mb-3" role="alert" data-testid="cavity-stability">
                  {result.mode.marginal ? 'Marginal' : 'Unstable'}: g1·g2 = {result.mode.g1g2.toFixed(3)} for{' '}
                  {formatSI(result.lengthM, 'm')} with these radii. {result.mode.reason}
                </p>
              )}
              <ResultRow
                label="Free spectral range"
                value={formatSI(result.fsr, 'Hz')}
                formula="FSR = c / (2 n_g L)"
                source="physics.md 1.6 (linear cavity)"
              />
              <ResultRow
                label="Linewidth (FWHM)"
                value={formatSI(result.lw, 'Hz')}
                formula="Δν = FSR / ℱ"
                source="Saleh & Teich, Fundamentals of Photonics, 2nd ed. (2007) ch. 10 (physics.md 1.7)"
              />
              <ResultRow
                label="Storage time (intensity)"
                value={formatSI(result.tau, 's')}
                formula="τ = ℱ / (2π FSR)"
                source="physics.md 1.8; the field decays in 2τ"
              />
              <ResultRow label="Quality factor" value={formatCount(result.q)} formula="Q = ν₀ / Δν" source="physics.md 1.9" />
              <ResultRow
                label="Transmission on resonance"
                value={formatFraction(result.transmission)}
                formula="T_res = T1 T2 √(1−L) / (1 − √ρ)²"
                source="physics.md 1.12 (mode-matched)"
              />
              <ResultRow
                label="Power build-up"
                value={formatCount(result.gain)}
                formula="P_circ/P_in = T1 / (1 − √ρ)²"
                source="physics.md 1.13"
              />
              <ResultRow
                label="Finesse, standard form"
                value={formatCount(result.F, 6)}
                formula="ℱ = π ρ^¼ / (1 − √ρ), ρ = R1 R2 (1 − L_rt)"
                source={HECHT}
              />
              {result.mode.stable && (
                <>
                  <ResultRow
                    label="g1, g2"
                    value={`${result.mode.g1.toFixed(4)}, ${result.mode.g2.toFixed(4)}`}
                    formula="g = 1 − L/R"
                    source={KOGELNIK}
                  />
                  <ResultRow
                    label="Waist radius w₀"
                    value={formatSI(result.mode.w0M!, 'm')}
                    formula="w₀² = (λL/π) √[g1g2(1−g1g2)/(g1+g2−2g1g2)²]"
                    source={KOGELNIK}
                    testId="cavity-waist"
                  />
                  <ResultRow
                    label="Spot on mirror 1 / 2"
                    value={`${formatSI(result.mode.w1M!, 'm')} / ${formatSI(result.mode.w2M!, 'm')}`}
                    formula="w1² = (λL/π) √[g2/(g1(1−g1g2))]"
                    source={KOGELNIK}
                  />
                  <ResultRow
                    label="Transverse-mode spacing"
                    value={formatSI(result.mode.transverseModeSpacingHz!, 'Hz')}
                    formula="Δν_T = FSR ψ/π, ψ = arccos(±√(g1g2))"
                    source={KOGELNIK}
                  />
                </>
              )}
            </>
          ) : (
            <p className="notice">Fill in the numbers on the left to see the finesse.</p>
          )}
        </div>
      </div>
      {plot && (
        <Plot
          title="Finesse against mirror loss (both mirrors, transmissions as entered)"
          x={plot.x}
          series={[{ label: 'finesse', values: plot.ys }]}
          xLabel="loss per mirror (ppm)"
          yLabel="finesse"
          logX
          logY
          markerX={plot.marker}
        />
      )}
    </section>
  );
}
