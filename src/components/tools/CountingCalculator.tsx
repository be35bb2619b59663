import { useMemo, useState } from 'react';
import { accidentalRate, bellThresholds, combinedJitter, deadTimeRate, FitInputError, windowCapture } from '../../lib/fit';
import { formatCount, formatFraction, formatSI } from '../../lib/units';
import { Plot } from './Plot';
import { parseQuantity, QuantityInput, ResultRow, type Quantity } from './QuantityInput';

const BELL_SRC = 'Garg & Mermin, Phys. Rev. D 35, 3831 (1987); Eberhard, Phys. Rev. A 47, R747 (1993) (physics.md 6.1–6.2)';
const ACC_SRC = 'physics.md 6.5–6.6: uncorrelated Poissonian background, full-width window';
const DEAD_SRC = 'Knoll, Radiation Detection and Measurement, 4th ed. (2010) ch. 4 (physics.md 6.7)';

const pctOf = (s: string) => {
  const v = Number(s.trim().replace(',', '.'));
  return s.trim() === '' || !Number.isFinite(v) || v <= 0 || v > 100 ? null : v / 100;
};

/** Two arms of a pair source, each with the same detector; the idler arm heralds the signal arm. */
function evaluate(p: { pairs: number; det: number; optical: number; dark: number; window: number; jitter: number; dead: number }) {
  const eta = p.det * p.optical;
  const trueSingles = p.pairs * eta + p.dark;
  const measuredSingles = deadTimeRate({ trueRate: trueSingles, deadTimeS: p.dead, model: 'non-paralyzable' });
  const jitter = combinedJitter([p.jitter, p.jitter]);
  const capture = windowCapture({ windowS: p.window, jitterFwhmS: jitter });
  const keep = measuredSingles / trueSingles;
  const trueCoincidences = p.pairs * eta * eta * capture * keep * keep;
  const accidentals = accidentalRate({ rate1: measuredSingles, rate2: measuredSingles, windowS: p.window });
  const car = accidentals > 0 ? trueCoincidences / accidentals : Infinity;
  const heralding = measuredSingles > p.dark * keep ? trueCoincidences / (measuredSingles - p.dark * keep) : 0;
  return { eta, measuredSingles, deadLoss: 1 - keep, jitter, capture, trueCoincidences, accidentals, car, heralding };
}

