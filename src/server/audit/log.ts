import { getDb, type Db } from '../db/client';
import { auditLog } from '../db/schema';

export interface AuditEntry {
  actorId: string | null;
  action: string;
  subjectType: string;
  subjectId: string;
  data?: Record<string, unknown>;
}

export async function audit(entry: AuditEntry, tx: Pick<Db, 'insert'> = getDb()): Promise<void> {
  await tx.insert(auditLog).values({ ...entry, data: entry.data ?? null });
}
