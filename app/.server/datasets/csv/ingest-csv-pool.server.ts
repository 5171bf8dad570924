import { existsSync } from "node:fs";
import { availableParallelism } from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { Piscina } from "piscina";
import type { IngestOptions, IngestResult } from "./ingest-csv.server";

const WORKER = "app/.server/datasets/csv/ingest-csv.worker.mjs";

/**
 * The worker file is a source file, loaded as it is: from this module's own folder while
 * running from source (tests, scripts), from the project root when bundled into
 * build/server/index.js. Both lie inside the project, so the first ancestor folder that holds
 * the worker's project path is the root.
 */
function workerFile(): string {
  for (let dir = path.dirname(fileURLToPath(import.meta.url)); ; ) {
    const candidate = path.join(dir, WORKER);
    if (existsSync(candidate)) return candidate;
    const parent = path.dirname(dir);
    if (parent === dir) throw new Error(`the CSV ingest worker ${WORKER} was not found above ${fileURLToPath(import.meta.url)}`);
    dir = parent;
  }
}

let pool: Piscina | undefined;
function ingestPool(): Piscina {
  return (pool ??= new Piscina({
    filename: workerFile(),
    // Leave a core to the event loop that answers requests; a further upload waits its turn.
    minThreads: 0,
    maxThreads: Math.max(1, availableParallelism() - 1),
    // A worker holds its own heap; let it go after a quiet minute.
    idleTimeout: 60_000,
  }));
}

/**
 * `ingestCsv` on a worker thread (docs/decisions/0012-hardening.md, "Staying responsive"):
 * parsing, validating, hashing and the duplicate check of a large file take seconds of CPU
 * that would otherwise hold the server's event loop. Same code, same result; the columns come
 * back transferred, not copied.
 */
export function ingestCsvOffThread(filePath: string, options: IngestOptions): Promise<IngestResult> {
  return ingestPool().run({ filePath, options }) as Promise<IngestResult>;
}

/** Ends the worker threads (tests and scripts that must exit). */
export async function closeIngestPool(): Promise<void> {
  const p = pool;
  pool = undefined;
  await p?.destroy();
}