export default function CountingCalculator() {
  const [det, setDet] = useState('90');
  const [optical, setOptical] = useState('85');
  const [pairs, setPairs] = useState<Quantity<'rate'>>({ text: '1', unit: 'MperS' });
  const [dark, setDark] = useState<Quantity<'rate'>>({ text: '100', unit: 'perS' });
  const [win, setWin] = useState<Quantity<'time'>>({ text: '1', unit: 'ns' });
  const [jit, setJit] = useState<Quantity<'time'>>({ text: '50', unit: 'ps' });
  const [dead, setDead] = useState<Quantity<'time'>>({ text: '50', unit: 'ns' });
  const [carGoal, setCarGoal] = useState('100');

  const { errors, result } = useMemo(() => {
    const errors: Record<string, string> = {};
    const d = pctOf(det);
    const o = pctOf(optical);
    if (d === null) errors.det = 'Enter a percentage above 0 and at most 100.';
    if (o === null) errors.optical = 'Enter a percentage above 0 and at most 100.';
    const pr = parseQuantity('rate', pairs);
    if (pr === null || pr <= 0) errors.pairs = 'Enter the pair rate.';
    const dk = parseQuantity('rate', dark) ?? 0;
    const w = parseQuantity('time', win);
    if (w === null || w <= 0) errors.win = 'Enter the coincidence window (full width).';
    const j = parseQuantity('time', jit) ?? 0;
    const dt = parseQuantity('time', dead) ?? 0;
    const goal = Number(carGoal);
    if (Object.keys(errors).length) return { errors };
    try {
      const base = { pairs: pr!, det: d!, optical: o!, dark: dk, jitter: j, dead: dt };
      const r = evaluate({ ...base, window: w! });
      const curveX: number[] = [];
      const curveY: number[] = [];
      for (let i = 0; i <= 100; i++) {
        const wi = 10 ** (-11 + (i / 100) * 4);
        curveX.push(wi);
        curveY.push(evaluate({ ...base, window: wi }).car);
      }
      return {
        errors,
        result: { ...r, curveX, curveY, goal: Number.isFinite(goal) && goal > 0 ? goal : null, window: w!, thresholds: bellThresholds() },
      };
    } catch (e) {
      if (e instanceof FitInputError) return { errors: { [e.field]: e.message } };
      throw e;
    }
  }, [det, optical, pairs, dark, win, jit, dead, carGoal]);

  const pct = (label: string, id: string, v: string, set: (s: string) => void) => (
    <div className="mb-3">
      <label className="field-label" htmlFor={`ct-${id}`}>
        {label}
      </label>
      <div className="flex">
        <input
          id={`ct-${id}`}
          inputMode="decimal"
          className="field-input num rounded-r-none"
          value={v}
          onChange={(e) => set(e.target.value)}
          aria-invalid={errors[id] ? true : undefined}
        />
        <span className="rounded-r-sm border border-l-0 border-rule-strong bg-paper px-2 py-2 text-sm">%</span>
      </div>
      {errors[id] && <p className="field-error">{errors[id]}</p>}
    </div>
  );

  const mark = (ok: boolean) => (ok ? '✓ above' : '✗ below');

  return (
    <section className="sheet p-5" aria-labelledby="ct-h">
      <h2 id="ct-h" className="mb-1 text-lg font-semibold">
        Photon counting: heralding, accidentals, dead time
      </h2>
      <p className="mb-4 text-sm text-ink-soft">A pair source with one detector of this kind in each arm; CW, uncorrelated background.</p>
      <div className="grid gap-5 md:grid-cols-2">
        <div>
          {pct('Detector efficiency at your wavelength', 'det', det, setDet)}
          {pct('Your optical efficiency per arm (coupling, filters)', 'optical', optical, setOptical)}
          <QuantityInput label="Pair rate at the source" dimension="rate" value={pairs} onChange={setPairs} error={errors.pairs} />
          <QuantityInput label="Dark count rate" dimension="rate" units={['perS', 'kperS']} value={dark} onChange={setDark} />
          <QuantityInput
            label="Coincidence window (full width)"
            dimension="time"
            units={['ps', 'ns']}
            value={win}
            onChange={setWin}
            error={errors.win}
          />
          <QuantityInput label="Timing jitter per detector (FWHM)" dimension="time" units={['ps', 'ns']} value={jit} onChange={setJit} />
          <QuantityInput label="Dead time" dimension="time" units={['ns', 'us']} value={dead} onChange={setDead} />
          <div className="mb-3">
            <label className="field-label" htmlFor="ct-car">
              Goal: coincidence-to-accidental ratio
            </label>
            <input
              id="ct-car"
              inputMode="decimal"
              className="field-input num"
              value={carGoal}
              onChange={(e) => setCarGoal(e.target.value)}
            />
          </div>
        </div>
        <div aria-live="polite">
          {result ? (
            <>
              <p className="text-sm text-ink-soft">Heralding efficiency (Klyshko)</p>
              <p className="num text-4xl font-semibold" data-testid="ct-heralding">
                {formatFraction(result.heralding)}
              </p>
              <p className="mb-3 text-sm">
                {mark(result.heralding > result.thresholds.eberhard)} the Eberhard threshold 2/3 ·{' '}
                {mark(result.heralding > result.thresholds.chsh)} the CHSH threshold 82.8 %
              </p>
              <ResultRow
                label="Arm efficiency (detector × optical)"
                value={formatFraction(result.eta)}
                formula="η = η_det · η_opt"
                source={BELL_SRC}
              />
              <ResultRow
                label="Measured singles per arm"
                value={formatSI(result.measuredSingles, '/s')}
                formula="R_meas = R / (1 + R τ_d)"
                source={DEAD_SRC}
              />
              <ResultRow label="Lost to dead time" value={formatFraction(result.deadLoss)} formula="1 − R_meas/R" source={DEAD_SRC} />
              <ResultRow
                label="True coincidences"
                value={formatSI(result.trueCoincidences, '/s')}
                formula="C − A = R η² · erf(W / (2√2 σ))"
                source="physics.md 6.9 (Gaussian jitter in quadrature)"
              />
              <ResultRow label="Accidentals" value={formatSI(result.accidentals, '/s')} formula="A = N1 N2 τ_c" source={ACC_SRC} />
              <ResultRow
                label="CAR, (C − A)/A"
                value={formatCount(result.car)}
                formula="CAR = (C − A) / A"
                source={ACC_SRC}
                testId="ct-car"
              />
              {result.goal !== null && (
                <p className="mt-2 text-sm">
                  {result.car >= result.goal ? '✓ meets' : '✗ misses'} the CAR goal of {formatCount(result.goal)}
                  {result.capture < 0.95 &&
                    ` — the window keeps only ${formatFraction(result.capture)} of true coincidences with ${formatSI(result.jitter, 's')} combined jitter`}
                </p>
              )}
            </>
          ) : (
            <p className="notice">Fill in the numbers on the left.</p>
          )}
        </div>
      </div>
      {result && (
        <Plot
          title="Coincidence-to-accidental ratio against window width"
          x={result.curveX}
          series={[
            { label: 'CAR', values: result.curveY },
            ...(result.goal !== null
              ? [{ label: `goal ${result.goal}`, values: result.curveX.map(() => result.goal!), dashed: true, colour: '#9b2c2c' }]
              : []),
          ]}
          xLabel="window (s)"
          yLabel="CAR"
          logX
          logY
          markerX={result.window}
        />
      )}
    </section>
  );
}
