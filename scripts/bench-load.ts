// `npm run bench:load`: latency under load of a running Steradian (started by `npm start`, or
// BENCH_APP_URL), on loopback, bounded in time. autocannon drives 50 connections at three
// targets — a signed-in page, an API read and a three-angle prediction — first alone, then while
// a 10⁶-row CSV upload runs. Prints a table, and as its very last line one JSON object.
// Goals (issue 11): p95 ≤ 50 ms alone, ≤ 150 ms during the upload, 0 errors.
import autocannon from "autocannon";

const base = process.env.BENCH_APP_URL ?? "http://127.0.0.1:3000";
const seconds = Number(process.env.BENCH_SECONDS ?? 8);
const connections = 50;
const DEMO_MANUSCRIPT_ID = "5e7ad1a0-0000-4000-8000-00000000d3e0";
const origin = new URL(base).origin;

async function signIn(): Promise<string> {
  const res = await fetch(`${base}/sign-in`, {
    method: "POST",
    redirect: "manual",
    headers: { "Content-Type": "application/x-www-form-urlencoded", Origin: origin },
    body: new URLSearchParams({ email: "carla.corresponding@example.org", password: "demo-steradian-2026" }).toString(),
  });
  const cookie = res.headers.getSetCookie().map((c) => c.split(";")[0]).find((c) => c.startsWith("__steradian="));
  if (res.status !== 302 || !cookie) throw new Error(`sign-in answered ${res.status}: is the demo seeded at ${base}?`);
  return cookie;
}

interface Target {
  key: string;
  label: string;
  options: autocannon.Options;
}

function targets(cookie: string): Target[] {
  const headers = { Cookie: cookie, Origin: origin };
  return [
    { key: "page", label: "signed-in page GET /manuscripts/:id/datasets", options: { url: `${base}/manuscripts/${DEMO_MANUSCRIPT_ID}/datasets`, headers } },
    { key: "api_read", label: "API read GET /api/v1/manuscripts/:id/datasets", options: { url: `${base}/api/v1/manuscripts/${DEMO_MANUSCRIPT_ID}/datasets`, headers } },
    {
      key: "prediction",
      label: "POST /api/v1/predictions, three angles",
      options: {
        url: `${base}/api/v1/predictions`,
        method: "POST",
        headers: { ...headers, "Content-Type": "application/json" },
        body: JSON.stringify({ process: "scalar-annihilation", frame: "lab", energy: { kinetic: 0.5 }, thetaDeg: [30, 60, 90], unit: "ub/sr" }),
      },
    },
  ];
}

interface Figures { p50: number; p95: number; max: number; errors: number; requests: number }

/** One run of autocannon; percentiles from every response's own latency (exact, not binned). */
async function measure(target: Target): Promise<Figures> {
  const times: number[] = [];
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon({ ...target.options, connections, duration: seconds }, (err, res) => (err ? reject(err) : resolve(res)));
    instance.on("response", (_client, _status, _bytes, ms) => times.push(ms));
  });
  times.sort((a, b) => a - b);
  const at = (q: number) => (times.length === 0 ? NaN : times[Math.min(times.length - 1, Math.ceil(q * times.length) - 1)]);
  const bad = result.non2xx + result.errors + result.timeouts;
  return { p50: round(at(0.5)), p95: round(at(0.95)), max: round(times.at(-1) ?? NaN), errors: bad, requests: times.length };
}
const round = (x: number) => Math.round(x * 10) / 10;

/** A synthetic 10⁶-row angular distribution (invented numbers), different on every call. */
function bigCsv(seed: number): Blob {
  const rows: string[] = ["theta,dsigma,stat"];
  for (let i = 0; i < 1_000_000; i++) rows.push(`${(0.1 + (179.8 * i) / 1_000_000).toFixed(7)},${(1 + ((i * 7919 + seed) % 1000) / 1000).toFixed(5)},0.05`);
  return new Blob([rows.join("\n") + "\n"], { type: "text/csv" });
}

