import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import path from 'node:path';

/** Any API object as the provider returns it: at least `id` and `object` (its type). */
export interface StripeObject {
  id: string;
  object: string;
  created?: number;
  [field: string]: unknown;
}

export interface StoredResponse {
  status: number;
  body: unknown;
  requestId: string;
}

export interface IdempotencyRecord {
  path: string;
  bodyHash: string;
  createdAtMs: number;
  response: StoredResponse;
}

interface StateFile {
  version: 1;
  /** Objects by type (`event`, `checkout.session`, ...), then by id, in insertion order. */
  objects: Record<string, Record<string, StripeObject>>;
  idempotency: Record<string, IdempotencyRecord>;
}

function emptyState(): StateFile {
  return { version: 1, objects: {}, idempotency: {} };
}

function readStateFile(file: string): StateFile {
  if (!existsSync(file)) return emptyState();
  const parsed: unknown = JSON.parse(readFileSync(file, 'utf8'));
  if (typeof parsed !== 'object' || parsed === null || (parsed as { version?: unknown }).version !== 1) {
    // Refuse rather than start empty: silently dropping a developer's orders would be worse.
    throw new Error(`${file} is not a payments fake state file (version 1); move it away to start afresh`);
  }
  return parsed as StateFile;
}

/**
 * The fake's whole state, in memory and in one JSON file. Objects handed out are the stored ones:
 * change them in place, then `save()`.
 */
export class StateStore {
  private constructor(
    private readonly file: string,
    private readonly data: StateFile,
  ) {}

  static open(file: string): StateStore {
    mkdirSync(path.dirname(file), { recursive: true });
    return new StateStore(file, readStateFile(file));
  }

  insert<T extends StripeObject>(object: T): T {
    const byId = (this.data.objects[object.object] ??= {});
    byId[object.id] = object;
    return object;
  }

  get<T extends StripeObject = StripeObject>(type: string, id: string): T | undefined {
    return this.data.objects[type]?.[id] as T | undefined;
  }

  /** Newest first, the order of the provider's list endpoints. */
  list<T extends StripeObject = StripeObject>(type: string): T[] {
    return Object.values(this.data.objects[type] ?? {}).reverse() as T[];
  }

  get idempotency(): Record<string, IdempotencyRecord> {
    return this.data.idempotency;
  }

  /**
   * Written synchronously so that no request can interleave with a half-written snapshot;
   * the rename makes a crash leave either the old file or the new one.
   */
  save(): void {
    const temp = `${this.file}.tmp`;
    writeFileSync(temp, `${JSON.stringify(this.data, null, 2)}\n`);
    renameSync(temp, this.file);
  }
}
