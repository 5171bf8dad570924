// Export workers (docs/decisions/0011-export-jobs.md). `npm run worker [-- --count N]` starts N
// workers in this process against DATABASE_URL and STORAGE_DIR/STORAGE_DRIVER, on this machine or
// another one sharing the database and storage; scripts/serve.js starts one inside the app.
import { pathToFileURL } from "node:url";
import { startBoss, startExportWorker } from "../app/.server/exports/export-jobs.server";
import { db } from "../app/.server/platform/db.server";
import { env } from "../app/.server/platform/env.server";
import { createBlobStoreFromEnv } from "../app/.server/storage/from-env.server";

/** Starts `count` workers; returns a function that stops them and the queue connection. */
export async function runWorkers(count: number): Promise<() => Promise<void>> {
  const boss = await startBoss(env.DATABASE_URL, { maintenanceIntervalSeconds: env.EXPORT_MAINTENANCE_SECONDS });
  const store = createBlobStoreFromEnv();
  const stops: (() => Promise<void>)[] = [];
  for (let i = 0; i < count; i++) stops.push(await startExportWorker(db, store, boss));
  console.log(`[steradian] ${count} export worker(s) on the queue`);
  return async () => {
    for (const stop of stops) await stop();
    await boss.stop({ graceful: true, wait: true });
  };
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const i = process.argv.indexOf("--count");
  const count = i >= 0 ? Number(process.argv[i + 1]) : 1;
  if (!Number.isInteger(count) || count < 1 || count > 64) {
    process.stderr.write("usage: npm run worker [-- --count N]   (1 ≤ N ≤ 64)\n");
    process.exit(2);
  }
  const stop = await runWorkers(count);
  const quit = () => void stop().then(() => process.exit(0));
  process.on("SIGTERM", quit);
  process.on("SIGINT", quit);
}
