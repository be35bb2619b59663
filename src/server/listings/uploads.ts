/**
 * Listing files: photos, a datasheet, measurement CSVs. The browser PUTs the bytes straight to object
 * storage through a presigned URL; completeUpload then judges what actually arrived (never what the
 * client declared) and either keeps it in its served form or refuses it and deletes every object.
 */
import { and, eq, inArray, lt, ne, sql } from 'drizzle-orm';
import sharp from 'sharp';
import type { FileKind, MeasurementKind } from '../../lib/listings/constants';
import { MAX_PHOTOS_PER_LISTING, UPLOAD_LIMITS, type CreateUpload, type FileVariant } from '../../lib/schemas/uploads';
import { forStorage, parseMeasurementCsv, type MeasurementData } from '../../lib/measurements';
import { audit } from '../audit/log';
import type { CurrentUser } from '../auth/users';
import { newId } from '../auth/tokens';
import { getDb } from '../db/client';
import { listingFiles, type FileVariants, type Listing, type ListingFile } from '../db/schema';
import { conflict, HttpError, notFound, unauthenticated } from '../http/errors';
import { deleteObject, deletePrefix, getObjectBytes, headObject, ObjectTooLargeError, putObject } from '../storage/objects';
import { presignGet, presignPut } from '../storage/presign';
import { sniff, type SniffedType } from '../storage/sniff';
import { canSeeUnpublished, getListing } from './access';
import { isPublic } from './service';

interface KindRule {
  label: string;
  /** What the client may declare; browsers label CSV files differently depending on the installed spreadsheet program. */
  declaredTypes: readonly string[];
  /** What the bytes must really be. */
  realTypes: readonly SniffedType[];
  accepts: string;
  acceptsPlural: string;
  maxBytes: number;
}

const UPLOAD_RULES: Record<FileKind, KindRule> = {
  photo: {
    label: 'Photos',
    declaredTypes: UPLOAD_LIMITS.photo.declaredTypes,
    realTypes: ['image/jpeg', 'image/png', 'image/webp'],
    accepts: 'a JPEG, PNG or WebP image',
    acceptsPlural: 'JPEG, PNG or WebP images',
    maxBytes: UPLOAD_LIMITS.photo.maxBytes,
  },
  datasheet: {
    label: 'Datasheets',
    declaredTypes: UPLOAD_LIMITS.datasheet.declaredTypes,
    realTypes: ['application/pdf'],
    accepts: 'a PDF document',
    acceptsPlural: 'PDF documents',
    maxBytes: UPLOAD_LIMITS.datasheet.maxBytes,
  },
  measurement: {
    label: 'Measurement files',
    declaredTypes: UPLOAD_LIMITS.measurement.declaredTypes,
    realTypes: ['text/csv'],
    accepts: 'a CSV file (UTF-8 text)',
    acceptsPlural: 'CSV files (UTF-8 text)',
    maxBytes: UPLOAD_LIMITS.measurement.maxBytes,
  },
};

const MAX_IMAGE_SIDE_PX = 12_000;
const MAX_IMAGE_PIXELS = 60_000_000;
const THUMBNAIL_WIDTHS = { w320: 320, w1280: 1280 } as const;

/**
 * A pending upload may be completed for an hour: its PUT URL lives five minutes, but a large file started
 * late on a slow line may still be arriving long after. Older pending rows (and whatever was PUT for them)
 * are swept away when the listing's next upload starts.
 */
const PENDING_TTL_MS = 60 * 60 * 1000;

/** What the API and the pages show of a file. The URLs are ours and stable; they redirect to short-lived presigned GETs. */
export interface PublicFile {
  id: string;
  listingId: string;
  kind: FileKind;
  measurementKind: MeasurementKind | null;
  filename: string;
  contentType: string;
  size: number;
  width: number | null;
  height: number | null;
  position: number;
  urls: Partial<Record<FileVariant, string>>;
  /** A measurement's parsed points (and fit), as the measurement parser returned them. */
  data: MeasurementData | null;
  createdAt: string;
}

/** A reason to refuse what arrived; its message goes to the person uploading as is. */
class Refusal extends Error {}

const filePrefix = (file: Pick<ListingFile, 'listingId' | 'id'>) => `listings/${file.listingId}/${file.id}/`;

