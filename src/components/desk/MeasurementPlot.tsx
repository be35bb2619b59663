import { memo, useMemo } from 'react';
import type { EfficiencyCurveData, MeasurementData, RingdownData, SpectrumData } from '../../lib/measurements';
import { THIN } from '../../lib/units';
import { Plot, type PlotProps } from '../tools/Plot';

const PREFIXES: [number, string][] = [
  [1, ''],
  [1e-3, 'm'],
  [1e-6, 'µ'],
  [1e-9, 'n'],
  [1e-12, 'p'],
];

function prefixFor(x: number): [number, string] {
  const a = Math.abs(x);
  return PREFIXES.find(([f]) => a >= f * 0.9995) ?? (PREFIXES[PREFIXES.length - 1] as [number, string]);
}

function grouped(text: string): string {
  const [int, frac] = text.split('.');
  const g = (int ?? '').replace(/\B(?=(\d{3})+(?!\d))/g, THIN);
  return frac === undefined ? g : `${g}.${frac}`;
}

/** "20.03 ± 0.16 µs": the expanded uncertainty to two significant digits, the value to the same place. */
export function formatEstimate(value: number, expanded: number, unit: string, scale = 1): string {
  const v = value * scale;
  const u = expanded * scale;
  const [f, p] = unit === '' || unit === 'ppm' ? [1, ''] : prefixFor(v);
  const decimals = u > 0 ? Math.min(6, Math.max(0, 1 - Math.floor(Math.log10(u / f)))) : 3;
  const number = `${grouped((v / f).toFixed(decimals))} ± ${grouped((u / f).toFixed(decimals))}`;
  return unit === '' ? number : `${number}${THIN}${p}${unit}`;
}

const positive = (x: number) => (x > 0 && Number.isFinite(x) ? x : null);

function ringdownPlot(d: RingdownData): PlotProps {
  const [f, p] = prefixFor(d.fit.tauS);
  const { amplitude, offset, tauS, fitStartS } = d.fit;
  return {
    title: 'Ring-down trace and fitted decay',
    x: d.points.map((pt) => pt.timeS / f),
    xLabel: `time (${p}s)`,
    yLabel: 'intensity (log)',
    logY: true,
    series: [
      { label: 'measured', values: d.points.map((pt) => positive(pt.intensity)) },
      {
        label: 'fit A·exp(−t/τ) + B',
        dashed: true,
        values: d.points.map((pt) => (pt.timeS < fitStartS ? null : positive(amplitude * Math.exp(-(pt.timeS - fitStartS) / tauS) + offset))),
      },
    ],
  };
}

/** Power fractions span decades (a few ppm of T next to a dip): log when every value is positive and they spread over 10×. */
function wantsLog(values: number[]): boolean {
  const min = Math.min(...values);
  return min > 0 && Math.max(...values) / min > 10;
}

function spectrumPlot(d: SpectrumData): PlotProps {
  const x = d.points.map((pt) => pt.wavelengthNm);
  if (d.quantity === 'reflectance') {
    return { title: 'Reflectance spectrum', x, xLabel: 'wavelength (nm)', yLabel: 'R (%)', series: [{ label: 'R', values: d.points.map((pt) => pt.reflectancePpm / 1e4) }] };
  }
  const t = d.points.map((pt) => pt.transmissionPpm);
  if (d.quantity === 'transmission') {
    return { title: 'Transmission spectrum', x, xLabel: 'wavelength (nm)', yLabel: 'T (ppm)', logY: wantsLog(t), series: [{ label: 'T', values: t }] };
  }
  const loss = d.points.map((pt) => pt.lossPpm);
  return {
    title: 'Transmission and loss spectrum',
    x,
    xLabel: 'wavelength (nm)',
    yLabel: 'ppm',
    logY: wantsLog([...t, ...loss]),
    series: [
      { label: 'transmission', values: t },
      { label: 'loss', values: loss },
    ],
  };
}

function efficiencyPlot(d: EfficiencyCurveData): PlotProps {
  return {
    title: 'Efficiency curve',
    x: d.points.map((pt) => pt.wavelengthNm),
    xLabel: 'wavelength (nm)',
    yLabel: 'efficiency (%)',
    series: [{ label: 'efficiency', values: d.points.map((pt) => pt.efficiency * 100) }],
  };
}

function plotFor(d: MeasurementData): PlotProps {
  if (d.kind === 'ringdown') return ringdownPlot(d);
  if (d.kind === 'spectrum') return spectrumPlot(d);
  return efficiencyPlot(d);
}

function RingdownFigures({ d }: { d: RingdownData }) {
  const fig = d.figures;
  return (
    <dl className="mt-2 grid grid-cols-[auto_minmax(0,1fr)] gap-x-3 gap-y-0.5 text-sm">
      <dt className="text-ink-soft">Decay time τ</dt>
      <dd className="num font-semibold" data-testid="ringdown-tau">
        {formatEstimate(d.fit.tauS, 2 * d.fit.tauUncertaintyS, 's')}
      </dd>
      {fig && (
        <>
          <dt className="text-ink-soft">Loss per mirror</dt>
          <dd className="num">{formatEstimate(fig.perMirrorLoss.value, 2 * fig.perMirrorLoss.uncertainty, 'ppm', 1e6)}</dd>
          <dt className="text-ink-soft">Finesse</dt>
          <dd className="num" data-testid="ringdown-finesse">
            {formatEstimate(fig.finesse.value, 2 * fig.finesse.uncertainty, '')}
          </dd>
          <dt className="text-ink-soft">Cavity length</dt>
          <dd className="num">{`${Number((fig.lengthM * 1e3).toPrecision(4))}${THIN}mm`}</dd>
        </>
      )}
    </dl>
  );
}

/** A measurement file as a plot with its fit, the measured figures in words beside it. */
export const MeasurementPlot = memo(function MeasurementPlot({ data }: { data: MeasurementData }) {
  const props = useMemo(() => plotFor(data), [data]);
  return (
    <div>
      <Plot {...props} height={200} />
      {data.kind === 'ringdown' && <RingdownFigures d={data} />}
      {data.notes.length > 0 && (
        <ul className="mt-1 list-disc pl-5 text-xs text-ink-faint">
          {data.notes.map((n) => (
            <li key={n}>{n}</li>
          ))}
        </ul>
      )}
    </div>
  );
});
