// Runs before the server starts: makes the storage folders and removes temporary files that
// interrupted uploads left behind.
import { mkdirSync } from "node:fs";
import path from "node:path";

const root = path.resolve(process.env.STORAGE_DIR ?? "storage");
mkdirSync(path.join(root, "tmp"), { recursive: true });
mkdirSync(path.join(root, "blobs"), { recursive: true });
try {
  const { createBlobStoreFromEnv } = await import("../app/.server/storage/from-env.server");
  const removed = await createBlobStoreFromEnv().cleanupTemp(0);
  if (removed > 0) console.log(`[steradian] removed ${removed} temporary upload file(s) left by interrupted uploads`);
} catch (e) {
  if ((e as NodeJS.ErrnoException).code !== "ERR_MODULE_NOT_FOUND") throw e;
}