export function fileUrl(fileId: string, variant: FileVariant): string {
  return `/api/files/${encodeURIComponent(fileId)}?variant=${variant}`;
}

function variantsOf(file: Pick<ListingFile, 'kind'>): FileVariant[] {
  return file.kind === 'photo' ? ['full', 'w1280', 'w320', 'original'] : ['original'];
}

function toPublicFile(file: ListingFile): PublicFile {
  return {
    id: file.id,
    listingId: file.listingId,
    kind: file.kind,
    measurementKind: file.measurementKind,
    filename: file.filename,
    contentType: file.contentType,
    size: file.size,
    width: file.width,
    height: file.height,
    position: file.position,
    urls: Object.fromEntries(variantsOf(file).map((v) => [v, fileUrl(file.id, v)])),
    data: file.data as MeasurementData | null,
    createdAt: file.createdAt.toISOString(),
  };
}

const MB = 1024 * 1024;

function formatBytes(n: number): string {
  if (n >= MB) return `${Number((n / MB).toFixed(1))} MB`;
  if (n >= 1024) return `${Number((n / 1024).toFixed(1))} KB`;
  return n === 1 ? '1 byte' : `${n} bytes`;
}

const formatPx = (n: number) => n.toLocaleString('en-GB').replace(/,/g, '\u2009');

function isExpired(file: ListingFile, now = Date.now()): boolean {
  return file.status === 'pending' && file.createdAt.getTime() < now - PENDING_TTL_MS;
}

async function discardFile(file: ListingFile): Promise<void> {
  await deletePrefix(filePrefix(file));
  await getDb().delete(listingFiles).where(eq(listingFiles.id, file.id));
}

async function sweepExpiredUploads(listingId: string): Promise<void> {
  const stale = await getDb()
    .select()
    .from(listingFiles)
    .where(
      and(
        eq(listingFiles.listingId, listingId),
        eq(listingFiles.status, 'pending'),
        lt(listingFiles.createdAt, new Date(Date.now() - PENDING_TTL_MS)),
      ),
    );
  for (const file of stale) await discardFile(file);
}

async function findFile(listingId: string, fileId: string): Promise<ListingFile> {
  const [file] = await getDb()
    .select()
    .from(listingFiles)
    .where(and(eq(listingFiles.id, fileId), eq(listingFiles.listingId, listingId)))
    .limit(1);
  if (!file) throw notFound('No such file on this listing.');
  return file;
}

/** Checks what the client declares (type, size, the photo limit), records a pending file and signs the PUT. */
export async function createUpload(
  user: CurrentUser,
  listing: Listing,
  input: CreateUpload,
): Promise<{ fileId: string; uploadUrl: string }> {
  const rule = UPLOAD_RULES[input.kind];
  if (!rule.declaredTypes.includes(input.contentType)) {
    const message = `${rule.label} must be ${rule.acceptsPlural}, not ${input.contentType}.`;
    throw new HttpError(415, 'unsupported_media_type', message, { contentType: message });
  }
  if (input.size > rule.maxBytes) {
    const message = `${rule.label} may be at most ${formatBytes(rule.maxBytes)}; this file is ${formatBytes(input.size)}.`;
    throw new HttpError(413, 'payload_too_large', message, { size: message });
  }
  await sweepExpiredUploads(listing.id);

  const id = newId();
  const storageKey = `${filePrefix({ listingId: listing.id, id })}original`;
  // One write transaction for count and insert, so two uploads started together cannot both take the 12th place.
  await getDb().transaction(async (tx) => {
    const [counts] = await tx
      .select({ n: sql<number>`count(*)`, last: sql<number>`coalesce(max(${listingFiles.position}), -1)` })
      .from(listingFiles)
      .where(
        and(eq(listingFiles.listingId, listing.id), eq(listingFiles.kind, input.kind), inArray(listingFiles.status, ['pending', 'ready'])),
      );
    if (input.kind === 'photo' && (counts?.n ?? 0) >= MAX_PHOTOS_PER_LISTING) {
      throw conflict(`A listing has at most ${MAX_PHOTOS_PER_LISTING} photos. Remove one before adding another.`);
    }
    await tx.insert(listingFiles).values({
      id,
      listingId: listing.id,
      kind: input.kind,
      measurementKind: input.measurementKind ?? null,
      filename: input.filename,
      contentType: input.contentType,
      size: input.size,
      storageKey,
      status: 'pending',
      position: (counts?.last ?? -1) + 1,
      createdBy: user.id,
    });
  });
  return { fileId: id, uploadUrl: await presignPut(storageKey, input.contentType, input.size) };
}

