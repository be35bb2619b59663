import type { MeasurementData } from '../../lib/measurements/types';
import { formatCount, formatSI } from '../../lib/units';
import { Plot } from '../tools/Plot';

/** A measurement file drawn with its fit: ring-down on a log axis with the fitted decay, spectra and efficiency curves against wavelength. */
export default function MeasurementPlot({ data, filename }: { data: MeasurementData; filename: string }) {
  if (data.kind === 'ringdown') {
    const { fit, figures } = data;
    const t = data.points.map((p) => p.timeS * 1e6);
    const model = (timeS: number) =>
      timeS < fit.fitStartS ? null : fit.amplitude * Math.exp(-(timeS - fit.fitStartS) / fit.tauS) + fit.offset;
    return (
      <div data-testid="measurement-ringdown">
        <p className="text-sm">
          Ring-down fit: τ ={' '}
          <span className="num font-semibold" data-testid="ringdown-tau">
            {formatSI(fit.tauS, 's')}
          </span>{' '}
          ± {formatSI(2 * fit.tauUncertaintyS, 's')} (2σ)
          {figures && (
            <>
              {' '}
              · measured finesse{' '}
              <span className="num font-semibold" data-testid="ringdown-finesse">
                {formatCount(figures.finesse.value)}
              </span>{' '}
              ± {formatCount(2 * figures.finesse.uncertainty, 2)} · loss per mirror {formatCount(figures.perMirrorLoss.value * 1e6)}
              {'\u2009'}ppm, for a {formatSI(figures.lengthM, 'm')} cavity
            </>
          )}
        </p>
        <Plot
          title={`Ring-down trace (${filename})`}
          x={t}
          series={[
            { label: 'measured', values: data.points.map((p) => (p.intensity > 0 ? p.intensity : null)) },
            { label: 'fit A·e^(−t/τ) + B', values: data.points.map((p) => model(p.timeS)), dashed: true },
          ]}
          xLabel="time (µs)"
          yLabel="intensity"
          logY
        />
      </div>
    );
  }
  if (data.kind === 'spectrum') {
    const x = data.points.map((p) => p.wavelengthNm);
    const series =
      data.quantity === 'reflectance'
        ? [{ label: 'reflectance (ppm)', values: data.points.map((p) => ('reflectancePpm' in p ? p.reflectancePpm : null)) }]
        : [
            { label: 'transmission (ppm)', values: data.points.map((p) => ('transmissionPpm' in p ? p.transmissionPpm : null)) },
            ...(data.quantity === 'transmission-loss'
              ? [{ label: 'loss (ppm)', values: data.points.map((p) => ('lossPpm' in p ? p.lossPpm : null)) }]
              : []),
          ];
    return <Plot title={`Measured spectrum (${filename})`} x={x} series={series} xLabel="wavelength (nm)" yLabel="ppm" logY />;
  }
  return (
    <Plot
      title={`Measured efficiency (${filename})`}
      x={data.points.map((p) => p.wavelengthNm)}
      series={[{ label: 'efficiency (%)', values: data.points.map((p) => p.efficiency * 100) }]}
      xLabel="wavelength (nm)"
      yLabel="%"
    />
  );
}
