import { memo, useId, useState, type ChangeEvent } from 'react';
import { MEASUREMENT_KINDS, type Category, type FileKind, type MeasurementKind } from '../../lib/listings/constants';
import { ProgressBar } from './FormBits';
import { MEASUREMENT_FORMAT_HINTS, MEASUREMENT_KIND_LABELS } from './labels';
import ListingMeasurementPlot from '../listing/MeasurementPlot';
import { formatBytes } from './upload';
import type { UploadItem } from './use-uploads';

interface Props {
  category: Category;
  items: UploadItem[];
  add: (kind: FileKind, files: FileList, measurementKind?: MeasurementKind | null) => void;
  discard: (item: UploadItem) => void;
  removing: string | undefined;
  locked: boolean;
}

/** The plot buyers see on the listing page; memoised so that other files' progress does not redraw it. */
export const MeasurementPlot = memo(ListingMeasurementPlot);

function defaultMeasurementKind(category: Category): MeasurementKind {
  if (category === 'cavity-mirror') return 'ringdown';
  if (category === 'photodiode' || category === 'balanced-detector' || category === 'single-photon-detector') return 'efficiency-curve';
  return 'spectrum';
}

function FilePicker({
  label,
  accept,
  multiple,
  onFiles,
  hint,
}: {
  label: string;
  accept: string;
  multiple?: boolean;
  onFiles: (files: FileList) => void;
  hint: string;
}) {
  const id = useId();
  const pick = (e: ChangeEvent<HTMLInputElement>) => {
    if (e.target.files && e.target.files.length > 0) onFiles(e.target.files);
    // Cleared so that choosing the same file again (after fixing it) starts a new upload.
    e.target.value = '';
  };
  return (
    <div className="mb-3">
      <label htmlFor={id} className="field-label">
        {label}
      </label>
      <input
        id={id}
        type="file"
        accept={accept}
        multiple={multiple}
        onChange={pick}
        aria-describedby={`${id}-hint`}
        className="block w-full max-w-full text-sm file:mr-3 file:rounded-md file:border file:border-rule-strong file:bg-sheet file:px-3 file:py-1.5 file:text-sm file:font-medium file:text-ink"
      />
      <p id={`${id}-hint`} className="field-hint">
        {hint}
      </p>
    </div>
  );
}

function StatusLine({ item }: { item: UploadItem }) {
  if (item.state === 'queued') return <p className="text-xs text-ink-soft">Waiting for the files before it…</p>;
  if (item.state === 'uploading') return <ProgressBar share={item.progress} label={`Uploading ${item.filename}`} />;
  if (item.state === 'checking') {
    return (
      <div>
        <ProgressBar share={1} label={`Uploaded ${item.filename}`} />
        <p className="text-xs text-ink-soft" role="status">
          Checking the file…
        </p>
      </div>
    );
  }
  if (item.state === 'ready') {
    return (
      <p className="text-xs font-medium text-good" data-testid="upload-ready">
        <span aria-hidden="true">✓ </span>Ready
      </p>
    );
  }
  return (
    <p className="text-xs text-bad" role="alert" data-testid="upload-error">
      <span aria-hidden="true">✗ </span>Refused: {item.error}
    </p>
  );
}

