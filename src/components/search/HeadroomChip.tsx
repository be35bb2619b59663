import type { ResultFit } from '../../lib/search/results';
import { formatHeadroom } from '../../lib/search/format';

const LOOK = {
  fits: { mark: '✓', word: 'fits', cls: 'border-good text-good bg-good-wash' },
  marginal: { mark: '≈', word: 'marginal', cls: 'border-warn text-warn bg-warn-wash' },
  'does-not-fit': { mark: '✗', word: 'does not fit', cls: 'border-bad text-bad bg-bad-wash' },
} as const;

/** The first reason in a few words: "out of band", "unstable", "bandwidth 20 MHz below the 50 MHz sideband". */
export function shortReason(reasons: readonly string[]): string | null {
  const first = reasons[0];
  if (!first) return null;
  const bare = first.replace(/^mirror \d: /, '');
  const head = bare.split(':')[0]!.trim();
  return head.length <= 48 ? head : `${head.slice(0, 45)}…`;
}

/** Verdict with its mark and word (never colour alone), and the worst-case headroom or the blocking reason. */
export function HeadroomChip({ fit }: { fit: ResultFit }) {
  const look = LOOK[fit.verdict];
  const headroom = formatHeadroom(fit);
  const why = fit.verdict === 'does-not-fit' ? shortReason(fit.reasons) : null;
  return (
    <span
      className={`inline-flex items-center gap-1 rounded-full border px-2 py-0.5 text-sm font-medium ${look.cls}`}
      data-testid="headroom-chip"
    >
      <span aria-hidden="true">{look.mark}</span> <span>{why && fit.headroom === null ? why : look.word}</span>
      {headroom && <span className="num"> · headroom {headroom}</span>}
    </span>
  );
}
