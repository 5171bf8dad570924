// Serves the built app with react-router-serve's own request handling, in this process, so that
// the PID that `npm start` and the tests hold is the server's.
import { createRequestHandler } from "@react-router/express";
import compression from "compression";
import express from "express";

const port = Number(process.env.PORT ?? 3000);
const host = process.env.HOST ?? "127.0.0.1";
const build = await import("../build/server/index.js");

const app = express();
app.disable("x-powered-by");
app.use(compression());
app.use("/assets", express.static("build/client/assets", { immutable: true, maxAge: "1y" }));
app.use(express.static("build/client", { maxAge: "1h" }));
app.all(
  "/{*splat}",
  createRequestHandler({ build, mode: process.env.NODE_ENV, getLoadContext: (req) => ({ ip: req.ip ?? "unknown" }) }),
);

const server = app.listen(port, host, () => {
  console.log(`[steradian] serving on http://${host}:${port}`);
});
const stop = () => server.close(() => process.exit(0));
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
