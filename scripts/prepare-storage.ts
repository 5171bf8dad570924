// Runs before the server starts: makes the storage folders, removes temporary files that
// interrupted uploads left behind (one machine: no other process can be mid-upload now), and
// removes stored files that no database row names (a crash between storing a file and
// committing its revision). DATABASE_URL and STORAGE_DIR must be given explicitly.
export {};

if (!process.env.DATABASE_URL || !process.env.STORAGE_DIR) {
  console.error("prepare-storage needs DATABASE_URL and STORAGE_DIR set to the installation's own.");
  process.exit(2);
}
const { createBlobStoreFromEnv } = await import("../app/.server/storage/from-env.server");
const { sweepOrphanBlobs } = await import("../app/.server/storage/sweep-orphan-blobs.server");
const { db } = await import("../app/.server/platform/db.server");
const { env } = await import("../app/.server/platform/env.server");

const removed = await createBlobStoreFromEnv().cleanupTemp(0);
if (removed > 0) console.log(`[steradian] removed ${removed} temporary upload file(s) left by interrupted uploads`);
try {
  if (env.STORAGE_DRIVER === "local") {
    const orphans = await sweepOrphanBlobs(db, env.STORAGE_DIR);
    if (orphans > 0) console.log(`[steradian] removed ${orphans} stored file(s) that no revision names (left by an interrupted upload)`);
  }
} finally {
  await db.destroy();
}
