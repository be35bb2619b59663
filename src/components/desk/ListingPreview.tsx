import { useMemo } from 'react';
import { CATEGORY_LABELS, CONDITION_LABELS, REGION_LABELS } from '../../lib/listings/constants';
import { specRows, type ListingInput } from '../../lib/specs';
import { formatMoney } from '../../lib/format';
import { MeasurementPlot } from './FilesStep';
import { renderDescription } from './markdown';
import type { UploadItem } from './use-uploads';

const ROW_HEAD = 'w-2/5 border-rule text-sm font-normal normal-case tracking-normal text-ink-soft';

/** The listing as a buyer will read it: photos, price, stock, ships-to, the spec table, the description. */
export function ListingPreview({ body, labName, files }: { body: ListingInput; labName: string; files: UploadItem[] }) {
  const rows = specRows(body.category, body.specs as Record<string, unknown>);
  const description = useMemo(() => renderDescription(body.description), [body.description]);
  const ready = files.filter((f) => f.state === 'ready' && f.fileId);
  const photos = ready.filter((f) => f.kind === 'photo');
  const datasheet = ready.find((f) => f.kind === 'datasheet');
  const measurements = ready.filter((f) => f.kind === 'measurement');
  return (
    <article className="rounded-md border border-rule bg-white p-4" aria-label="Preview" data-testid="listing-preview">
      {photos.length > 0 && (
        <div className="mb-4 flex gap-2 overflow-x-auto">
          {photos.map((p) => (
            <img
              key={p.key}
              src={`/api/files/${encodeURIComponent(p.fileId!)}?variant=w320`}
              alt={`Photo ${p.filename}`}
              className="h-28 w-auto shrink-0 rounded-sm border border-rule object-cover"
            />
          ))}
        </div>
      )}
      <p className="text-xs uppercase tracking-wide text-ink-faint">{CATEGORY_LABELS[body.category]}</p>
      <h3 className="mb-1 text-xl font-semibold break-words">{body.title}</h3>
      <p className="mb-3 text-sm text-ink-soft">
        {labName} · {CONDITION_LABELS[body.condition]}
      </p>
      <div className="mb-4 flex flex-wrap items-baseline gap-x-4 gap-y-1">
        <span className="num text-2xl font-semibold" data-testid="preview-price">
          {formatMoney(body.priceCents, body.currency)}
        </span>
        <span className="num text-sm">{body.quantity === 0 ? 'sold out' : `${body.quantity} available`}</span>
      </div>
      <p className="mb-4 text-sm">
        <span className="text-ink-soft">Ships to: </span>
        {body.shipsTo.map((r) => REGION_LABELS[r]).join(', ')}
      </p>
      <h4 className="mb-1 text-sm font-semibold">Specifications</h4>
      <div className="table-scroll mb-4">
        <table className="data-table" data-testid="preview-specs">
          <tbody>
            {rows.map((r) => (
              <tr key={r.label}>
                <th scope="row" className={ROW_HEAD}>
                  {r.label}
                </th>
                <td className="num">{r.value}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {measurements.length > 0 && (
        <section className="mb-4" aria-label="Measurements">
          <h4 className="mb-1 text-sm font-semibold">Measurements</h4>
          {measurements.map((m) => m.file?.data && <MeasurementPlot key={m.key} data={m.file.data} filename={m.filename} />)}
        </section>
      )}
      {datasheet && (
        <p className="mb-4 text-sm">
          <a href={`/api/files/${encodeURIComponent(datasheet.fileId!)}`}>Datasheet: {datasheet.filename}</a>
        </p>
      )}
      {body.description.trim() !== '' && (
        <div
          className="prose-notes max-w-prose text-[0.95rem] [&_h3]:font-semibold [&_h4]:font-semibold"
          dangerouslySetInnerHTML={{ __html: description }}
        />
      )}
    </article>
  );
}
