import { createHash } from "node:crypto";
import { mkdtemp, readdir, readFile, rm, stat, utimes, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { text } from "node:stream/consumers";
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { blobKey, TooLargeError } from "./blob-store.server";
import { createLocalBlobStore } from "./local-blob-store.server";

let root: string;
beforeEach(async () => {
  root = await mkdtemp(path.join(tmpdir(), "steradian-blobs-"));
});
afterEach(async () => {
  await rm(root, { recursive: true, force: true });
});

async function* chunks(...parts: string[]): AsyncIterable<Uint8Array> {
  for (const p of parts) yield new TextEncoder().encode(p);
}

async function filesUnder(dir: string): Promise<string[]> {
  try {
    const entries = await readdir(dir, { recursive: true, withFileTypes: true });
    return entries.filter((e) => e.isFile()).map((e) => path.join(e.parentPath, e.name));
  } catch {
    return [];
  }
}

const sha256 = (s: string) => createHash("sha256").update(s).digest("hex");

describe("local blob store", () => {
  it("receives into tmp/ with the right hash and size, then commits to blobs/ab/cd/<sha256>", async () => {
    const store = createLocalBlobStore({ root });
    const got = await store.receive(chunks("theta,y\n", "30,1.5\n"), { maxBytes: 1000 });
    expect(got.sha256).toBe(sha256("theta,y\n30,1.5\n"));
    expect(got.bytes).toBe(15);
    expect(path.dirname(got.tempPath)).toBe(path.join(root, "tmp"));
    expect(await readFile(got.tempPath, "utf8")).toBe("theta,y\n30,1.5\n");

    const { key } = await store.commit(got.tempPath, got.sha256);
    expect(key).toBe(`blobs/${got.sha256.slice(0, 2)}/${got.sha256.slice(2, 4)}/${got.sha256}`);
    expect(await readFile(path.join(root, key), "utf8")).toBe("theta,y\n30,1.5\n");
    expect(await filesUnder(path.join(root, "tmp"))).toEqual([]);
    expect(await store.exists(key)).toBe(true);
    expect(await text(await store.read(key))).toBe("theta,y\n30,1.5\n");
  });

  it("commits the same content twice as one blob and removes the second temporary file", async () => {
    const store = createLocalBlobStore({ root });
    const a = await store.receive(chunks("same"), { maxBytes: 100 });
    const b = await store.receive(chunks("sa", "me"), { maxBytes: 100 });
    expect(b.sha256).toBe(a.sha256);
    const first = await store.commit(a.tempPath, a.sha256);
    const second = await store.commit(b.tempPath, b.sha256);
    expect(second.key).toBe(first.key);
    expect(await filesUnder(path.join(root, "tmp"))).toEqual([]);
    expect(await filesUnder(path.join(root, "blobs"))).toEqual([path.join(root, first.key)]);
  });

  it("accepts a web ReadableStream as a FileUpload gives it", async () => {
    const store = createLocalBlobStore({ root });
    const got = await store.receive(new Blob(["abc"]).stream(), { maxBytes: 3 });
    expect(got).toMatchObject({ bytes: 3, sha256: sha256("abc") });
  });

  it("refuses more than maxBytes with a TooLargeError naming the limit and keeps nothing", async () => {
    const store = createLocalBlobStore({ root });
    const error = await store.receive(chunks("12345", "67890", "x"), { maxBytes: 10 }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(TooLargeError);
    expect((error as TooLargeError).limit).toEqual({ kind: "bytes", max: 10 });
    expect(await filesUnder(root)).toEqual([]);
  });

  it("an upload whose stream fails midway leaves no blob and no temporary file", async () => {
    const store = createLocalBlobStore({ root });
    async function* broken(): AsyncIterable<Uint8Array> {
      yield new TextEncoder().encode("theta,y\n30,");
      throw new Error("client disconnected");
    }
    await expect(store.receive(broken(), { maxBytes: 1000 })).rejects.toThrow("client disconnected");
    expect(await filesUnder(root)).toEqual([]);
  });

  it("cleanupTemp removes what an upload interrupted by a dying process left, and nothing else", async () => {
    const store = createLocalBlobStore({ root });
    // An upload in flight when the process "dies": its temporary file exists and was never
    // removed by the receive, which is still waiting for bytes.
    let release!: () => void;
    const hang = new Promise<void>((resolve) => (release = resolve));
    async function* stalled(): AsyncIterable<Uint8Array> {
      yield new TextEncoder().encode("partial");
      await hang;
      throw new Error("connection reset");
    }
    const pending = store.receive(stalled(), { maxBytes: 1000 }).catch((e: unknown) => e);
    await expect.poll(async () => (await filesUnder(path.join(root, "tmp"))).length).toBe(1);
    const [orphan] = await filesUnder(path.join(root, "tmp"));

    const kept = await store.receive(chunks("kept"), { maxBytes: 100 });
    const committed = await store.commit(kept.tempPath, kept.sha256);
    const fresh = await store.receive(chunks("fresh"), { maxBytes: 100 });
    await writeFile(path.join(root, "tmp", "not-ours.txt"), "x");
    const old = new Date(Date.now() - 2 * 3600_000);
    await utimes(orphan, old, old);

    expect(await store.cleanupTemp(3600_000)).toBe(1);
    await expect(stat(orphan)).rejects.toThrow();
    expect(await readFile(fresh.tempPath, "utf8")).toBe("fresh");
    expect(await store.exists(committed.key)).toBe(true);
    expect(await readFile(path.join(root, "tmp", "not-ours.txt"), "utf8")).toBe("x");

    expect(await store.cleanupTemp()).toBe(1);
    await expect(stat(fresh.tempPath)).rejects.toThrow();

    release();
    expect(await pending).toBeInstanceOf(Error);
    expect((await filesUnder(path.join(root, "blobs"))).length).toBe(1);
  });

  it("discard removes a received file; keys and paths from outside are refused", async () => {
    const store = createLocalBlobStore({ root });
    const got = await store.receive(chunks("x"), { maxBytes: 10 });
    await store.discard(got.tempPath);
    await expect(stat(got.tempPath)).rejects.toThrow();
    await expect(store.read("../../etc/passwd")).rejects.toThrow("not a blob key");
    await expect(store.exists("blobs/../x")).rejects.toThrow("not a blob key");
    await expect(store.commit(path.join(root, "elsewhere.upload"), got.sha256)).rejects.toThrow("not a temporary upload");
    await expect(store.read(blobKey(sha256("never stored")))).rejects.toThrow();
    expect(await store.exists(blobKey(sha256("never stored")))).toBe(false);
  });
});
