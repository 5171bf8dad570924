import { createHash, randomBytes } from "node:crypto";

/** A URL-safe random secret and the SHA-256 that the database stores in its place. */
export function newSecret(prefix = ""): { secret: string; hash: string } {
  const secret = prefix + randomBytes(32).toString("base64url");
  return { secret, hash: hashSecret(secret) };
}

export function hashSecret(secret: string): string {
  return createHash("sha256").update(secret, "utf8").digest("hex");
}
