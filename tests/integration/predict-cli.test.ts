// `bin/predict`, what `npm run --silent predict` calls (docs/product.md "Prediction contract"):
// the request on standard input, the response JSON alone on standard output, exit status 2 with
// the error JSON for bad input; the same bytes as the HTTP API and as scripts/predict.ts run from
// source for the same request; its bundle rebuilt when an input changes.
import { spawn } from "node:child_process";
import { statSync, utimesSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { TEST_PASSWORD, createAccount } from "../support/accounts";
import { connect } from "../support/db";
import { testEnv } from "../support/env";
import { Client } from "../support/http";

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../..");

interface Run {
  code: number | null;
  stdout: string;
  stderr: string;
}

function run(command: string, args: string[], stdin: string): Promise<Run> {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, { cwd: ROOT, stdio: ["pipe", "pipe", "pipe"], env: { ...process.env, NO_COLOR: "1" } });
    let stdout = "";
    let stderr = "";
    child.stdout.setEncoding("utf8").on("data", (d: string) => (stdout += d));
    child.stderr.setEncoding("utf8").on("data", (d: string) => (stderr += d));
    child.on("error", reject);
    child.on("close", (code) => resolve({ code, stdout, stderr }));
    child.stdin.end(stdin);
  });
}

const predictCli = (stdin: string) => run(process.execPath, ["bin/predict"], stdin);
const predictFromSource = (stdin: string) => run(path.join(ROOT, "node_modules/.bin/tsx"), ["scripts/predict.ts"], stdin);

/** Standard output must be exactly one JSON document on one line. */
function onlyJson(out: string): unknown {
  expect(out.endsWith("\n")).toBe(true);
  expect(out.slice(0, -1)).not.toContain("\n");
  return JSON.parse(out);
}

const REQUEST = { process: "pair-annihilation", frame: "lab", energy: { kinetic: 200, unit: "MeV" }, thetaDeg: [1, 5, 20, 60, 120], unit: "mb/sr" };

const db = connect(testEnv.appDatabaseUrl);
let api: Client;
beforeAll(async () => {
  const { email } = await createAccount(db, "predict-cli");
  api = new Client();
  await api.signIn(email, TEST_PASSWORD);
});
afterAll(() => db.destroy());

describe("bin/predict (npm run predict)", () => {
  it("prints the contract response for a good request and exits 0", async () => {
    const r = await predictCli(JSON.stringify(REQUEST));
    expect(r.code, r.stderr).toBe(0);
    const body = onlyJson(r.stdout) as Record<string, unknown>;
    for (const key of ["engineVersion", "process", "frame", "unit", "sqrtS", "parametersHash", "values"]) expect(body).toHaveProperty(key);
    expect(body.process).toBe("pair-annihilation");
    expect(body.unit).toBe("mb/sr");
    const values = body.values as number[];
    expect(values).toHaveLength(REQUEST.thetaDeg.length);
    for (const v of values) expect(Number.isFinite(v) && v > 0).toBe(true);
  });

  it("prints the same bytes as POST /api/v1/predictions for the same request", async () => {
    const [cli, res] = await Promise.all([predictCli(JSON.stringify(REQUEST)), api.postJson("/api/v1/predictions", REQUEST)]);
    expect(res.status).toBe(200);
    expect(cli.code).toBe(0);
    const httpText = await res.text();
    expect(cli.stdout).toBe(`${httpText}\n`);
  });

  it("prints the same bytes as scripts/predict.ts run from source (tsx), for a good and a bad request", async () => {
    for (const request of [REQUEST, { ...REQUEST, thetaDeg: [30, 200] }]) {
      const [bundled, source] = await Promise.all([predictCli(JSON.stringify(request)), predictFromSource(JSON.stringify(request))]);
      expect(bundled.code).toBe(source.code);
      expect(bundled.stdout).toBe(source.stdout);
    }
  });

  it("rebuilds its bundle when one of its inputs changes, with the same answer", async () => {
    const bundle = path.join(ROOT, "node_modules/.cache/steradian-predict/predict.mjs");
    const before = await predictCli(JSON.stringify(REQUEST)); // builds if needed
    const builtAt = statSync(bundle).mtimeMs;
    const input = path.join(ROOT, "app/engine/engine-version.ts");
    const { atime, mtime } = statSync(input);
    utimesSync(input, atime, new Date(mtime.getTime() + 1000));
    try {
      const after = await predictCli(JSON.stringify(REQUEST));
      expect(statSync(bundle).mtimeMs).toBeGreaterThan(builtAt);
      expect(after.stdout).toBe(before.stdout);
    } finally {
      utimesSync(input, atime, mtime);
    }
    await predictCli(JSON.stringify(REQUEST)); // leave a bundle that matches the restored time
  });

  it("works through npm itself with --silent: stdout is the JSON and nothing else", async () => {
    const r = await run("npm", ["run", "--silent", "predict"], JSON.stringify({ process: "compton", frame: "cm", energy: { sqrtS: 1 }, cosTheta: [-0.5, 0, 0.5], unit: "nb/sr" }));
    expect(r.code, r.stderr).toBe(0);
    const body = onlyJson(r.stdout) as { values: number[]; frame: string };
    expect(body.frame).toBe("cm");
    expect(body.values).toHaveLength(3);
  });

  const bad: [string, unknown, string, string][] = [
    ["an energy below threshold", { process: "muon-pair", frame: "cm", energy: { sqrtS: 0.2 }, thetaDeg: [90], unit: "nb/sr" }, "below_threshold", "energy.sqrtS"],
    ["Møller at 180°", { process: "moller", frame: "cm", energy: { sqrtS: 1 }, thetaDeg: [30, 180], unit: "nb/sr" }, "divergent_angle", "thetaDeg[1]"],
    ["a unit that does not fit", { ...REQUEST, unit: "pb/GeV^2" }, "unit_mismatch", "unit"],
    ["a frame the process does not offer", { ...REQUEST, process: "breit-wheeler", energy: { sqrtS: 1 } }, "frame_not_offered", "frame"],
  ];
  it.each(bad)("exits 2 with the error JSON for %s", async (_what, request, code, field) => {
    const r = await predictCli(JSON.stringify(request));
    expect(r.code).toBe(2);
    const { error } = onlyJson(r.stdout) as { error: { code: string; message: string; field: string } };
    expect(error).toEqual({ code, message: expect.any(String), field });
    expect(error.message.length).toBeGreaterThan(10);
  });

  it("agrees with the API on the error for the same bad request", async () => {
    const request = { ...REQUEST, thetaDeg: [30, 200] };
    const [cli, res] = await Promise.all([predictCli(JSON.stringify(request)), api.postJson("/api/v1/predictions", request)]);
    expect(res.status).toBe(422);
    expect(cli.code).toBe(2);
    expect((onlyJson(cli.stdout) as { error: unknown }).error).toEqual(((await res.json()) as { error: unknown }).error);
  });

  it("exits 2 with an error JSON naming no field for malformed JSON", async () => {
    for (const text of ['{"process": "compton",', "", "not json"]) {
      const r = await predictCli(text);
      expect(r.code, `input ${JSON.stringify(text)}`).toBe(2);
      const { error } = onlyJson(r.stdout) as { error: { code: string; message: string; field: string } };
      expect(error.code).toBe("malformed_json");
      expect(error.field).toBe("");
      expect(error.message).toMatch(/JSON/);
    }
  });
});
