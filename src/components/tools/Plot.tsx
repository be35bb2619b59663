import { useEffect, useRef } from 'react';
import type uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { formatSI, THIN } from '../../lib/units';

export interface PlotSeries {
  label: string;
  values: (number | null)[];
  /** A goal or limit, drawn dashed. */
  dashed?: boolean;
  colour?: string;
}

export interface PlotProps {
  title: string;
  x: number[];
  series: PlotSeries[];
  xLabel: string;
  yLabel: string;
  logX?: boolean;
  logY?: boolean;
  /** A vertical marker (e.g. the current input). */
  markerX?: number;
  height?: number;
}

const INK = '#131c2e';

/** Ticks as 10k, 1M, 2.5µ… so log axes over decades stay readable. */
function tickLabels(_u: uPlot, splits: number[]): string[] {
  return splits.map((v) => (v === 0 ? '0' : formatSI(v, '', 3).replace(THIN, '')));
}
const RULE = '#d9d6cc';
const COLOURS = ['#1d5f8a', '#8a5a12', '#23613f', '#6b3fa0'];

/** A thin-line uPlot chart; uPlot needs the DOM, so it loads on the client only. */
export function Plot(props: PlotProps) {
  const box = useRef<HTMLDivElement>(null);
  const chart = useRef<uPlot | null>(null);

  useEffect(() => {
    let cancelled = false;
    let observer: ResizeObserver | undefined;
    void import('uplot').then(({ default: UPlot }) => {
      if (cancelled || !box.current) return;
      const width = box.current.clientWidth || 320;
      const marker = props.markerX;
      const opts: uPlot.Options = {
        width,
        height: props.height ?? 220,
        scales: { x: { time: false, distr: props.logX ? 3 : 1 }, y: { distr: props.logY ? 3 : 1 } },
        axes: [
          { label: props.xLabel, stroke: INK, grid: { stroke: RULE, width: 1 }, ticks: { stroke: RULE }, values: tickLabels },
          { label: props.yLabel, stroke: INK, grid: { stroke: RULE, width: 1 }, ticks: { stroke: RULE }, size: 72, values: tickLabels },
        ],
        legend: { show: props.series.length > 1, live: false },
        cursor: { drag: { x: false, y: false } },
        series: [
          { label: props.xLabel },
          ...props.series.map((s, i) => ({
            label: s.label,
            stroke: s.colour ?? COLOURS[i % COLOURS.length],
            width: 1.5,
            dash: s.dashed ? [6, 4] : undefined,
            points: { show: false },
            spanGaps: false,
          })),
        ],
        hooks:
          marker === undefined
            ? {}
            : {
                draw: [
                  (u: uPlot) => {
                    const x = u.valToPos(marker, 'x', true);
                    const ctx = u.ctx;
                    ctx.save();
                    ctx.strokeStyle = INK;
                    ctx.setLineDash([2, 3]);
                    ctx.beginPath();
                    ctx.moveTo(x, u.bbox.top);
                    ctx.lineTo(x, u.bbox.top + u.bbox.height);
                    ctx.stroke();
                    ctx.restore();
                  },
                ],
              },
      };
      chart.current?.destroy();
      chart.current = new UPlot(opts, [props.x, ...props.series.map((s) => s.values)] as uPlot.AlignedData, box.current);
      observer = new ResizeObserver(() => {
        if (box.current && chart.current) chart.current.setSize({ width: box.current.clientWidth, height: props.height ?? 220 });
      });
      observer.observe(box.current);
    });
    return () => {
      cancelled = true;
      observer?.disconnect();
      chart.current?.destroy();
      chart.current = null;
    };
  }, [props]);

  return (
    <figure className="mt-4">
      <figcaption className="mb-1 text-sm font-medium">{props.title}</figcaption>
      <div
        ref={box}
        className="w-full"
        role="img"
        aria-label={`${props.title}: ${props.yLabel} against ${props.xLabel}`}
        data-testid="plot"
      />
    </figure>
  );
}
