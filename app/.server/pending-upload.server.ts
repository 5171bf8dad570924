import { createHmac, timingSafeEqual } from "node:crypto";
import { env } from "./env.server";

/**
 * A file waiting for its column mapping is named in the URL by its temporary file and a MAC
 * over that name, the uploader, the dataset, the content hash and the file name: another user,
 * another dataset, a swapped file or a forged file name does not verify.
 */
interface PendingClaim {
  id: string;
  userId: string;
  datasetId: string;
  sha256: string;
  fileName: string;
}

function mac(c: PendingClaim): string {
  return createHmac("sha256", env.SESSION_SECRET).update(["pending-upload", c.id, c.userId, c.datasetId, c.sha256, c.fileName].join("\n")).digest("base64url");
}

export function signPending(c: PendingClaim): string {
  return `${c.id}.${mac(c)}`;
}

/** The temporary file's id if the token was made for exactly this claim, else null. */
export function pendingIdOf(token: string): string | null {
  const dot = token.lastIndexOf(".");
  return dot > 0 ? token.slice(0, dot) : null;
}

export function verifyPending(token: string, c: PendingClaim): boolean {
  const dot = token.lastIndexOf(".");
  if (dot <= 0 || token.slice(0, dot) !== c.id) return false;
  const given = Buffer.from(token.slice(dot + 1));
  const want = Buffer.from(mac(c));
  return given.length === want.length && timingSafeEqual(given, want);
}
