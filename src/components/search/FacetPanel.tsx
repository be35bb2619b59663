import { FACETS, FACET_LABELS, type Facet, type Facets } from '../../lib/search/facets';
import type { Filters } from '../../lib/schemas/search';

/** Facet filters with counts; each count says how many results ticking that value would give. */
export function FacetPanel({
  facets,
  filters,
  onToggle,
  onClear,
}: {
  facets: Facets;
  filters: Filters;
  onToggle: (facet: Facet, value: string) => void;
  onClear: () => void;
}) {
  const active = FACETS.some((f) => (filters[f]?.length ?? 0) > 0);
  return (
    <div className="space-y-4" data-testid="facets">
      {FACETS.map((f) => {
        const values = facets[f].filter((v) => v.count > 0 || filters[f]?.includes(v.value as never));
        if (values.length === 0) return null;
        return (
          <fieldset key={f} className="min-w-0">
            <legend className="mb-1 text-xs font-semibold uppercase tracking-wide text-ink-soft">{FACET_LABELS[f]}</legend>
            <ul className="space-y-0.5 text-sm">
              {values.map((v) => {
                const checked = filters[f]?.includes(v.value as never) ?? false;
                const id = `facet-${f}-${v.value}`;
                return (
                  <li key={v.value} className="flex items-start gap-2">
                    <input id={id} type="checkbox" className="mt-1" checked={checked} onChange={() => onToggle(f, v.value)} />
                    <label htmlFor={id} className="flex min-w-0 flex-1 justify-between gap-2">
                      <span className="min-w-0">{v.label}</span>
                      <span className="num text-ink-faint" data-testid={`facet-count-${f}-${v.value}`}>
                        {v.count}
                      </span>
                    </label>
                  </li>
                );
              })}
            </ul>
          </fieldset>
        );
      })}
      {active && (
        <button type="button" className="btn btn-quiet text-sm" onClick={onClear}>
          Clear filters
        </button>
      )}
    </div>
  );
}
