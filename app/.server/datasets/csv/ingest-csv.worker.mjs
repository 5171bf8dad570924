// The worker thread behind ingestCsvOffThread (ingest-csv-pool.server.ts): runs the same
// ingestCsv, loaded from its TypeScript source by tsx (as scripts/serve.js loads the export
// worker), and hands the column arrays back by transfer instead of copying them.
import { move, transferableSymbol, valueSymbol } from "piscina";

let loaded;

/**
 * A process started through tsx (scripts, benchmarks) passes its loader on to its threads, which
 * then import TypeScript directly; under plain node (the production server) tsx is loaded here.
 */
async function load() {
  try {
    return await import("./ingest-csv.server.ts");
  } catch (error) {
    if (error?.code !== "ERR_UNKNOWN_FILE_EXTENSION") throw error;
    const { tsImport } = await import("tsx/esm/api");
    return tsImport("./ingest-csv.server.ts", import.meta.url);
  }
}

/** @param {{ filePath: string, options: unknown }} task */
export default async function ingest(task) {
  loaded ??= load();
  const { ingestCsv } = await loaded;
  const result = await ingestCsv(task.filePath, task.options);
  if (!result.ok) return result;
  // A symmetric error is one array shared by two fields: each buffer is listed once.
  const buffers = new Set();
  for (const column of Object.values(result.columns)) if (column) buffers.add(column.buffer);
  return move({ [transferableSymbol]: [...buffers], [valueSymbol]: result });
}
