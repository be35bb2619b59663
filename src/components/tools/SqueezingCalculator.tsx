import { useMemo, useState } from 'react';
import { electronicEfficiency, FitInputError, requiredDetectorEfficiency, sourceSlopes, type SqueezingSource } from '../../lib/fit';
import { formatDb, formatFraction } from '../../lib/units';
import { Plot } from './Plot';
import { parseQuantity, QuantityInput, ResultRow, type Quantity } from './QuantityInput';

const LOSS_SRC = 'Beam-splitter loss model, physics.md 5.1; Wu et al., J. Opt. Soc. Am. B 4, 1465 (1987)';
const OPO_SRC = 'Collett & Gardiner, Phys. Rev. A 30, 1386 (1984); Polzik et al., Appl. Phys. B 55, 279 (1992) (physics.md 5.6–5.7)';
const EL_SRC = 'Appel et al., "Electronic noise in optical homodyne tomography", Phys. Rev. A 75, 035802 (2007) (physics.md 5.5c)';

type Mode = 'initial' | 'opo';
const num = (s: string) => {
  const v = Number(s.trim().replace(',', '.'));
  return s.trim() === '' || !Number.isFinite(v) ? null : v;
};

function measured(source: SqueezingSource, eta: number, phase: number) {
  const k = sourceSlopes({ source, phaseNoiseRad: phase });
  const vMinus = 1 - eta * k.squeezed;
  const vPlus = 1 + eta * k.antiSqueezed;
  return { squeezedDb: -10 * Math.log10(vMinus), antiSqueezedDb: 10 * Math.log10(vPlus) };
}