interface Accepted {
  contentType: SniffedType;
  width?: number;
  height?: number;
  variants?: FileVariants;
  data?: Record<string, unknown>;
}

async function readArrived(file: ListingFile): Promise<Buffer> {
  const head = await headObject(file.storageKey);
  if (!head) throw new Refusal('The file never arrived in storage. Upload it again.');
  if (head.size !== file.size) {
    const max = UPLOAD_RULES[file.kind].maxBytes;
    const limit = head.size > max ? ` ${UPLOAD_RULES[file.kind].label} may be at most ${formatBytes(max)}.` : '';
    throw new Refusal(`The stored file is ${formatBytes(head.size)}, but ${formatBytes(file.size)} were declared.${limit}`);
  }
  try {
    const bytes = await getObjectBytes(file.storageKey, file.size);
    if (!bytes) throw new Refusal('The file never arrived in storage. Upload it again.');
    return bytes;
  } catch (err) {
    if (err instanceof ObjectTooLargeError)
      throw new Refusal(`The stored file is larger than the ${formatBytes(file.size)} that were declared.`);
    throw err;
  }
}

const FULL_EXTENSIONS: Record<string, string> = { 'image/jpeg': 'jpg', 'image/png': 'png', 'image/webp': 'webp' };

/**
 * Reads the size from the header before anything is decoded, so a small file claiming a huge canvas
 * (a decompression bomb) is refused without allocating its pixels. The served image is a re-encode:
 * auto-rotated from the EXIF orientation, then written without EXIF, GPS, XMP or IPTC (sharp keeps none
 * unless asked).
 */
async function acceptPhoto(file: ListingFile, bytes: Buffer, type: SniffedType): Promise<Accepted> {
  let width: number | undefined;
  let height: number | undefined;
  try {
    // metadata() reads the header only; lifting sharp's pixel limit here lets the refusal name the real size.
    ({ width, height } = await sharp(bytes, { limitInputPixels: false }).metadata());
  } catch {
    throw new Refusal('This image could not be read; the file may be damaged.');
  }
  if (!width || !height) throw new Refusal('This image does not say how large it is; the file may be damaged.');
  if (width > MAX_IMAGE_SIDE_PX || height > MAX_IMAGE_SIDE_PX || width * height > MAX_IMAGE_PIXELS) {
    throw new Refusal(
      `This image is ${formatPx(width)} × ${formatPx(height)} px; photos may be at most ${formatPx(MAX_IMAGE_SIDE_PX)} px per side and ${MAX_IMAGE_PIXELS / 1e6} megapixels.`,
    );
  }

  const prefix = filePrefix(file);
  const variants: FileVariants = { full: `${prefix}full.${FULL_EXTENSIONS[type]}` };
  let full: { data: Buffer; info: sharp.OutputInfo };
  const thumbs: [keyof typeof THUMBNAIL_WIDTHS, Buffer][] = [];
  try {
    // failOn 'error': cameras write JPEGs that libjpeg warns about yet decodes whole; only real damage refuses.
    const decoded = sharp(bytes, { limitInputPixels: MAX_IMAGE_PIXELS, failOn: 'error' }).rotate();
    const encoded =
      type === 'image/jpeg' ? decoded.jpeg({ quality: 90 }) : type === 'image/png' ? decoded.png() : decoded.webp({ quality: 90 });
    full = await encoded.toBuffer({ resolveWithObject: true });
    // Thumbnails come from the re-encoded full image: already upright and metadata-free, and far cheaper to decode again.
    for (const [name, w] of Object.entries(THUMBNAIL_WIDTHS) as [keyof typeof THUMBNAIL_WIDTHS, number][]) {
      thumbs.push([name, await sharp(full.data).resize({ width: w, withoutEnlargement: true }).webp({ quality: 82 }).toBuffer()]);
    }
  } catch {
    throw new Refusal('This image could not be decoded; the file may be damaged or truncated.');
  }
  await putObject(variants.full!, full.data, type);
  for (const [name, data] of thumbs) {
    variants[name] = `${prefix}${name}.webp`;
    await putObject(variants[name]!, data, 'image/webp');
  }
  return { contentType: type, width: full.info.width, height: full.info.height, variants };
}

