// Whatever arrives, an upload ends as a revision or as a list of problems: never a 500, never
// a partial revision, never an orphan file.
import { readdirSync } from "node:fs";
import net from "node:net";
import path from "node:path";
import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { TEST_PASSWORD, createAccount, createManuscriptWith } from "../support/accounts";
import { angularCsv, createDatasetViaApi } from "../support/datasets";
import { connect } from "../support/db";
import { testEnv } from "../support/env";
import { Client } from "../support/http";

const db = connect(testEnv.appDatabaseUrl);
let c: Client;
let manuscriptId: string;
let datasetId: string;

beforeAll(async () => {
  const me = await createAccount(db, "robust");
  manuscriptId = await createManuscriptWith(db, [{ id: me.id, role: "corresponding" }]);
  c = new Client();
  await c.signIn(me.email, TEST_PASSWORD);
  datasetId = await createDatasetViaApi(c, manuscriptId, "robust");
});
afterAll(() => db.destroy());

async function revisionState() {
  const revs = await db.selectFrom("dataset_revision").select(["id", "row_count"]).where("dataset_id", "=", datasetId).execute();
  const rows = await db.selectFrom("dataset_row").select(["revision_id"]).select((eb) => eb.fn.countAll<number>().as("n")).where("revision_id", "in", revs.length ? revs.map((r) => r.id) : ["00000000-0000-4000-8000-000000000000"]).groupBy("revision_id").execute();
  return { revs, rows };
}

function tempFiles(): string[] {
  try {
    return readdirSync(path.join(testEnv.storageDir, "tmp"));
  } catch {
    return [];
  }
}

describe("upload robustness", () => {
  it("random bytes and mutations of a good CSV give a revision or problems, never a 500 or a partial revision", async () => {
    const good = angularCsv([1.5, 1.2, 0.95, 0.81, 0.74, 0.7, 0.69]);
    const mutation = fc.record({
      at: fc.nat({ max: good.length - 1 }),
      cut: fc.nat({ max: 8 }),
      insert: fc.oneof(fc.string({ maxLength: 6 }), fc.constantFrom(",", ";", "\n", "\"", "\r\n", "-", "e", "NaN", "1,5", "\uFFFD", "\t")),
    });
    const input = fc.oneof(
      fc.uint8Array({ maxLength: 400 }).map((b) => b as Uint8Array | string),
      fc.array(mutation, { minLength: 1, maxLength: 4 }).map((ms) => ms.reduce((s, m) => s.slice(0, m.at) + m.insert + s.slice(m.at + m.cut), good) as Uint8Array | string),
    );
    const tempBefore = new Set(tempFiles());
    await fc.assert(
      fc.asyncProperty(input, async (body) => {
        const res = await c.upload(`/api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}/revisions`, body);
        expect([200, 201, 422]).toContain(res.status);
        const json = (await res.json()) as { revision?: { rowCount: number; id: string }; error?: { problems: unknown[]; problemCount: number } };
        if (res.status === 422) {
          expect(json.error!.problemCount).toBeGreaterThan(0);
          expect(json.error!.problems.length).toBeGreaterThan(0);
        } else {
          const stored = await db.selectFrom("dataset_row").select((eb) => eb.fn.countAll<number>().as("n")).where("revision_id", "=", json.revision!.id).executeTakeFirstOrThrow();
          expect(Number(stored.n)).toBe(json.revision!.rowCount);
        }
      }),
      { numRuns: 60, seed: 20261201 },
    );
    const { revs, rows } = await revisionState();
    for (const r of revs) expect(Number(rows.find((x) => x.revision_id === r.id)?.n ?? 0)).toBe(r.row_count);
    expect(tempFiles().filter((f) => !tempBefore.has(f))).toEqual([]);
  }, 120_000);

  it("a client that disconnects mid-upload leaves no revision and no orphan file after cleanup", async () => {
    const before = await revisionState();
    const tempBefore = new Set(tempFiles());
    const url = new URL(testEnv.appUrl);
    const boundary = "----steradian-test-boundary";
    const head = `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="big.csv"\r\nContent-Type: text/csv\r\n\r\ntheta,dsigma,stat\r\n`;
    const declared = 1_500_000;
    await new Promise<void>((resolve, reject) => {
      const socket = net.connect(Number(url.port), url.hostname, () => {
        socket.write(
          `POST /api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}/revisions HTTP/1.1\r\nHost: ${url.host}\r\nCookie: ${c.cookieHeader()}\r\n` +
            `Content-Type: multipart/form-data; boundary=${boundary}\r\nContent-Length: ${declared}\r\n\r\n${head}`,
        );
        let sent = 0;
        const chunk = "10,1.0,0.1\r\n".repeat(2000);
        const pump = () => {
          if (sent > 300_000) {
            socket.destroy();
            return setTimeout(resolve, 500);
          }
          sent += chunk.length;
          socket.write(chunk, pump);
        };
        pump();
      });
      socket.on("error", reject);
    });
    const after = await revisionState();
    expect(after.revs.length).toBe(before.revs.length);
    // The receiver removes its temporary file when the stream breaks (give a loaded machine time).
    await expect.poll(() => tempFiles().filter((f) => !tempBefore.has(f)), { timeout: 10_000 }).toEqual([]);
  });

  it("the start-up step removes temporary files that a crash left behind", async () => {
    const { writeFileSync } = await import("node:fs");
    const { execFile } = await import("node:child_process");
    const { promisify } = await import("node:util");
    const orphan = path.join(testEnv.storageDir, "tmp", "0b9d6a57-3a41-4c55-9a51-6d0a1c2e4f70.upload");
    writeFileSync(orphan, "theta,dsigma\n30,1\n");
    expect(tempFiles()).toContain(path.basename(orphan));
    const { stdout } = await promisify(execFile)("node_modules/.bin/tsx", ["scripts/prepare-storage.ts"], {
      env: { ...process.env, DATABASE_URL: testEnv.appDatabaseUrl, STORAGE_DIR: testEnv.storageDir, NODE_ENV: "development" },
    });
    expect(stdout).toMatch(/removed \d+ temporary upload file/);
    expect(tempFiles()).not.toContain(path.basename(orphan));
  });
});
