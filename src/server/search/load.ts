/**
 * Reading listings for the index from the database: the searchable ones (public, approved, in stock)
 * with their lab and ready photos and measurement files, and the two change cursors other app
 * instances' writes show up in.
 */
import { and, asc, eq, gt, gte, inArray, isNotNull, like, sql } from 'drizzle-orm';
import { getDb } from '../db/client';
import { auditLog, labs, listingFiles, listings } from '../db/schema';
import { PUBLIC_STATUSES } from '../listings/service';
import { toSearchDoc, type FileRow, type ListingRow, type SearchDoc } from './documents';

/** SQLite's default bound-parameter limit is far above this; chunks keep statements small. */
const CHUNK = 500;

function chunks<T>(xs: readonly T[]): T[][] {
  const out: T[][] = [];
  for (let i = 0; i < xs.length; i += CHUNK) out.push(xs.slice(i, i + CHUNK));
  return out;
}

async function filesFor(listingIds: readonly string[] | null): Promise<Map<string, FileRow[]>> {
  const db = getDb();
  const where = (ids?: string[]) =>
    and(
      eq(listingFiles.status, 'ready'),
      inArray(listingFiles.kind, ['photo', 'measurement']),
      ids ? inArray(listingFiles.listingId, ids) : undefined,
    );
  const select = (ids?: string[]) =>
    db
      .select({ id: listingFiles.id, listingId: listingFiles.listingId, kind: listingFiles.kind, data: listingFiles.data })
      .from(listingFiles)
      .where(where(ids))
      .orderBy(asc(listingFiles.position), asc(listingFiles.createdAt));
  const rows = listingIds === null ? await select() : (await Promise.all(chunks(listingIds).map((ids) => select(ids)))).flat();
  const by = new Map<string, FileRow[]>();
  for (const r of rows) {
    const list = by.get(r.listingId) ?? [];
    list.push({ id: r.id, kind: r.kind, data: r.data });
    by.set(r.listingId, list);
  }
  return by;
}

/** A listing enters search when the public can see its approved version and it is in stock. */
const searchable = and(isNotNull(listings.published), inArray(listings.status, PUBLIC_STATUSES), gt(listings.quantity, 0));

const listingColumns = {
  id: listings.id,
  category: listings.category,
  quantity: listings.quantity,
  published: listings.published,
  version: listings.version,
  hazards: listings.hazards,
  exportControlled: listings.exportControlled,
  labName: labs.name,
};

type Row = Omit<ListingRow, 'published'> & { published: ListingRow['published'] | null };

/** The rows come through `searchable`, so each has its published version. */
function docsOf(rows: Row[], files: Map<string, FileRow[]>): SearchDoc[] {
  return rows.flatMap((r) => (r.published === null ? [] : [toSearchDoc({ ...r, published: r.published }, files.get(r.id) ?? [])]));
}

/** Every searchable listing. */
export async function loadAll(): Promise<SearchDoc[]> {
  const [rows, files] = await Promise.all([
    getDb().select(listingColumns).from(listings).innerJoin(labs, eq(labs.id, listings.labId)).where(searchable),
    filesFor(null),
  ]);
  return docsOf(rows, files);
}

/** The searchable listings among these ids (the others have left search or never entered it). */
export async function loadSome(ids: readonly string[]): Promise<{ docs: SearchDoc[]; versions: Map<string, number> }> {
  const db = getDb();
  const all = (
    await Promise.all(
      chunks(ids).map((c) => db.select({ id: listings.id, version: listings.version }).from(listings).where(inArray(listings.id, c))),
    )
  ).flat();
  const rows = (
    await Promise.all(
      chunks(ids).map((c) =>
        db
          .select(listingColumns)
          .from(listings)
          .innerJoin(labs, eq(labs.id, listings.labId))
          .where(and(searchable, inArray(listings.id, c))),
      ),
    )
  ).flat();
  const files = rows.length ? await filesFor(rows.map((r) => r.id)) : new Map<string, FileRow[]>();
  return { docs: docsOf(rows, files), versions: new Map(all.map((r) => [r.id, r.version])) };
}

export interface Cursors {
  /** Latest listings.updated_at seen, ms. */
  updatedAt: number;
  /** Latest audit_log id seen: file additions and removals are audited with their listing. */
  auditId: number;
}

export async function currentCursors(): Promise<Cursors> {
  const db = getDb();
  const [[l], [a]] = await Promise.all([
    db.select({ t: sql<number | null>`max(${listings.updatedAt})` }).from(listings),
    db.select({ id: sql<number | null>`max(${auditLog.id})` }).from(auditLog),
  ]);
  return { updatedAt: Number(l?.t ?? 0), auditId: Number(a?.id ?? 0) };
}

/** Listings written since `sinceMs` (id and version), through the updated_at index. */
export async function listingsChangedSince(sinceMs: number) {
  return getDb()
    .select({ id: listings.id, version: listings.version, updatedAt: listings.updatedAt })
    .from(listings)
    .where(gte(listings.updatedAt, new Date(sinceMs)));
}

/** Listings whose files were added or removed after audit entry `afterId`. */
export async function fileChangesAfter(afterId: number) {
  return getDb()
    .select({ id: auditLog.id, listingId: auditLog.subjectId })
    .from(auditLog)
    .where(and(gt(auditLog.id, afterId), eq(auditLog.subjectType, 'listing'), like(auditLog.action, 'listing.file.%')));
}
