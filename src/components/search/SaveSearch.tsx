import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';
import { api, ApiError } from '../../lib/api-client';
import type { GoalSearchRequest, TextSearchRequest } from '../../lib/schemas/search';

interface Props {
  signedIn: boolean;
  /** The search as it would be saved, or null while the page shows no valid search. */
  search: TextSearchRequest | GoalSearchRequest | null;
  url: string;
  suggestedName: string;
}

/** Save the current search; a new listing that fits it is e-mailed, at most once a day. */
export function SaveSearch({ signedIn, search, url, suggestedName }: Props) {
  const [open, setOpen] = useState(false);
  const [name, setName] = useState(suggestedName);
  const save = useMutation({
    mutationFn: () => api<{ savedSearch: { id: string } }>('/api/saved-searches', { body: { name, search, url } }),
  });
  if (!signedIn) {
    return (
      <p className="text-sm">
        <a href={`/sign-in?next=${encodeURIComponent(url)}`}>Sign in to save this search</a> and get an e-mail when a new listing fits it.
      </p>
    );
  }
  if (save.isSuccess) {
    return (
      <p className="notice notice-good text-sm" role="status" data-testid="saved">
        Saved. When a newly approved listing fits, we e-mail you (at most once a day). <a href="/saved-searches">Your saved searches</a>
      </p>
    );
  }
  if (!open) {
    return (
      <button
        type="button"
        className="btn btn-quiet text-sm"
        disabled={search === null}
        onClick={() => {
          setName(suggestedName);
          setOpen(true);
        }}
      >
        Save this search
      </button>
    );
  }
  const error =
    save.error instanceof ApiError ? (save.error.fields?.name ?? save.error.message) : save.error ? 'Saving failed. Try again.' : null;
  return (
    <form
      className="flex flex-wrap items-end gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate();
      }}
    >
      <div className="min-w-0 flex-1">
        <label className="field-label" htmlFor="save-name">
          Name of the saved search
        </label>
        <input
          id="save-name"
          className="field-input"
          value={name}
          maxLength={120}
          onChange={(e) => setName(e.target.value)}
          aria-invalid={error ? true : undefined}
        />
      </div>
      <button type="submit" className="btn btn-primary" disabled={save.isPending || search === null}>
        {save.isPending ? 'Saving…' : 'Save'}
      </button>
      <button type="button" className="btn btn-quiet" onClick={() => setOpen(false)}>
        Cancel
      </button>
      {error && (
        <p className="field-error w-full" role="alert">
          {error}
        </p>
      )}
    </form>
  );
}
