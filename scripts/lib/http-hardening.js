// Express middleware in front of React Router: request body limits and security headers
// (docs/decisions/0012-hardening.md). Plain JavaScript because scripts/serve.js runs under node.
import { randomBytes } from "node:crypto";
import helmet from "helmet";

const MiB = 1024 * 1024;
const UPLOAD_PATHS = [
  // The revision upload of the API and of the dataset page (a plain form POST or React Router's
  // `.data` fetch): the only places that take a whole CSV file.
  /^\/api\/v1\/manuscripts\/[^/]+\/datasets\/[^/]+\/revisions\/?$/,
  /^\/manuscripts\/[^/]+\/datasets\/[^/]+(\.data)?\/?$/,
  // The public bundle check (/verify) reads a submission bundle's zip, far smaller than this.
  /^\/verify(\.data)?\/?$/,
];
// Room for the multipart framing and the small text fields (the mapping) beside the file.
const MULTIPART_OVERHEAD_BYTES = 256 * 1024;

/** The most bytes a request to this path may carry, and what the limit is called. */
export function bodyLimitFor(pathname, { uploadMaxBytes, bodyMaxBytes }) {
  if (UPLOAD_PATHS.some((re) => re.test(pathname))) return { max: uploadMaxBytes + MULTIPART_OVERHEAD_BYTES, upload: true };
  return { max: bodyMaxBytes, upload: false };
}

function wantsJson(req) {
  return req.path.startsWith("/api/") || req.path.endsWith(".data") || (req.get("accept") ?? "").includes("application/json");
}

function refuse(req, res, status, code, message, extra = {}) {
  // The rest of the body is never read: the connection closes after the answer.
  res.set("Connection", "close");
  res.set("Cache-Control", "no-store");
  if (wantsJson(req)) {
    res.status(status).json({ error: { code, message, ...extra } });
  } else {
    const escaped = message.replace(/[&<>"]/g, (ch) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;" })[ch]);
    res
      .status(status)
      .type("html")
      .send(`<!doctype html><html lang="en"><meta charset="utf-8"><title>${status} · Steradian</title><main><h1>The request was not accepted</h1><p>${escaped}</p><p><a href="/">Back to Steradian</a></p></main></html>`);
  }
}

/**
 * Refuses a request body larger than its route's limit from the Content-Length header, before
 * a byte of it is read. A body without a declared length (chunked) is refused with 411: Node's
 * HTTP parser then guarantees that no more than the declared bytes are ever read, so the limit
 * holds while reading as well, for every part of a multipart form together.
 */
export function limitRequestBodies({ uploadMaxBytes, bodyMaxBytes }) {
  return (req, res, next) => {
    const hasBody = req.headers["transfer-encoding"] !== undefined || Number(req.headers["content-length"] ?? 0) > 0;
    if (!hasBody) return next();
    const { max, upload } = bodyLimitFor(req.path, { uploadMaxBytes, bodyMaxBytes });
    const declared = req.headers["content-length"];
    if (declared === undefined || req.headers["transfer-encoding"] !== undefined) {
      return refuse(req, res, 411, "length-required", "Send the request with a Content-Length header (chunked bodies are not taken).");
    }
    if (Number(declared) > max) {
      if (upload) {
        return refuse(req, res, 413, "too-large", `The file is larger than ${uploadMaxBytes.toLocaleString("en")} bytes, the upload limit (UPLOAD_MAX_BYTES); nothing was stored.`, { limit: { kind: "bytes", max: uploadMaxBytes } });
      }
      return refuse(req, res, 413, "too-large", `The request body is larger than ${max.toLocaleString("en")} bytes, the limit for this address (BODY_MAX_BYTES).`, { limit: { kind: "bytes", max } });
    }
    next();
  };
}

/**
 * A fresh nonce for each response, for the framework's inline scripts (handed to React Router
 * through the load context), and helmet's headers with a strict Content-Security-Policy.
 */
export function securityHeaders({ production }) {
  const withHelmet = helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        "default-src": ["'self'"],
        "script-src": ["'self'", (_req, res) => `'nonce-${res.locals.cspNonce}'`],
        "script-src-attr": ["'none'"],
        // React writes style attributes into server-rendered HTML (and vega and MathJax into the
        // SVG they draw); a style attribute cannot run code. No inline <style> is needed beyond that.
        "style-src": ["'self'", "'unsafe-inline'"],
        "img-src": ["'self'", "data:", "blob:"],
        "font-src": ["'self'", "data:"],
        // blob: for files the page makes itself (the preview saved as drawn).
        "connect-src": ["'self'", "blob:"],
        "worker-src": ["'self'", "blob:"],
        "object-src": ["'none'"],
        "base-uri": ["'self'"],
        "form-action": ["'self'"],
        "frame-ancestors": ["'none'"],
      },
    },
    crossOriginEmbedderPolicy: false,
    referrerPolicy: { policy: "same-origin" },
    frameguard: { action: "deny" },
    // HSTS only where the app is reached over https in production (set by helmet per request
    // below); over plain http a browser ignores it, and a local start must never pin https.
    strictTransportSecurity: false,
  });
  const hsts = helmet.strictTransportSecurity({ maxAge: 180 * 24 * 60 * 60, includeSubDomains: true });
  return (req, res, next) => {
    res.locals.cspNonce = randomBytes(16).toString("base64");
    withHelmet(req, res, (err) => {
      if (err) return next(err);
      if (production && req.secure) return hsts(req, res, next);
      next();
    });
  };
}

export const DEFAULT_BODY_MAX_BYTES = 1 * MiB;

/**
 * Signed-in pages and every API answer are never stored by a browser or a proxy (a shared
 * computer's back button or disk cache must not show a collaboration's unpublished results).
 * A route that sets its own Cache-Control keeps it.
 */
export function noStoreForSignedIn(req, res, next) {
  if (req.path.startsWith("/api/") || (req.headers.cookie ?? "").includes("__steradian=")) res.set("Cache-Control", "no-store");
  next();
}
