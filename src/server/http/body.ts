import type { ZodType, ZodTypeDef } from 'zod';
import { HttpError, type FieldErrors } from './errors';

export const MAX_JSON_BYTES = 64 * 1024;

/** The body as text, refused with 413 as soon as it passes `limit` bytes (declared or streamed). */
export async function readLimited(request: Request, limit: number): Promise<string> {
  const declared = Number(request.headers.get('content-length') ?? '0');
  if (declared > limit) throw tooLarge(limit);
  if (!request.body) return '';
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > limit) {
      await reader.cancel();
      throw tooLarge(limit);
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks).toString('utf8');
}

function tooLarge(limit: number) {
  return new HttpError(413, 'payload_too_large', `The request body is larger than ${Math.round(limit / 1024)} KiB.`);
}

export function zodFieldErrors(issues: { path: (string | number)[]; message: string }[]): FieldErrors {
  const fields: FieldErrors = {};
  for (const issue of issues) {
    const key = issue.path.join('.') || '_';
    fields[key] ??= issue.message;
  }
  return fields;
}

/** Reads a JSON body (415 for another type, 413 over the limit, 400 when malformed) and validates it (400 with fields). */
export async function readJson<T>(request: Request, schema: ZodType<T, ZodTypeDef, unknown>, limit = MAX_JSON_BYTES): Promise<T> {
  const type = request.headers.get('content-type') ?? '';
  if (!/^application\/json\b/i.test(type)) {
    throw new HttpError(415, 'unsupported_media_type', 'Send the request body as application/json.');
  }
  const text = await readLimited(request, limit);
  let raw: unknown;
  try {
    raw = text === '' ? {} : JSON.parse(text);
  } catch {
    throw new HttpError(400, 'bad_request', 'The request body is not valid JSON.');
  }
  return parseWith(schema, raw);
}

export function parseWith<T>(schema: ZodType<T, ZodTypeDef, unknown>, raw: unknown): T {
  const result = schema.safeParse(raw);
  if (!result.success) {
    throw new HttpError(400, 'validation_failed', 'Some fields need attention.', zodFieldErrors(result.error.issues));
  }
  return result.data;
}

export const MAX_FORM_BYTES = 8 * 1024;

/** Reads a small urlencoded form (a page's own POST) within a limit; 415 for another type. */
export async function readForm(request: Request, limit = MAX_FORM_BYTES): Promise<URLSearchParams> {
  const type = request.headers.get('content-type') ?? '';
  if (!/^application\/x-www-form-urlencoded\b/i.test(type)) {
    throw new HttpError(415, 'unsupported_media_type', 'Send the form as application/x-www-form-urlencoded.');
  }
  return new URLSearchParams(await readLimited(request, limit));
}

export function readQuery<T>(url: URL, schema: ZodType<T, ZodTypeDef, unknown>): T {
  return parseWith(schema, Object.fromEntries(url.searchParams));
}
