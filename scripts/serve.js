// Serves the built app with react-router-serve's own request handling, in this process, so that
// the PID that `npm start` and the tests hold is the server's.
import { createRequestHandler } from "@react-router/express";
import compression from "compression";
import express from "express";
import { readdirSync } from "node:fs";
import { clusterPrimary } from "./lib/cluster-primary.js";
import { DEFAULT_BODY_MAX_BYTES, limitRequestBodies, noStoreForSignedIn, securityHeaders } from "./lib/http-hardening.js";

await clusterPrimary();

const port = Number(process.env.PORT ?? 3000);
const host = process.env.HOST ?? "127.0.0.1";
const build = await import("../build/server/index.js");

const app = express();
app.disable("x-powered-by");
// Behind a load balancer, TRUST_PROXY (e.g. "1" or "loopback") makes req.ip the client's address,
// which the per-address sign-in throttle counts (Express "trust proxy" setting).
if (process.env.TRUST_PROXY) app.set("trust proxy", /^\d+$/.test(process.env.TRUST_PROXY) ? Number(process.env.TRUST_PROXY) : process.env.TRUST_PROXY);
app.use(securityHeaders({ production: process.env.NODE_ENV === "production" }));
app.use(
  limitRequestBodies({
    uploadMaxBytes: Number(process.env.UPLOAD_MAX_BYTES ?? 50 * 1024 * 1024),
    bodyMaxBytes: Number(process.env.BODY_MAX_BYTES ?? DEFAULT_BODY_MAX_BYTES),
  }),
);
app.use(compression());
app.use("/assets", express.static("build/client/assets", { immutable: true, maxAge: "1y" }));
// express.static looks a path up on disk (a stat() in the thread pool) before it passes a request
// on; pages and API calls are never files, so only paths under build/client's own top-level
// names are looked up there.
const clientFiles = express.static("build/client", { maxAge: "1h" });
const clientNames = new Set(readdirSync("build/client"));
app.use((req, res, next) => (clientNames.has(req.path.split("/")[1]) ? clientFiles(req, res, next) : next()));
app.all(
  "/{*splat}",
  noStoreForSignedIn,
  createRequestHandler({ build, mode: process.env.NODE_ENV, getLoadContext: (req, res) => ({ ip: req.ip ?? "unknown", cspNonce: res.locals.cspNonce }) }),
);

const server = app.listen(port, host, () => {
  console.log(`[steradian] serving on http://${host}:${port}`);
});
// Longer than the usual 60 s idle timeout of load balancers and HTTP clients, so that the server
// is never the side that closes an idle kept-alive connection just as a client reuses it (a
// large upload sent on such a connection fails with "other side closed"); common practice.
server.keepAliveTimeout = 65_000;
server.headersTimeout = 66_000;
// One export worker inside the app process (docs/decisions/0011-export-jobs.md); EXPORT_WORKERS=0
// leaves exports to workers started with `npm run worker`. The worker is TypeScript, loaded by tsx.
let stopWorkers = async () => {};
const workerCount = Number(process.env.EXPORT_WORKERS ?? 1);
if (workerCount > 0) {
  const { tsImport } = await import("tsx/esm/api");
  const { runWorkers } = await tsImport("./worker.ts", import.meta.url);
  stopWorkers = await runWorkers(workerCount);
}
const stop = () => server.close(() => void stopWorkers().finally(() => process.exit(0)));
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