function acceptMeasurement(file: ListingFile, bytes: Buffer): Accepted {
  // The parser's own line limit applies: it counts lines before it parses anything.
  const parsed = parseMeasurementCsv(file.measurementKind!, bytes.toString('utf8'));
  if (!parsed.ok) {
    const { line, column, message } = parsed.error;
    throw new Refusal(`Line ${line}${column === null ? '' : `, column ${column}`}: ${message}`);
  }
  return { contentType: 'text/csv', data: forStorage(parsed.data) as unknown as Record<string, unknown> };
}

async function accept(file: ListingFile): Promise<Accepted> {
  const bytes = await readArrived(file);
  const { type, description } = sniff(bytes);
  const rule = UPLOAD_RULES[file.kind];
  if (!type || !rule.realTypes.includes(type)) throw new Refusal(`This file is ${description}, not ${rule.accepts}.`);
  if (file.kind === 'photo') return acceptPhoto(file, bytes, type);
  if (file.kind === 'measurement') return acceptMeasurement(file, bytes);
  return { contentType: type };
}

function refusedError(message: string | null): HttpError {
  return new HttpError(422, 'unprocessable', message ?? 'This file was refused.');
}

/** Where a file ended up when another request settled or removed it first. */
async function settled(file: ListingFile): Promise<PublicFile> {
  const [now] = await getDb().select().from(listingFiles).where(eq(listingFiles.id, file.id)).limit(1);
  if (now?.status === 'ready') return toPublicFile(now);
  // Refused or removed meanwhile: nothing this request wrote may outlive that.
  await deletePrefix(filePrefix(file));
  if (!now) throw notFound('No such file on this listing.');
  throw refusedError(now.error);
}

/** A newer datasheet replaces the listing's older one once it has been accepted, not before. */
async function dropOlderDatasheets(user: CurrentUser, file: ListingFile): Promise<void> {
  const older = await getDb()
    .select()
    .from(listingFiles)
    .where(
      and(
        eq(listingFiles.listingId, file.listingId),
        eq(listingFiles.kind, 'datasheet'),
        eq(listingFiles.status, 'ready'),
        ne(listingFiles.id, file.id),
      ),
    );
  for (const old of older) {
    await discardFile(old);
    await audit({
      actorId: user.id,
      action: 'listing.file.replaced',
      subjectType: 'listing',
      subjectId: file.listingId,
      data: { fileId: old.id, by: file.id },
    });
  }
}

/**
 * Judges the stored object and settles the file: ready (served variants written, the original of a photo
 * deleted) or refused (every object under the file's prefix deleted, 422 with the reason). Safe to repeat:
 * a ready file comes back as it is. Both outcomes are written only while the row is still pending, so a
 * second request racing the first never undoes its result.
 */
