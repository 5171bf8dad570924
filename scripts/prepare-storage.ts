// Runs before the server starts: makes the storage folders and removes temporary files that
// interrupted uploads left behind (one machine: no other process can be mid-upload now).
import { createBlobStoreFromEnv } from "../app/.server/storage/from-env.server";

const removed = await createBlobStoreFromEnv().cleanupTemp(0);
if (removed > 0) console.log(`[steradian] removed ${removed} temporary upload file(s) left by interrupted uploads`);