function ItemRow({ item, onRemove, busy, locked }: { item: UploadItem; onRemove: () => void; busy: boolean; locked: boolean }) {
  const thumb = item.kind === 'photo' && item.state === 'ready' && item.fileId;
  return (
    <li className="rounded-md border border-rule bg-white p-2.5" data-testid="upload-item">
      <div className="flex items-start gap-3">
        {thumb && (
          <img
            src={`/api/files/${encodeURIComponent(item.fileId!)}?variant=w320`}
            alt={`Photo ${item.filename}`}
            className="h-16 w-20 shrink-0 rounded-sm border border-rule object-cover"
          />
        )}
        <div className="min-w-0 flex-1">
          <p className="flex flex-wrap items-baseline gap-x-2 text-sm">
            <span className="min-w-0 break-all font-medium">{item.filename}</span>
            <span className="num text-xs text-ink-faint">{formatBytes(item.size)}</span>
            {item.measurementKind && <span className="tag">{MEASUREMENT_KIND_LABELS[item.measurementKind]}</span>}
          </p>
          <div className="mt-1">
            <StatusLine item={item} />
          </div>
          {item.error && item.state !== 'failed' && <p className="field-error">{item.error}</p>}
          {item.kind === 'datasheet' && item.state === 'ready' && item.fileId && (
            <a className="text-sm" href={`/api/files/${encodeURIComponent(item.fileId)}`}>
              Download the datasheet
            </a>
          )}
        </div>
        {!locked && (
          <button
            type="button"
            className="btn btn-quiet shrink-0 px-2 py-0.5 text-sm"
            onClick={onRemove}
            disabled={busy}
            aria-label={`Remove ${item.filename}`}
          >
            {item.state === 'queued' || item.state === 'uploading' ? 'Cancel' : 'Remove'}
          </button>
        )}
      </div>
      {item.kind === 'measurement' && item.state === 'ready' && item.file?.data && (
        <MeasurementPlot data={item.file.data} filename={item.filename} />
      )}
    </li>
  );
}

function Section({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <section className="mb-6 border-t border-rule pt-4 first:border-t-0 first:pt-0" aria-label={title}>
      <h3 className="mb-2 font-semibold">{title}</h3>
      {children}
    </section>
  );
}

/** Step 3: photos, a datasheet and measurement files, each with its progress and the server's verdict. */
export function FilesStep({ category, items, add, discard, removing, locked }: Props) {
  const [measurementKind, setMeasurementKind] = useState<MeasurementKind>(defaultMeasurementKind(category));
  const kindId = useId();
  const list = (kind: FileKind) => {
    const mine = items.filter((i) => i.kind === kind);
    if (mine.length === 0) return <p className="mb-3 text-sm text-ink-faint">None yet.</p>;
    return (
      <ul className="mb-3 space-y-2">
        {mine.map((i) => (
          <ItemRow key={i.key} item={i} onRemove={() => discard(i)} busy={removing === i.key} locked={locked} />
        ))}
      </ul>
    );
  };
  return (
    <div>
      <Section title="Photos">
        {list('photo')}
        {!locked && (
          <FilePicker
            label="Add photos"
            accept="image/jpeg,image/png,image/webp"
            multiple
            onFiles={(f) => add('photo', f)}
            hint="JPEG, PNG or WebP, up to 15 MB each, at most 12. Location and camera data are removed."
          />
        )}
      </Section>
      <Section title="Datasheet">
        {list('datasheet')}
        {!locked && (
          <FilePicker
            label="Add a datasheet (PDF)"
            accept="application/pdf,.pdf"
            onFiles={(f) => add('datasheet', f)}
            hint="One PDF up to 20 MB; a new one replaces the old once it is accepted."
          />
        )}
      </Section>
      <Section title="Measurements">
        {list('measurement')}
        {!locked && (
          <>
            <div className="mb-3">
              <label htmlFor={kindId} className="field-label">
                Measurement kind
              </label>
              <select
                id={kindId}
                className="field-input sm:max-w-sm"
                value={measurementKind}
                onChange={(e) => setMeasurementKind(e.target.value as MeasurementKind)}
              >
                {MEASUREMENT_KINDS.map((k) => (
                  <option key={k} value={k}>
                    {MEASUREMENT_KIND_LABELS[k]}
                  </option>
                ))}
              </select>
            </div>
            <FilePicker
              label="Add a measurement CSV"
              accept=".csv,text/csv,text/plain"
              onFiles={(f) => add('measurement', f, measurementKind)}
              hint={`CSV up to 5 MB. ${MEASUREMENT_FORMAT_HINTS[measurementKind]}`}
            />
          </>
        )}
      </Section>
    </div>
  );
}
