import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';
import { api, type ApiError } from '../../lib/api-client';
import { HAZARDS, type Hazard } from '../../lib/listings/constants';
import { FormMessage } from '../forms/Field';
import { QueryRoot } from '../forms/QueryRoot';

const HAZARD_LABELS: Record<Hazard, string> = {
  laser: 'Laser radiation',
  'high-voltage': 'High voltage',
  cryogenic: 'Cryogenics',
  'pressurised-gas': 'Pressurised gas',
  fragile: 'Fragile / cleanroom handling',
};

interface Props {
  listingId: string;
  hazards: Hazard[];
  exportControlled: boolean;
  exportNote: string | null;
  /** Decisions apply to listings in review; flags apply any time. */
  reviewable: boolean;
}

function Panel({ listingId, reviewable, ...initial }: Props) {
  const [reason, setReason] = useState('');
  const [hazards, setHazards] = useState<Hazard[]>(initial.hazards);
  const [exportControlled, setExport] = useState(initial.exportControlled);
  const [exportNote, setNote] = useState(initial.exportNote ?? '');
  const decide = useMutation<unknown, ApiError, 'approve' | 'request-changes' | 'reject'>({
    mutationFn: (action) => api(`/api/moderation/listings/${listingId}`, { body: { action, reason: reason || undefined } }),
    onSuccess: () => window.location.assign('/moderation'),
  });
  const flags = useMutation<unknown, ApiError>({
    mutationFn: () =>
      api(`/api/moderation/listings/${listingId}/flags`, { body: { hazards, exportControlled, exportNote: exportNote || null } }),
  });
  return (
    <div className="space-y-5">
      <fieldset className="rounded-md border border-rule p-3">
        <legend className="px-1 text-sm font-semibold">Hazard and export-control flags</legend>
        <div className="flex flex-wrap gap-x-4 gap-y-1">
          {HAZARDS.map((h) => (
            <label key={h} className="flex items-center gap-1.5 text-sm">
              <input
                type="checkbox"
                checked={hazards.includes(h)}
                onChange={(e) => setHazards(e.target.checked ? [...hazards, h] : hazards.filter((x) => x !== h))}
              />
              {HAZARD_LABELS[h]}
            </label>
          ))}
        </div>
        <label className="mt-3 flex items-center gap-1.5 text-sm">
          <input type="checkbox" checked={exportControlled} onChange={(e) => setExport(e.target.checked)} /> Export-controlled (buyers must
          give an end-use statement)
        </label>
        {exportControlled && (
          <div className="mt-2">
            <label className="field-label" htmlFor="export-note">
              Classification note (e.g. ECCN)
            </label>
            <input id="export-note" className="field-input" value={exportNote} onChange={(e) => setNote(e.target.value)} />
          </div>
        )}
        {flags.error && <FormMessage kind="bad">{flags.error.message}</FormMessage>}
        {flags.isSuccess && <p className="mt-2 text-sm text-good">Flags saved.</p>}
        <button type="button" className="btn btn-quiet mt-3" onClick={() => flags.mutate()} disabled={flags.isPending}>
          Save flags
        </button>
      </fieldset>
      {reviewable && (
        <div>
          <label className="field-label" htmlFor="reason">
            Reason for the seller (needed to request changes or reject)
          </label>
          <textarea id="reason" className="field-input min-h-24" value={reason} onChange={(e) => setReason(e.target.value)} />
          {decide.error && <FormMessage kind="bad">{decide.error.fields?.reason ?? decide.error.message}</FormMessage>}
          <div className="mt-3 flex flex-wrap gap-3">
            <button type="button" className="btn btn-primary" disabled={decide.isPending} onClick={() => decide.mutate('approve')}>
              Approve
            </button>
            <button type="button" className="btn btn-quiet" disabled={decide.isPending} onClick={() => decide.mutate('request-changes')}>
              Request changes
            </button>
            <button type="button" className="btn btn-quiet text-bad" disabled={decide.isPending} onClick={() => decide.mutate('reject')}>
              Reject
            </button>
          </div>
        </div>
      )}
    </div>
  );
}

export default function ModerationPanel(props: Props) {
  return (
    <QueryRoot>
      <Panel {...props} />
    </QueryRoot>
  );
}
