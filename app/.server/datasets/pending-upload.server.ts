import { createHmac, timingSafeEqual } from "node:crypto";
import { env } from "../platform/env.server";
import { statPending } from "./revision-upload.server";

/**
 * A file waiting for its column mapping is named in the URL by a token: its temporary file,
 * its content hash (known when it was received, so it is never read again to be hashed), and
 * a MAC over those, the uploader, the dataset and the file name. Another user, another
 * dataset or a forged file name does not verify.
 */
interface PendingClaim {
  userId: string;
  datasetId: string;
  fileName: string;
}

function mac(id: string, sha256: string, c: PendingClaim): string {
  return createHmac("sha256", env.SESSION_SECRET).update(["pending-upload", id, c.userId, c.datasetId, sha256, c.fileName].join("\n")).digest("base64url");
}

export function signPending(file: { id: string; sha256: string }, c: PendingClaim): string {
  return `${file.id}.${file.sha256}.${mac(file.id, file.sha256, c)}`;
}

/** The waiting file if the token was made for exactly this claim and the file is still there. */
export async function openPending(token: string, c: PendingClaim): Promise<{ tempPath: string; sha256: string; bytes: number } | null> {
  const parts = token.split(".");
  if (parts.length !== 4) return null;
  const [name, ext, sha256, given] = parts;
  const id = `${name}.${ext}`;
  if (!/^[0-9a-f]{64}$/.test(sha256)) return null;
  const want = Buffer.from(mac(id, sha256, c));
  const got = Buffer.from(given);
  if (got.length !== want.length || !timingSafeEqual(got, want)) return null;
  const file = await statPending(id);
  return file ? { ...file, sha256 } : null;
}
