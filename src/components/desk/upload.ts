// The browser half of an upload: the bytes go straight to object storage through the presigned URL.
// XMLHttpRequest rather than fetch, because only it reports upload progress.

const TYPES_BY_EXTENSION: Record<string, string> = {
  jpg: 'image/jpeg',
  jpeg: 'image/jpeg',
  png: 'image/png',
  webp: 'image/webp',
  pdf: 'application/pdf',
  csv: 'text/csv',
  txt: 'text/plain',
};

/** Browsers leave File.type empty for extensions the system does not know (often .csv). */
export function contentTypeOf(file: File): string {
  if (file.type) return file.type;
  const ext = file.name.toLowerCase().split('.').pop() ?? '';
  return TYPES_BY_EXTENSION[ext] ?? 'application/octet-stream';
}

export class UploadAborted extends Error {}

export interface PutHandle {
  done: Promise<void>;
  abort: () => void;
}

/** PUTs the file with the Content-Type the URL was signed for; onProgress gets 0–1. */
export function putWithProgress(url: string, file: File, contentType: string, onProgress: (share: number) => void): PutHandle {
  const xhr = new XMLHttpRequest();
  const done = new Promise<void>((resolve, reject) => {
    xhr.open('PUT', url);
    xhr.setRequestHeader('Content-Type', contentType);
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && e.total > 0) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => {
      if (xhr.status >= 200 && xhr.status < 300) resolve();
      else reject(new Error(`Storage did not take the file (status ${xhr.status}). Try again.`));
    };
    xhr.onerror = () => reject(new Error('The upload was interrupted. Check your connection and add the file again.'));
    xhr.onabort = () => reject(new UploadAborted('Upload cancelled.'));
    xhr.send(file);
  });
  return { done, abort: () => xhr.abort() };
}

export function formatBytes(n: number): string {
  if (n >= 1024 * 1024) return `${Number((n / (1024 * 1024)).toFixed(1))}\u2009MB`;
  if (n >= 1024) return `${Number((n / 1024).toFixed(1))}\u2009KB`;
  return `${n}\u2009bytes`;
}