export default function SqueezingCalculator() {
  const [mode, setMode] = useState<Mode>('opo');
  const [initialDb, setInitialDb] = useState('15');
  const [pump, setPump] = useState('0.85');
  const [opoLw, setOpoLw] = useState<Quantity<'frequency'>>({ text: '60', unit: 'MHz' });
  const [sideband, setSideband] = useState<Quantity<'frequency'>>({ text: '5', unit: 'MHz' });
  const [escape, setEscape] = useState('98');
  const [prop, setProp] = useState('98');
  const [vis, setVis] = useState('99');
  const [qe, setQe] = useState('99');
  const [clearance, setClearance] = useState('20');
  const [phase, setPhase] = useState<Quantity<'angle'>>({ text: '10', unit: 'mrad' });
  const [goal, setGoal] = useState('10');

  const out = useMemo(() => {
    const errors: Record<string, string> = {};
    const pct = (key: string, s: string) => {
      const v = num(s);
      if (v === null || v <= 0 || v > 100) errors[key] = 'Enter a percentage above 0 and at most 100.';
      return (v ?? 100) / 100;
    };
    const esc = pct('escape', escape);
    const pr = pct('propagation', prop);
    const vv = pct('visibility', vis);
    const q = pct('qe', qe);
    const c = num(clearance);
    if (c === null || c <= 0) errors.clearance = 'Enter the clearance in dB (shot noise over dark noise, as seen on the analyser).';
    const th = parseQuantity('angle', phase) ?? 0;
    const g = num(goal);
    if (g === null || g <= 0) errors.goal = 'Enter the squeezing you need, in dB.';
    let source: SqueezingSource | null = null;
    let omegaOverGamma = 0;
    if (mode === 'initial') {
      const i = num(initialDb);
      if (i === null || i <= 0) errors.initialDb = 'Enter the initial squeezing in dB.';
      else source = { initialDb: i };
    } else {
      const x = num(pump);
      const lw = parseQuantity('frequency', opoLw);
      const f = parseQuantity('frequency', sideband) ?? 0;
      if (x === null || x < 0 || x >= 1) errors.pump = 'The pump parameter x = √(P/P_thr) lies in [0, 1).';
      if (lw === null || lw <= 0) errors.opoLw = 'Enter the OPO linewidth (FWHM).';
      if (!errors.pump && !errors.opoLw) {
        omegaOverGamma = f / (lw! / 2);
        source = { pumpParameter: x!, omegaOverGamma };
      }
    }
    if (Object.keys(errors).length || !source) return { errors };
    try {
      const el = electronicEfficiency({ clearanceDb: c! });
      const eta = esc * pr * vv * vv * q * el;
      const now = measured(source, eta, th);
      const req = requiredDetectorEfficiency({
        targetDb: g!,
        ...('initialDb' in source ? { initialDb: source.initialDb } : { opo: source }),
        phaseNoiseRad: th,
        escape: esc,
        propagation: pr,
        visibility: vv,
        clearanceDb: c!,
      });
      const curveX: number[] = [];
      const curveY: (number | null)[] = [];
      for (let i = 0; i <= 100; i++) {
        const qx = 0.5 + (i / 100) * 0.5;
        curveX.push(qx * 100);
        const m = measured(source, esc * pr * vv * vv * qx * el, th).squeezedDb;
        curveY.push(Number.isFinite(m) ? m : null);
      }
      let spectrum: { x: number[]; y: (number | null)[]; anti: (number | null)[] } | null = null;
      if (mode === 'opo' && 'pumpParameter' in source) {
        const lw = parseQuantity('frequency', opoLw)!;
        const x: number[] = [];
        const y: (number | null)[] = [];
        const anti: (number | null)[] = [];
        for (let i = 0; i <= 120; i++) {
          const f = 10 ** (4 + (i / 120) * (Math.log10(lw * 5) - 4));
          x.push(f);
          const m = measured({ pumpParameter: source.pumpParameter, omegaOverGamma: f / (lw / 2) }, eta, th);
          y.push(m.squeezedDb);
          anti.push(m.antiSqueezedDb);
        }
        spectrum = { x, y, anti };
      }
      return { errors, result: { el, eta, now, req, goal: g!, curveX, curveY, spectrum, qe: q, omegaOverGamma } };
    } catch (e) {
      if (e instanceof FitInputError) return { errors: { [e.field]: e.message } };
      throw e;
    }
  }, [mode, initialDb, pump, opoLw, sideband, escape, prop, vis, qe, clearance, phase, goal]);
  const { errors, result } = out;

  const pctField = (label: string, value: string, set: (s: string) => void, key: string, hint?: string) => (
    <div className="mb-3">
      <label className="field-label" htmlFor={`sq-${key}`}>
        {label}
      </label>
      <div className="flex">
        <input
          id={`sq-${key}`}
          inputMode="decimal"
          className="field-input num rounded-r-none"
          value={value}
          onChange={(e) => set(e.target.value)}
          aria-invalid={errors[key] ? true : undefined}
        />
        <span className="rounded-r-sm border border-l-0 border-rule-strong bg-paper px-2 py-2 text-sm">
          {key === 'clearance' || key === 'goal' || key === 'initialDb' ? 'dB' : key === 'pump' ? 'x' : '%'}
        </span>
      </div>
      {errors[key] ? <p className="field-error">{errors[key]}</p> : hint ? <p className="field-hint">{hint}</p> : null}
    </div>
  );

  return (
    <section className="sheet p-5" aria-labelledby="sq-h">
      <h2 id="sq-h" className="mb-1 text-lg font-semibold">
        Squeezing: loss budget and detector efficiency
      </h2>
      <p className="mb-4 text-sm text-ink-soft">
        Homodyne detection of squeezed vacuum. Total efficiency = escape · propagation · visibility² · QE · electronic.
      </p>
      <div className="grid gap-5 md:grid-cols-2">
        <div>
          <fieldset className="mb-3">
            <legend className="field-label">Source</legend>
            <label className="mr-4 text-sm">
              <input type="radio" name="sq-mode" checked={mode === 'opo'} onChange={() => setMode('opo')} /> OPO below threshold
            </label>
            <label className="text-sm">
              <input type="radio" name="sq-mode" checked={mode === 'initial'} onChange={() => setMode('initial')} /> Initial squeezing
            </label>
          </fieldset>
          {mode === 'initial' ? (
            pctField('Initial squeezing', initialDb, setInitialDb, 'initialDb', 'Pure state assumed: anti-squeezing = squeezing.')
          ) : (
            <>
              {pctField('Pump parameter', pump, setPump, 'pump', 'x = √(P_pump / P_threshold)')}
              <QuantityInput
                label="OPO linewidth (FWHM)"
                dimension="frequency"
                units={['kHz', 'MHz']}
                value={opoLw}
                onChange={setOpoLw}
                error={errors.opoLw}
              />
              <QuantityInput
                label="Sideband frequency"
                dimension="frequency"
                units={['kHz', 'MHz']}
                value={sideband}
                onChange={setSideband}
              />
            </>
          )}
          {pctField('Escape efficiency', escape, setEscape, 'escape')}
          {pctField('Propagation efficiency', prop, setProp, 'propagation')}
          {pctField('Fringe visibility', vis, setVis, 'visibility')}
          {pctField('Detector quantum efficiency', qe, setQe, 'qe')}
          {pctField('Dark-noise clearance', clearance, setClearance, 'clearance', 'Shot noise over dark noise as seen on the analyser.')}
          <QuantityInput label="Phase noise (fixed offset)" dimension="angle" units={['mrad', 'deg']} value={phase} onChange={setPhase} />
          {pctField('Goal: measured squeezing', goal, setGoal, 'goal')}
        </div>
        <div aria-live="polite">
          {result ? (
            <>
              <p className="text-sm text-ink-soft">Measured squeezing</p>
              <p className="num text-4xl font-semibold" data-testid="sq-measured">
                {Number.isFinite(result.now.squeezedDb) ? formatDb(result.now.squeezedDb) : 'none'}
              </p>
              <p className="mb-3 text-sm">
                {result.now.squeezedDb >= result.goal ? (
                  <span className="text-good">
                    ✓ meets the {result.goal} dB goal, headroom {formatDb(result.now.squeezedDb - result.goal)}
                  </span>
                ) : (
                  <span className="text-bad">
                    ✗ below the {result.goal} dB goal by {formatDb(result.goal - result.now.squeezedDb)}
                  </span>
                )}
              </p>
              <ResultRow
                label="Anti-squeezing"
                value={formatDb(result.now.antiSqueezedDb)}
                formula={mode === 'opo' ? 'V± = 1 ± η·4x/[(1 ∓ x)² + (Ω/γ)²], rotated by θ' : 'V = η·V₀ + 1 − η, rotated by θ'}
                source={mode === 'opo' ? OPO_SRC : LOSS_SRC}
              />
              <ResultRow
                label="Total efficiency η"
                value={formatFraction(result.eta)}
                formula="η = η_esc · η_prop · V² · η_QE · η_el"
                source="physics.md 5.5"
              />
              <ResultRow label="Electronic efficiency" value={formatFraction(result.el)} formula="η_el = 1 − 10^(−C/10)" source={EL_SRC} />
              {mode === 'opo' && (
                <ResultRow
                  label="Ω/γ (sideband over cavity half-width)"
                  value={result.omegaOverGamma.toFixed(3)}
                  formula="Ω/γ = f / (Δν_FWHM / 2)"
                  source="physics.md 5.6a"
                />
              )}
              <ResultRow
                label={`Detector QE needed for ${result.goal} dB`}
                value={result.req.feasible ? formatFraction(result.req.efficiency) : 'not reachable'}
                formula="η_QE,req = η_req / (η_esc · η_prop · V² · η_el)"
                source="physics.md 12.4 with 5.4 or 5.6–5.7"
                testId="sq-required-qe"
              />
              {!result.req.feasible && <p className="notice notice-warn mt-2 text-sm">{result.req.reason}</p>}
            </>
          ) : (
            <p className="notice">Fill in the numbers on the left.</p>
          )}
        </div>
      </div>
      {result && (
        <div className="grid gap-4 md:grid-cols-2">
          <Plot
            title="Measured squeezing against detector efficiency"
            x={result.curveX}
            series={[
              { label: 'measured (dB)', values: result.curveY },
              { label: `goal ${result.goal} dB`, values: result.curveX.map(() => result.goal), dashed: true, colour: '#9b2c2c' },
            ]}
            xLabel="quantum efficiency (%)"
            yLabel="squeezing (dB)"
            markerX={result.qe * 100}
          />
          {result.spectrum && (
            <Plot
              title="OPO spectrum against sideband frequency"
              x={result.spectrum.x}
              series={[
                { label: 'squeezing (dB)', values: result.spectrum.y },
                { label: 'anti-squeezing (dB)', values: result.spectrum.anti },
              ]}
              xLabel="sideband frequency (Hz)"
              yLabel="dB"
              logX
              markerX={parseQuantity('frequency', sideband) ?? undefined}
            />
          )}
        </div>
      )}
      <p className="mt-3 text-xs text-ink-faint">
        Linearised below-threshold model, single spatial mode, no pump noise or detuning; detection well inside the detector bandwidth.
      </p>
    </section>
  );
}
