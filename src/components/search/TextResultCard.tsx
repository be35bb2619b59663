import { CATEGORY_LABELS, CONDITION_LABELS } from '../../lib/listings/constants';
import { formatMoney } from '../../lib/format';
import type { ListingSummary } from '../../lib/search/results';

/** A listing found by words: a card, since the photo helps when browsing. */
export function TextResultCard({ l }: { l: ListingSummary }) {
  return (
    <a
      href={`/listings/${l.id}`}
      className="sheet flex flex-col overflow-hidden text-ink no-underline hover:border-rule-strong"
      data-testid="listing-card"
    >
      {l.photoId ? (
        <img
          src={`/api/files/${l.photoId}?variant=w320`}
          alt=""
          className="aspect-[4/3] w-full object-cover"
          loading="lazy"
          width="320"
          height="240"
        />
      ) : (
        <div className="aspect-[4/3] w-full bg-paper" aria-hidden="true" />
      )}
      <div className="flex flex-1 flex-col p-3">
        <p className="text-2xs uppercase tracking-wide text-ink-faint">{CATEGORY_LABELS[l.category]}</p>
        <h3 className="mt-0.5 text-[0.95rem] font-medium leading-snug">{l.title}</h3>
        <p className="mt-auto pt-2 text-sm text-ink-soft">
          {l.labName} · {CONDITION_LABELS[l.condition]}
        </p>
        <p className="num text-sm font-semibold">{formatMoney(l.priceCents, l.currency)}</p>
      </div>
    </a>
  );
}
