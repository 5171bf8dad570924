// The S3 adapter against s3rver, a local server that speaks the S3 protocol, started here on
// loopback with an ephemeral port and a temporary directory. No database is needed.
import { createHash, randomBytes } from "node:crypto";
import { mkdtemp, readdir, rm } from "node:fs/promises";
import type { AddressInfo } from "node:net";
import { createRequire } from "node:module";
import { tmpdir } from "node:os";
import path from "node:path";
import { buffer } from "node:stream/consumers";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { blobKey, TooLargeError } from "../../app/.server/storage/blob-store.server";
import { createBlobStore } from "../../app/.server/storage/create-blob-store.server";
import { createS3BlobStore } from "../../app/.server/storage/s3-blob-store.server";

interface S3rverInstance {
  run(): Promise<AddressInfo>;
  close(): Promise<void>;
}
type S3rverConstructor = new (options: {
  address: string;
  port: number;
  silent: boolean;
  directory: string;
  configureBuckets: { name: string }[];
}) => S3rverInstance;
// s3rver ships no type declarations; the little used here is typed above.
const S3rver = createRequire(import.meta.url)("s3rver") as S3rverConstructor;

const BUCKET = "steradian-test";
let server: S3rverInstance;
let endpoint: string;
let work: string;
let store: ReturnType<typeof createS3BlobStore>;
let tempDir: string;

beforeAll(async () => {
  work = await mkdtemp(path.join(tmpdir(), "steradian-s3-"));
  tempDir = path.join(work, "tmp");
  server = new S3rver({
    address: "127.0.0.1",
    port: 0,
    silent: true,
    directory: path.join(work, "s3"),
    configureBuckets: [{ name: BUCKET }],
  });
  const { port } = await server.run();
  endpoint = `http://127.0.0.1:${port}`;
  store = createS3BlobStore({
    tempDir,
    bucket: BUCKET,
    region: "us-east-1",
    endpoint,
    credentials: { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" },
    forcePathStyle: true,
  });
});

afterAll(async () => {
  store?.destroy();
  await server?.close();
  await rm(work, { recursive: true, force: true });
});

async function* chunksOf(bytes: Uint8Array, size: number): AsyncIterable<Uint8Array> {
  for (let i = 0; i < bytes.length; i += size) yield bytes.subarray(i, i + size);
}

describe("S3 blob store against a local S3 server", () => {
  it("puts a received file under its content key and reads back identical bytes", async () => {
    const bytes = randomBytes(300_000);
    const received = await store.receive(chunksOf(bytes, 65_536), { maxBytes: 1_000_000 });
    expect(received.sha256).toBe(createHash("sha256").update(bytes).digest("hex"));
    expect(received.bytes).toBe(bytes.length);

    const key = blobKey(received.sha256);
    expect(await store.exists(key)).toBe(false);
    expect(await store.commit(received.tempPath, received.sha256)).toEqual({ key });
    expect(await store.exists(key)).toBe(true);
    expect(await readdir(tempDir)).toEqual([]);

    const back = await buffer(await store.read(key));
    expect(back.length).toBe(bytes.length);
    expect(back.equals(bytes)).toBe(true);
  });

  it("commits the same content again without error and keeps one object", async () => {
    const bytes = Buffer.from("theta,dsigma,stat\n30,1.5,0.05\n");
    const a = await store.receive(chunksOf(bytes, 7), { maxBytes: 1000 });
    const b = await store.receive(chunksOf(bytes, 1000), { maxBytes: 1000 });
    const first = await store.commit(a.tempPath, a.sha256);
    const again = await store.commit(b.tempPath, b.sha256);
    expect(again).toEqual(first);
    expect(await readdir(tempDir)).toEqual([]);
    expect((await buffer(await store.read(first.key))).equals(bytes)).toBe(true);
  });

  it("answers false for a missing key and refuses keys it did not make", async () => {
    expect(await store.exists(blobKey("0".repeat(64)))).toBe(false);
    await expect(store.read(blobKey("1".repeat(64)))).rejects.toThrow();
    await expect(store.exists("blobs/../../secret")).rejects.toThrow("not a blob key");
  });

  it("enforces maxBytes while receiving, before anything reaches the bucket", async () => {
    const error = await store.receive(chunksOf(randomBytes(5000), 1000), { maxBytes: 4096 }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(TooLargeError);
    expect(await readdir(tempDir)).toEqual([]);
  });

  it("is what createBlobStore builds for driver s3", async () => {
    const viaFactory = createBlobStore({
      driver: "s3",
      root: work,
      bucket: BUCKET,
      endpoint,
      accessKeyId: "S3RVER",
      secretAccessKey: "S3RVER",
    });
    const received = await viaFactory.receive(chunksOf(Buffer.from("factory"), 3), { maxBytes: 100 });
    expect(path.dirname(received.tempPath)).toBe(tempDir);
    const { key } = await viaFactory.commit(received.tempPath, received.sha256);
    expect(await store.exists(key)).toBe(true);
    (viaFactory as ReturnType<typeof createS3BlobStore>).destroy();
  });
});
