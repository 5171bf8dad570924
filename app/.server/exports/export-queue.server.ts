// The app's handle on the export queue, for sending jobs; started once per process.
import type PgBoss from "pg-boss";
import { env } from "../platform/env.server";
import { startBoss } from "./export-jobs.server";

declare global {
  var __steradianExportQueue: Promise<PgBoss> | undefined;
}

/** Sends only: the workers (scripts/worker.ts) run pg-boss's maintenance, which retries dead jobs. */
export function exportQueue(): Promise<PgBoss> {
  globalThis.__steradianExportQueue ??= startBoss(env.DATABASE_URL, { supervise: false }).catch((e: unknown) => {
    globalThis.__steradianExportQueue = undefined;
    throw e;
  });
  return globalThis.__steradianExportQueue;
}
