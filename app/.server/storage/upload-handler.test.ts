import { createHash } from "node:crypto";
import { mkdtemp, readdir, readFile, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { parseFormData } from "@mjackson/form-data-parser";
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { createLocalBlobStore } from "./local-blob-store.server";
import { createUploadReceiver, uploadLimitOf } from "./upload-handler.server";

let root: string;
beforeEach(async () => {
  root = await mkdtemp(path.join(tmpdir(), "steradian-upload-"));
});
afterEach(async () => {
  await rm(root, { recursive: true, force: true });
});

function multipart(fields: Record<string, string | File>): Request {
  const form = new FormData();
  for (const [name, value] of Object.entries(fields)) form.append(name, value);
  return new Request("http://127.0.0.1/upload", { method: "POST", body: form });
}

describe("upload receiver for parseFormData", () => {
  it("stores the expected file part in tmp/ and leaves text fields in the form data", async () => {
    const store = createLocalBlobStore({ root });
    const receiver = createUploadReceiver(store, { maxBytes: 1000, fieldNames: ["file"] });
    const csv = "theta,dsigma,stat\n30,1.5,0.05\n";
    const form = await parseFormData(
      multipart({ mapping: '{"x":"theta"}', file: new File([csv], "points.csv", { type: "text/csv" }), other: new File(["x"], "o.bin") }),
      { maxFileSize: 1000 },
      receiver.handler,
    );
    expect(form.get("mapping")).toBe('{"x":"theta"}');
    expect(form.get("file")).toBeNull();
    expect(receiver.uploads).toHaveLength(1);
    const [upload] = receiver.uploads;
    expect(upload).toMatchObject({ fieldName: "file", fileName: "points.csv", mediaType: "text/csv", bytes: csv.length });
    expect(upload.sha256).toBe(createHash("sha256").update(csv).digest("hex"));
    expect(await readFile(upload.tempPath, "utf8")).toBe(csv);
    // The part of an unexpected field name was never written.
    expect(await readdir(path.join(root, "tmp"))).toEqual([path.basename(upload.tempPath)]);

    await receiver.discardAll();
    expect(receiver.uploads).toEqual([]);
    expect(await readdir(path.join(root, "tmp"))).toEqual([]);
  });

  it("maps both the parser's and the store's size errors to the byte limit", async () => {
    const store = createLocalBlobStore({ root });
    const big = new File(["x".repeat(2000)], "big.csv");

    const parserLimit = createUploadReceiver(store, { maxBytes: 1000, fieldNames: ["file"] });
    const e1 = await parseFormData(multipart({ file: big }), { maxFileSize: 1000 }, parserLimit.handler).catch((e: unknown) => e);
    expect(uploadLimitOf(e1, 1000)).toEqual({ kind: "bytes", max: 1000 });

    const storeLimit = createUploadReceiver(store, { maxBytes: 1000, fieldNames: ["file"] });
    const e2 = await parseFormData(multipart({ file: big }), { maxFileSize: 10_000 }, storeLimit.handler).catch((e: unknown) => e);
    expect(uploadLimitOf(e2, 1000)).toEqual({ kind: "bytes", max: 1000 });
    expect(storeLimit.uploads).toEqual([]);
    expect(await readdir(path.join(root, "tmp"))).toEqual([]);

    expect(uploadLimitOf(new Error("other"), 1000)).toBeNull();
  });
});
