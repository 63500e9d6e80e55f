import { auditEvents } from '../db/schema';
import type { Tx } from '../db/client';

export interface AuditEntry {
  actorId: string | null;
  projectId?: string | null;
  action: string;
  targetType: string;
  targetId?: string | null;
  detail?: Record<string, unknown>;
}

/** Write one audit event, in the caller's transaction so the change and its record land together. */
export async function audit(tx: Tx, entry: AuditEntry): Promise<void> {
  await tx.insert(auditEvents).values({
    actorId: entry.actorId,
    projectId: entry.projectId ?? null,
    action: entry.action,
    targetType: entry.targetType,
    targetId: entry.targetId ?? null,
    detail: entry.detail ?? {},
  });
}
