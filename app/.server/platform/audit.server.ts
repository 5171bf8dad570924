import type { Db } from "./db.server";

import type { AuditAction } from "~/activity/activity-sentence";

export type { AuditAction };

export interface AuditEntry {
  action: AuditAction;
  actorId?: string | null;
  manuscriptId?: string | null;
  detail?: Record<string, unknown>;
  ip?: string | null;
}

/** Appends to the audit log; the table refuses UPDATE and DELETE. */
export async function recordAudit(db: Db, e: AuditEntry): Promise<void> {
  await db
    .insertInto("audit_event")
    .values({
      action: e.action,
      actor_id: e.actorId ?? null,
      manuscript_id: e.manuscriptId ?? null,
      detail: JSON.stringify(e.detail ?? {}),
      ip: e.ip ?? null,
    })
    .execute();
}
