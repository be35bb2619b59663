import { memo, useMemo } from 'react';
import { CATEGORY_LABELS, CONDITION_LABELS } from '../../lib/listings/constants';
import { formatMoney } from '../../lib/format';
import type { GoalSearchResult, ListingSummary } from '../../lib/search/results';
import { FitReport } from '../listing/FitReport';
import { Plot } from '../tools/Plot';
import { HeadroomChip } from './HeadroomChip';

function Cautions({ l }: { l: ListingSummary }) {
  const words = [
    ...l.hazards.map((h) => (h === 'pressurised-gas' ? 'pressurised gas' : h.replace('-', ' '))),
    ...(l.exportControlled ? ['export control'] : []),
  ];
  if (words.length === 0) return null;
  return (
    <span className="ml-1 inline-flex flex-wrap gap-1" aria-label="Cautions">
      {words.map((w) => (
        <a key={w} href="/cautions" className="tag no-underline">
          <span aria-hidden="true">⚠</span> {w}
        </a>
      ))}
    </span>
  );
}

function Seller({ l }: { l: ListingSummary }) {
  return (
    <>
      {l.labName} · {CONDITION_LABELS[l.condition]} · <span className="num">{formatMoney(l.priceCents, l.currency)}</span> ·{' '}
      <span className="num">{l.quantity}</span> available
      {l.hasMeasurements && ' · measured'}
    </>
  );
}

/**
 * One ranked candidate: the listing (and its partner in a two-listing pair), the fit report, the
 * headroom chip and a small plot. Memoised: the chart is rebuilt only when the result changes, not
 * while the buyer types in the goal form.
 */
export const GoalResultItem = memo(function GoalResultItem({ r, rank }: { r: GoalSearchResult; rank: number }) {
  const plot = useMemo(() => (r.fit.plot ? { ...r.fit.plot, height: 150 } : null), [r.fit.plot]);
  return (
    <article className="sheet p-4" data-testid="result" data-verdict={r.fit.verdict} data-listing={r.listing.id}>
      <div className="flex flex-wrap items-start justify-between gap-2">
        <h3 className="min-w-0 font-medium leading-snug">
          <span className="num mr-1 text-ink-faint">{rank}.</span>
          <a href={`/listings/${r.listing.id}`} data-testid="result-title">
            {r.listing.title}
          </a>
          {r.partner && (
            <>
              {' '}
              <span className="text-ink-soft">with</span>{' '}
              <a href={`/listings/${r.partner.id}`} data-testid="result-partner">
                {r.partner.title}
              </a>
            </>
          )}
        </h3>
        <HeadroomChip fit={r.fit} />
      </div>
      <p className="mt-0.5 text-sm text-ink-soft">
        {CATEGORY_LABELS[r.listing.category]} · <Seller l={r.listing} />
        <Cautions l={r.listing} />
      </p>
      {r.partner && (
        <p className="text-sm text-ink-soft">
          Partner: <Seller l={r.partner} />
        </p>
      )}
      <div className="mt-3 grid gap-4 md:grid-cols-[minmax(0,1fr)_minmax(0,22rem)]">
        <FitReport result={r.fit} figureLabel={r.fit.figureLabel} />
        <div className="min-w-0">
          {r.fit.details.length > 0 && (
            <dl className="space-y-0.5 text-sm" data-testid="fit-details">
              {r.fit.details.map((d) => (
                <div key={d.label} className="flex flex-wrap justify-between gap-x-3">
                  <dt className="text-ink-soft">{d.label}</dt>
                  <dd className="num ml-auto text-right">{d.value}</dd>
                </div>
              ))}
            </dl>
          )}
          {plot && <Plot {...plot} />}
        </div>
      </div>
    </article>
  );
});
