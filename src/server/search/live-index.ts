/**
 * The process's search index, kept in step with the database without a restart:
 * - built from the database at first use;
 * - in this process, onListingChanged re-reads the listing at once (searches wait for that);
 * - for writes by other app instances on the same libSQL server, a poll every 2 s (and before a
 *   search when the last poll is older) reads two cursors: listings.updated_at, re-read with a
 *   10 s look-back so a write committed late or stamped by a slightly slow clock is not missed (rows
 *   whose version the index already has are skipped), and audit_log ids of file additions and
 *   removals, which change a listing's measurements and photo without touching the listing row.
 * Listings that become searchable or are approved again go to the saved-search matcher.
 */
import { Catalogue } from './catalogue';
import { currentCursors, fileChangesAfter, listingsChangedSince, loadAll, loadSome, type Cursors } from './load';

const POLL_MS = 2_000;
const LOOKBACK_MS = 10_000;

type ApprovalListener = (catalogue: Catalogue, listingIds: string[]) => Promise<void>;

export class LiveIndex {
  readonly catalogue = new Catalogue();
  private built: Promise<void> | null = null;
  private cursors: Cursors = { updatedAt: 0, auditId: 0 };
  /** listings.version last read per listing, searchable or not. */
  private readonly versions = new Map<string, number>();
  private lastPoll = 0;
  private polling: Promise<void> | null = null;
  private readonly inFlight = new Set<Promise<unknown>>();
  private timer: ReturnType<typeof setInterval> | null = null;

  constructor(private readonly onApproved: ApprovalListener) {}

  /** The catalogue, built and up to date with this process's writes and, within 2 s, everyone else's. */
  async fresh(): Promise<Catalogue> {
    await this.ensureBuilt();
    if (Date.now() - this.lastPoll > POLL_MS) await this.poll();
    while (this.inFlight.size > 0) await Promise.all([...this.inFlight]);
    return this.catalogue;
  }

  ensureBuilt(): Promise<void> {
    this.built ??= this.build();
    return this.built;
  }

  private async build(): Promise<void> {
    // Cursors first: whatever changes while the rows load is read again by the first poll.
    this.cursors = await currentCursors();
    for (const doc of await loadAll()) {
      this.catalogue.upsert(doc);
      this.versions.set(doc.id, doc.version);
    }
    this.lastPoll = Date.now();
    this.timer = setInterval(() => void this.poll().catch((e) => console.error('[search poll]', e)), POLL_MS);
    this.timer.unref();
  }

  /** A listing changed in this process: re-read it now, and offer it to the saved-search matcher. */
  listingChanged(id: string): Promise<void> {
    const work = this.ensureBuilt()
      .then(() => this.reread([id], true))
      .catch((e) => console.error('[search] re-reading listing', id, e));
    this.inFlight.add(work);
    void work.finally(() => this.inFlight.delete(work));
    return work;
  }

  poll(): Promise<void> {
    this.polling ??= this.pollOnce().finally(() => {
      this.polling = null;
    });
    return this.polling;
  }

  private async pollOnce(): Promise<void> {
    const startedAt = Date.now();
    const [rows, files] = await Promise.all([
      listingsChangedSince(this.cursors.updatedAt - LOOKBACK_MS),
      fileChangesAfter(this.cursors.auditId),
    ]);
    const ids = new Set<string>();
    for (const r of rows) {
      this.cursors.updatedAt = Math.max(this.cursors.updatedAt, r.updatedAt.getTime());
      if (this.versions.get(r.id) !== r.version) ids.add(r.id);
    }
    for (const f of files) {
      this.cursors.auditId = Math.max(this.cursors.auditId, f.id);
      ids.add(f.listingId);
    }
    if (ids.size > 0) await this.reread([...ids], false);
    this.lastPoll = startedAt;
  }

  /**
   * Re-reads listings: searchable ones are (re)indexed, the others leave. Those that entered search
   * or carry a new approval go to the matcher; from an in-process change every searchable one does,
   * since this process may have built its index after the change.
   */
  private async reread(ids: string[], local: boolean): Promise<void> {
    const { docs, versions } = await loadSome(ids);
    for (const [id, v] of versions) this.versions.set(id, v);
    const present = new Set(docs.map((d) => d.id));
    const approved: string[] = [];
    for (const doc of docs) {
      const before = this.catalogue.get(doc.id);
      if (local || before === undefined || before.approvedAt !== doc.approvedAt) approved.push(doc.id);
      this.catalogue.upsert(doc);
    }
    for (const id of ids) if (!present.has(id)) this.catalogue.remove(id);
    if (approved.length > 0) await this.onApproved(this.catalogue, approved).catch((e) => console.error('[saved searches]', e));
  }

  stop(): void {
    if (this.timer) clearInterval(this.timer);
    this.timer = null;
  }
}
