// WEB_CONCURRENCY > 1: this process becomes a node:cluster primary that runs that many copies of
// the server, sharing the port, restarts one that dies, and passes SIGTERM/SIGINT on
// (docs/decisions/0012-hardening.md). The app keeps no state in its process, so any copy can
// answer any request. Returns at once in a worker or with one process.
import cluster from "node:cluster";

export async function clusterPrimary() {
  const count = Number(process.env.WEB_CONCURRENCY ?? 1);
  if (!cluster.isPrimary || !Number.isInteger(count) || count <= 1) return;
  let stopping = false;
  for (let i = 0; i < count; i++) cluster.fork();
  cluster.on("exit", (worker, code, signal) => {
    if (stopping) {
      if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(0);
      return;
    }
    console.error(`[steradian] server process ${worker.process.pid} ended (${signal ?? code}); starting another`);
    cluster.fork();
  });
  const stop = () => {
    stopping = true;
    const workers = Object.values(cluster.workers ?? {});
    if (workers.length === 0) process.exit(0);
    for (const w of workers) w?.process.kill("SIGTERM");
  };
  process.on("SIGTERM", stop);
  process.on("SIGINT", stop);
  console.log(`[steradian] running ${count} server processes (WEB_CONCURRENCY)`);
  // The primary serves nothing itself: the rest of scripts/serve.js never runs here.
  await new Promise(() => {});
}
