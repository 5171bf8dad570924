import { recordAudit } from "../platform/audit.server";
import type { Db } from "../platform/db.server";
import { newSecret } from "../platform/tokens.server";

const PREFIX = "sdn_";

/** Creates a personal access token; the secret is returned once and only its hash is kept. */
export async function createApiToken(db: Db, userId: string, name: string, ip: string | null) {
  const { secret, hash } = newSecret(PREFIX);
  const row = await db
    .insertInto("api_token")
    .values({ user_id: userId, name, token_hash: hash, prefix: secret.slice(0, PREFIX.length + 6) })
    .returning(["id", "name", "prefix", "created_at"])
    .executeTakeFirstOrThrow();
  await recordAudit(db, { action: "api-token-created", actorId: userId, ip, detail: { tokenId: row.id, name } });
  return { ...row, secret };
}

export async function listApiTokens(db: Db, userId: string) {
  return db
    .selectFrom("api_token")
    .select(["id", "name", "prefix", "created_at", "last_used_at", "revoked_at"])
    .where("user_id", "=", userId)
    .orderBy("created_at", "desc")
    .execute();
}

export async function revokeApiToken(db: Db, userId: string, tokenId: string, ip: string | null): Promise<boolean> {
  const res = await db
    .updateTable("api_token")
    .set({ revoked_at: new Date() })
    .where("id", "=", tokenId)
    .where("user_id", "=", userId)
    .where("revoked_at", "is", null)
    .executeTakeFirst();
  const done = Number(res.numUpdatedRows) > 0;
  if (done) await recordAudit(db, { action: "api-token-revoked", actorId: userId, ip, detail: { tokenId } });
  return done;
}
