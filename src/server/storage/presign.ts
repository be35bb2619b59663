import { GetObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import { bucketName, getS3 } from './s3-client';

/** Presigned URLs live five minutes: long enough to start an upload or a download, short enough that a leaked link soon dies. */
const PRESIGN_SECONDS = 5 * 60;

/**
 * A URL the browser PUTs the file to. Content-Type and Content-Length are signed (the presigner leaves
 * Content-Type out unless told otherwise), so a service that checks signatures takes exactly the
 * declared type and size; completeUpload checks both again, since not every service does.
 */
export function presignPut(key: string, contentType: string, size: number): Promise<string> {
  return getSignedUrl(getS3(), new PutObjectCommand({ Bucket: bucketName(), Key: key, ContentType: contentType, ContentLength: size }), {
    expiresIn: PRESIGN_SECONDS,
    signableHeaders: new Set(['content-type', 'content-length']),
  });
}

export interface PresignGetOptions {
  /** The type the response declares, whatever the object was stored with. */
  contentType: string;
  /** `attachment` makes the browser save the file under `filename` instead of rendering it. */
  disposition: 'inline' | 'attachment';
  filename: string;
}

export function presignGet(key: string, opts: PresignGetOptions): Promise<string> {
  return getSignedUrl(
    getS3(),
    new GetObjectCommand({
      Bucket: bucketName(),
      Key: key,
      ResponseContentType: opts.contentType,
      ResponseContentDisposition: contentDisposition(opts.disposition, opts.filename),
    }),
    { expiresIn: PRESIGN_SECONDS },
  );
}

/** RFC 6266: an ASCII fallback for old clients, and the exact UTF-8 name in filename* (RFC 8187). */
function contentDisposition(disposition: 'inline' | 'attachment', filename: string): string {
  const fallback = filename.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_');
  const encoded = encodeURIComponent(filename).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
  return `${disposition}; filename="${fallback}"; filename*=UTF-8''${encoded}`;
}
