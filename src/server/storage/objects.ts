import {
  DeleteObjectCommand,
  DeleteObjectsCommand,
  GetObjectCommand,
  HeadObjectCommand,
  ListObjectsV2Command,
  PutObjectCommand,
} from '@aws-sdk/client-s3';
import { HttpError } from '../http/errors';
import { bucketName, getS3 } from './s3-client';

export interface ObjectHead {
  size: number;
  contentType: string | null;
}

/** Thrown by getObjectBytes when the stored object is larger than the caller is willing to hold in memory. */
export class ObjectTooLargeError extends Error {
  constructor(
    readonly key: string,
    readonly limit: number,
  ) {
    super(`Object ${key} is larger than ${limit} bytes`);
    this.name = 'ObjectTooLargeError';
  }
}

const UNREACHABLE = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENETUNREACH', 'EPIPE', 'ENOTFOUND', 'EAI_AGAIN']);

/**
 * Storage that cannot be reached (or answers 5xx) becomes a 503 the client may retry; the file's row is
 * left as it was, so the same upload can be completed once storage is back.
 */
function storageUnavailable(err: unknown): HttpError | null {
  const e = err as { code?: string; name?: string; $metadata?: { httpStatusCode?: number } };
  const status = e?.$metadata?.httpStatusCode;
  if ((status === undefined && (UNREACHABLE.has(e?.code ?? '') || e?.name === 'TimeoutError')) || (status ?? 0) >= 500) {
    return new HttpError(503, 'unavailable', 'File storage is not answering right now. Try again in a minute.', undefined, {
      'retry-after': '30',
    });
  }
  return null;
}

function rethrow(err: unknown): never {
  throw storageUnavailable(err) ?? err;
}

function isMissing(err: unknown): boolean {
  const e = err as { name?: string; $metadata?: { httpStatusCode?: number } };
  return e?.name === 'NotFound' || e?.name === 'NoSuchKey' || e?.$metadata?.httpStatusCode === 404;
}

/** The object's size and type, or null when there is no such object. */
export async function headObject(key: string): Promise<ObjectHead | null> {
  try {
    const head = await getS3()
      .send(new HeadObjectCommand({ Bucket: bucketName(), Key: key }))
      .catch(rethrow);
    return { size: head.ContentLength ?? 0, contentType: head.ContentType ?? null };
  } catch (err) {
    if (isMissing(err)) return null;
    throw err;
  }
}

/**
 * The object's bytes, or null when it does not exist. Streams and stops at `maxBytes`, so an object that
 * grew after a HEAD (or lied about its size) cannot make the server buffer more than the limit.
 */
export async function getObjectBytes(key: string, maxBytes: number): Promise<Buffer | null> {
  let body: AsyncIterable<Uint8Array> & { destroy?: () => void };
  try {
    const res = await getS3()
      .send(new GetObjectCommand({ Bucket: bucketName(), Key: key }))
      .catch(rethrow);
    if (!res.Body) return Buffer.alloc(0);
    body = res.Body as unknown as typeof body;
  } catch (err) {
    if (isMissing(err)) return null;
    throw err;
  }
  const chunks: Uint8Array[] = [];
  let size = 0;
  for await (const chunk of body) {
    size += chunk.byteLength;
    if (size > maxBytes) {
      body.destroy?.();
      throw new ObjectTooLargeError(key, maxBytes);
    }
    chunks.push(chunk);
  }
  return Buffer.concat(chunks);
}

export async function putObject(key: string, body: Buffer, contentType: string): Promise<void> {
  await getS3()
    .send(new PutObjectCommand({ Bucket: bucketName(), Key: key, Body: body, ContentType: contentType, ContentLength: body.byteLength }))
    .catch(rethrow);
}

export async function deleteObject(key: string): Promise<void> {
  await getS3()
    .send(new DeleteObjectCommand({ Bucket: bucketName(), Key: key }))
    .catch(rethrow);
}

/** S3 accepts at most 1000 keys per DeleteObjects request. */
const DELETE_BATCH = 1000;

export async function deleteObjects(keys: string[]): Promise<void> {
  for (let i = 0; i < keys.length; i += DELETE_BATCH) {
    const batch = keys.slice(i, i + DELETE_BATCH);
    const res = await getS3()
      .send(new DeleteObjectsCommand({ Bucket: bucketName(), Delete: { Objects: batch.map((Key) => ({ Key })), Quiet: true } }))
      .catch(rethrow);
    const failed = res.Errors ?? [];
    if (failed.length) throw new Error(`Could not delete ${failed.map((e) => `${e.Key} (${e.Code})`).join(', ')}`);
  }
}

export async function listKeys(prefix: string): Promise<string[]> {
  const keys: string[] = [];
  let token: string | undefined;
  do {
    const page = await getS3()
      .send(new ListObjectsV2Command({ Bucket: bucketName(), Prefix: prefix, ContinuationToken: token }))
      .catch(rethrow);
    for (const o of page.Contents ?? []) if (o.Key) keys.push(o.Key);
    token = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (token);
  return keys;
}

/** Removes everything under a prefix, including objects a client uploaded that the database never recorded. */
export async function deletePrefix(prefix: string): Promise<void> {
  await deleteObjects(await listKeys(prefix));
}
