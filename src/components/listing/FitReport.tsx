import type { GoalResult } from '../../lib/fit';
import { formatCount, formatSI, THIN } from '../../lib/units';

const VERDICT: Record<GoalResult['verdict'], { mark: string; word: string; cls: string }> = {
  fits: { mark: '✓', word: 'Fits', cls: 'text-good' },
  marginal: { mark: '≈', word: 'Marginal: only the nominal specs meet the goal', cls: 'text-warn' },
  'does-not-fit': { mark: '✗', word: 'Does not fit', cls: 'text-bad' },
};

export function formatFigure(x: number | null, unit: string): string {
  if (x === null) return '—';
  if (unit === '' || unit === 'finesse') return formatCount(x);
  if (unit === 'dB') return `${x.toFixed(2)}${THIN}dB`;
  if (unit === 'nm') return `${Number(x.toPrecision(6))}${THIN}nm`;
  if (unit === '%' || unit === 'fraction') return `${(x * 100).toPrecision(3)}${THIN}%`;
  return formatSI(x, unit);
}

function headroomText(r: GoalResult): string {
  if (r.headroom === null) return '';
  if (r.unit === 'dB') return `${r.headroom >= 0 ? '+' : ''}${r.headroom.toFixed(2)}${THIN}dB`;
  return `${r.headroom >= 0 ? '+' : ''}${(r.headroom * 100).toPrecision(3)}${THIN}%`;
}

/** The fit report: the asked-for figure first and large, then worst case, headroom against the goal, reasons, formula. */
export function FitReport({ result, figureLabel }: { result: GoalResult; figureLabel: string }) {
  const v = VERDICT[result.verdict];
  const bar =
    result.worst !== null && result.goal !== null && result.goal > 0
      ? Math.max(0, Math.min(2, result.unit === 'dB' ? result.worst / result.goal : result.headroom !== null ? 1 + result.headroom : 0))
      : null;
  return (
    <div className="rounded-md border border-rule bg-white p-4" data-testid="fit-report" data-verdict={result.verdict}>
      <p className="text-sm text-ink-soft">{figureLabel}</p>
      <p className="num text-3xl font-semibold" data-testid="fit-figure">
        {formatFigure(result.figure, result.unit)}
      </p>
      <p className="num text-sm text-ink-soft">
        worst case {formatFigure(result.worst, result.unit)} · goal {formatFigure(result.goal, result.unit)}
      </p>
      <p className={`mt-2 font-medium ${v.cls}`} data-testid="fit-verdict">
        <span aria-hidden="true">{v.mark}</span> {v.word}
        {result.headroom !== null && <span className="num"> · headroom {headroomText(result)}</span>}
      </p>
      {bar !== null && (
        <div className="relative mt-2 h-2 rounded-sm bg-paper" aria-hidden="true">
          <div
            className={`h-2 rounded-sm ${result.verdict === 'fits' ? 'bg-good' : result.verdict === 'marginal' ? 'bg-warn' : 'bg-bad'}`}
            style={{ width: `${(bar / 2) * 100}%` }}
          />
          <div className="absolute top-[-3px] h-3.5 w-px bg-ink" style={{ left: '50%' }} title="goal" />
        </div>
      )}
      {result.reasons.length > 0 && (
        <ul className="mt-3 list-disc pl-5 text-sm">
          {result.reasons.map((r) => (
            <li key={r}>{r}</li>
          ))}
        </ul>
      )}
      {result.notes.length > 0 && (
        <ul className="mt-2 list-disc pl-5 text-xs text-ink-faint">
          {result.notes.map((r) => (
            <li key={r}>{r}</li>
          ))}
        </ul>
      )}
      <details className="mt-3 text-xs text-ink-faint">
        <summary className="cursor-pointer">formula and source</summary>
        <p className="mt-1 font-mono">{result.formula}</p>
        <p className="mt-0.5">{result.source}</p>
      </details>
    </div>
  );
}
