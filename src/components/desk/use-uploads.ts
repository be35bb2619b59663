import { useMutation } from '@tanstack/react-query';
import { useCallback, useRef, useState } from 'react';
import { api, ApiError } from '../../lib/api-client';
import type { FileKind, MeasurementKind } from '../../lib/listings/constants';
import type { DeskFile } from './types';
import { contentTypeOf, putWithProgress, UploadAborted, type PutHandle } from './upload';

export type UploadState = 'queued' | 'uploading' | 'checking' | 'ready' | 'failed';

export interface UploadItem {
  key: string;
  kind: FileKind;
  measurementKind: MeasurementKind | null;
  filename: string;
  size: number;
  state: UploadState;
  /** 0–1 of the bytes sent to storage. */
  progress: number;
  error: string | null;
  fileId: string | null;
  file: DeskFile | null;
}

interface UploadVars {
  key: string;
  file: File;
  kind: FileKind;
  measurementKind: MeasurementKind | null;
}

function readyItem(file: DeskFile): UploadItem {
  return {
    key: file.id,
    kind: file.kind,
    measurementKind: file.measurementKind,
    filename: file.filename,
    size: file.size,
    state: 'ready',
    progress: 1,
    error: null,
    fileId: file.id,
    file,
  };
}

const BUSY_RETRIES = 2;

/** The API answers 503 with Retry-After when the database is momentarily busy; that is worth waiting for. */
async function patiently<T>(call: () => Promise<T>): Promise<T> {
  for (let attempt = 0; ; attempt++) {
    try {
      return await call();
    } catch (err) {
      if (!(err instanceof ApiError) || err.status !== 503 || attempt >= BUSY_RETRIES) throw err;
      await new Promise((r) => setTimeout(r, (err.retryAfterS ?? 2) * 1000));
    }
  }
}

/** The field messages say more than "Some fields need attention" (e.g. the size or type limit). */
function messageOf(err: unknown): string {
  if (err instanceof ApiError) return Object.values(err.fields ?? {})[0] ?? err.message;
  return err instanceof Error ? err.message : 'The upload failed.';
}

/**
 * The listing's files and the uploads in flight. Lives in the editor, not the files step, so an
 * upload keeps going (and keeps its progress) while the seller looks at another step.
 */
export function useUploads(listingId: string | null, initial: readonly DeskFile[]) {
  const [items, setItems] = useState<UploadItem[]>(() => initial.map(readyItem));
  const puts = useRef(new Map<string, PutHandle>());
  const cancelled = useRef(new Set<string>());
  const counter = useRef(0);

  const patch = useCallback((key: string, change: Partial<UploadItem>) => {
    setItems((all) => all.map((it) => (it.key === key ? { ...it, ...change } : it)));
  }, []);
  const drop = useCallback((key: string) => setItems((all) => all.filter((it) => it.key !== key)), []);

  const upload = useMutation<DeskFile, unknown, UploadVars>({
    // One file at a time: a queue is easy to follow, and the server checks each file as it completes.
    scope: { id: `uploads-${listingId ?? ''}` },
    mutationFn: async (v) => {
      if (cancelled.current.has(v.key)) throw new UploadAborted('Upload cancelled.');
      patch(v.key, { state: 'uploading' });
      const base = `/api/listings/${encodeURIComponent(listingId ?? '')}/uploads`;
      const contentType = contentTypeOf(v.file);
      const created = await patiently(() =>
        api<{ fileId: string; uploadUrl: string }>(base, {
          body: {
            kind: v.kind,
            filename: v.file.name,
            contentType,
            size: v.file.size,
            ...(v.measurementKind ? { measurementKind: v.measurementKind } : {}),
          },
        }),
      );
      if (cancelled.current.has(v.key)) {
        // Removed while the upload was being set up: nothing will arrive for this pending file.
        await api(`${base}/${encodeURIComponent(created.fileId)}`, { method: 'DELETE' });
        throw new UploadAborted('Upload cancelled.');
      }
      patch(v.key, { fileId: created.fileId });
      const put = putWithProgress(created.uploadUrl, v.file, contentType, (share) => patch(v.key, { progress: share }));
      puts.current.set(v.key, put);
      try {
        await put.done;
      } finally {
        puts.current.delete(v.key);
      }
      patch(v.key, { state: 'checking', progress: 1 });
      return patiently(() => api<DeskFile>(`${base}/${encodeURIComponent(created.fileId)}/complete`, { method: 'POST' }));
    },
    onSuccess: (file, v) => {
      setItems((all) =>
        all
          // A newer datasheet replaces the older one on the server once accepted; the list follows.
          .filter((it) => !(file.kind === 'datasheet' && it.kind === 'datasheet' && it.state === 'ready' && it.key !== v.key))
          .map((it) => (it.key === v.key ? { ...it, state: 'ready', file, error: null } : it)),
      );
    },
    onError: (err, v) => {
      if (err instanceof UploadAborted) return;
      patch(v.key, { state: 'failed', error: messageOf(err) });
    },
  });

  const remove = useMutation<unknown, ApiError, UploadItem>({
    mutationFn: async (item) => {
      if (!item.fileId) return null;
      try {
        return await api(`/api/listings/${encodeURIComponent(listingId ?? '')}/uploads/${encodeURIComponent(item.fileId)}`, {
          method: 'DELETE',
        });
      } catch (err) {
        if (err instanceof ApiError && err.status === 404) return null;
        throw err;
      }
    },
    onSuccess: (_res, item) => drop(item.key),
    onError: (err, item) => patch(item.key, { error: err.message }),
  });

  const add = useCallback(
    (kind: FileKind, files: FileList | File[], measurementKind: MeasurementKind | null = null) => {
      if (!listingId) return;
      for (const file of Array.from(files)) {
        counter.current += 1;
        const key = `upload-${counter.current}`;
        const item: UploadItem = {
          key,
          kind,
          measurementKind,
          filename: file.name,
          size: file.size,
          state: 'queued',
          progress: 0,
          error: null,
          fileId: null,
          file: null,
        };
        setItems((all) => [...all, item]);
        upload.mutate({ key, file, kind, measurementKind });
      }
    },
    [listingId, upload],
  );

  /** Cancels an upload in flight (the server's pending file is deleted too) or removes a stored file. */
  const discard = useCallback(
    (item: UploadItem) => {
      if (item.state === 'queued' || item.state === 'uploading') {
        cancelled.current.add(item.key);
        puts.current.get(item.key)?.abort();
      }
      remove.mutate(item);
    },
    [remove],
  );

  return { items, add, discard, removing: remove.isPending ? remove.variables?.key : undefined };
}