async function createDataset(cookie: string): Promise<string> {
  const res = await fetch(`${base}/api/v1/manuscripts/${DEMO_MANUSCRIPT_ID}/datasets`, {
    method: "POST",
    headers: { Cookie: cookie, Origin: origin, "Content-Type": "application/json" },
    body: JSON.stringify({
      name: `bench upload ${Date.now()}`,
      quantity: { x: { kind: "theta_cm_deg" }, y: { kind: "dsigma_domega", unit: "ub/sr" } },
      mapping: { x: "theta", y: "dsigma", stat: { kind: "symmetric", column: "stat" } },
    }),
  });
  if (res.status !== 201) throw new Error(`creating the upload dataset answered ${res.status}: ${await res.text()}`);
  return ((await res.json()) as { dataset: { id: string } }).dataset.id;
}

/** Uploads 10⁶-row files one after another until `stop()`; returns how many finished and how. */
function keepUploading(cookie: string, datasetId: string) {
  let stopped = false;
  const outcomes: { status: number; ms: number }[] = [];
  const done = (async () => {
    for (let seed = 1; !stopped; seed++) {
      const form = new FormData();
      form.set("file", bigCsv(seed), "bench.csv");
      const t0 = performance.now();
      const res = await fetch(`${base}/api/v1/manuscripts/${DEMO_MANUSCRIPT_ID}/datasets/${datasetId}/revisions`, { method: "POST", headers: { Cookie: cookie, Origin: origin }, body: form });
      await res.text();
      outcomes.push({ status: res.status, ms: performance.now() - t0 });
    }
  })();
  return { outcomes, async stop() { stopped = true; await done; } };
}

const cookie = await signIn();
const list = targets(cookie);
const figures: Record<string, number> = {};
const rows: string[] = [];
const record = (phase: string, t: Target, f: Figures) => {
  rows.push(`${phase.padEnd(14)} ${t.label.padEnd(48)} ${String(f.p50).padStart(7)} ${String(f.p95).padStart(7)} ${String(f.max).padStart(7)} ${String(f.errors).padStart(6)} ${String(f.requests).padStart(8)}`);
  figures[`${phase}_${t.key}_p50_ms`] = f.p50;
  figures[`${phase}_${t.key}_p95_ms`] = f.p95;
  figures[`${phase}_${t.key}_max_ms`] = f.max;
  figures[`${phase}_${t.key}_errors`] = f.errors;
};

for (const t of list) record("alone", t, await measure(t));

const datasetId = await createDataset(cookie);
const uploads = keepUploading(cookie, datasetId);
// Let the first upload get going (sent and being parsed) before measuring.
await new Promise((r) => setTimeout(r, 1500));
for (const t of list) record("during_upload", t, await measure(t));
await uploads.stop();
figures.uploads_finished = uploads.outcomes.length;
figures.upload_median_ms = Math.round([...uploads.outcomes.map((o) => o.ms)].sort((a, b) => a - b)[Math.floor(uploads.outcomes.length / 2)] ?? 0);
figures.upload_non_201 = uploads.outcomes.filter((o) => o.status !== 201).length;
figures.connections = connections;
figures.seconds_per_run = seconds;

console.log(`Load against ${base}: ${connections} connections, ${seconds} s per run (WEB_CONCURRENCY of the server as started)`);
console.log(`${"phase".padEnd(14)} ${"target".padEnd(48)} ${"p50 ms".padStart(7)} ${"p95 ms".padStart(7)} ${"max ms".padStart(7)} ${"errors".padStart(6)} ${"requests".padStart(8)}`);
for (const r of rows) console.log(r);
console.log(`10⁶-row uploads during the runs: ${figures.uploads_finished} finished (median ${figures.upload_median_ms} ms, ${figures.upload_non_201} not 201)`);
console.log(JSON.stringify(figures));
