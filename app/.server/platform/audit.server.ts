import type { Db } from "./db.server";

export type AuditAction =
  | "sign-in"
  | "sign-in-failed"
  | "sign-out"
  | "sign-out-everywhere"
  | "sign-up"
  | "email-confirmed"
  | "password-reset-requested"
  | "password-reset"
  | "manuscript-created"
  | "member-invited"
  | "member-joined"
  | "member-role-changed"
  | "member-removed"
  | "account-disabled"
  | "account-enabled"
  | "account-reset"
  | "api-token-created"
  | "api-token-revoked"
  | "dataset-created"
  | "dataset-renamed"
  | "dataset-retired"
  | "revision-uploaded"
  | "revision-rejected"
  | "revision-identical"
  | "raw-file-downloaded"
  | "figure-created"
  | "figure-draft-saved"
  | "version-sealed"
  | "version-superseded"
  | "signoff-requested"
  | "version-signed-off"
  | "version-returned"
  | "version-commented"
  | "export-requested"
  | "export-preflight-overridden"
  | "export-completed"
  | "export-failed";

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

export async function listManuscriptAudit(db: Db, manuscriptId: string, limit = 200) {
  return db
    .selectFrom("audit_event")
    .leftJoin("app_user", "app_user.id", "audit_event.actor_id")
    .select(["audit_event.id", "audit_event.at", "audit_event.action", "audit_event.detail", "app_user.name as actorName", "app_user.email as actorEmail"])
    .where("audit_event.manuscript_id", "=", manuscriptId)
    .orderBy("audit_event.id", "desc")
    .limit(limit)
    .execute();
}