export async function completeUpload(user: CurrentUser, listing: Listing, fileId: string): Promise<PublicFile> {
  const file = await findFile(listing.id, fileId);
  if (file.status === 'ready') return toPublicFile(file);
  if (file.status === 'refused') {
    // Again, in case deleting failed the first time round.
    await deletePrefix(filePrefix(file));
    throw refusedError(file.error);
  }
  if (isExpired(file)) {
    await discardFile(file);
    throw notFound('This upload has expired. Start it again.');
  }

  const db = getDb();
  const pending = and(eq(listingFiles.id, file.id), eq(listingFiles.status, 'pending'));
  let accepted: Accepted;
  try {
    accepted = await accept(file);
  } catch (err) {
    if (!(err instanceof Refusal)) throw err;
    const [refused] = await db.update(listingFiles).set({ status: 'refused', error: err.message }).where(pending).returning();
    if (!refused) return settled(file);
    await deletePrefix(filePrefix(file));
    await audit({
      actorId: user.id,
      action: 'listing.file.refused',
      subjectType: 'listing',
      subjectId: listing.id,
      data: { fileId: file.id, reason: err.message },
    });
    throw refusedError(err.message);
  }

  const [ready] = await db
    .update(listingFiles)
    .set({
      status: 'ready',
      error: null,
      contentType: accepted.contentType,
      width: accepted.width ?? null,
      height: accepted.height ?? null,
      variants: accepted.variants ?? null,
      data: accepted.data ?? null,
    })
    .where(pending)
    .returning();
  if (!ready) return settled(file);
  // The uploaded photo still carries its EXIF and GPS data; only the re-encode is kept.
  if (ready.kind === 'photo') await deleteObject(ready.storageKey);
  if (ready.kind === 'datasheet') await dropOlderDatasheets(user, ready);
  await audit({
    actorId: user.id,
    action: 'listing.file.added',
    subjectType: 'listing',
    subjectId: listing.id,
    data: { fileId: ready.id, kind: ready.kind },
  });
  return toPublicFile(ready);
}

export async function removeFile(user: CurrentUser, listing: Listing, fileId: string): Promise<void> {
  const file = await findFile(listing.id, fileId);
  await discardFile(file);
  await audit({
    actorId: user.id,
    action: 'listing.file.removed',
    subjectType: 'listing',
    subjectId: listing.id,
    data: { fileId: file.id, kind: file.kind },
  });
}

/** The listing's accepted files, photos in their order first. */
export async function listFiles(listingId: string): Promise<PublicFile[]> {
  const rows = await getDb()
    .select()
    .from(listingFiles)
    .where(and(eq(listingFiles.listingId, listingId), eq(listingFiles.status, 'ready')))
    .orderBy(
      sql`case ${listingFiles.kind} when 'photo' then 0 when 'datasheet' then 1 else 2 end`,
      listingFiles.position,
      listingFiles.createdAt,
    );
  return rows.map(toPublicFile);
}

/**
 * The guard for reading a file: anyone for a public listing, else its lab, moderators and admins.
 * Signed-in people who may not see it get 404, so that unpublished listings do not reveal themselves.
 */
export async function requireFileReader(ctx: { locals: App.Locals }, fileId: string): Promise<ListingFile> {
  const [file] = await getDb().select().from(listingFiles).where(eq(listingFiles.id, fileId)).limit(1);
  const listing = file?.status === 'ready' ? await getListing(file.listingId) : null;
  if (!file || !listing) throw notFound('No such file.');
  if (isPublic(listing) || canSeeUnpublished(ctx.locals.user, listing)) return file;
  if (!ctx.locals.user) throw unauthenticated();
  throw notFound('No such file.');
}

const SERVED_TYPES: Record<string, string> = { 'text/csv': 'text/csv; charset=utf-8' };

function downloadName(file: ListingFile, ext: string): string {
  const base = file.filename.replace(/\.[^.]*$/, '') || 'file';
  return `${base}.${ext}`;
}

/**
 * A presigned GET for one variant, or null when the file has none. A photo's `original` is its full
 * re-encode offered as a download: the uploaded bytes are never kept, since they carry EXIF and GPS data.
 */
export async function presignFileUrl(file: ListingFile, variant: FileVariant): Promise<string | null> {
  if (!variantsOf(file).includes(variant)) return null;
  if (file.kind !== 'photo') {
    return presignGet(file.storageKey, {
      contentType: SERVED_TYPES[file.contentType] ?? file.contentType,
      disposition: 'attachment',
      filename: file.filename,
    });
  }
  const key = variant === 'original' ? file.variants?.full : file.variants?.[variant];
  if (!key) return null;
  const webp = variant === 'w320' || variant === 'w1280';
  const contentType = webp ? 'image/webp' : file.contentType;
  const ext = webp ? 'webp' : (FULL_EXTENSIONS[file.contentType] ?? 'bin');
  return presignGet(key, { contentType, disposition: variant === 'original' ? 'attachment' : 'inline', filename: downloadName(file, ext) });
}

export function defaultVariant(file: Pick<ListingFile, 'kind'>): FileVariant {
  return file.kind === 'photo' ? 'full' : 'original';
}
