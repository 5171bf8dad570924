import { access, mkdir, open, rename, unlink } from "node:fs/promises";
import path from "node:path";
import type { Readable } from "node:stream";
import { assertBlobKey, blobKey, type BlobStore } from "./blob-store.server";
import { assertTempPath, receiveToTemp, removeStaleTempFiles } from "./receive-to-temp.server";

/**
 * Blobs on the local disk under `root` (default `storage/`): temporary files in
 * `<root>/tmp/`, committed files at `<root>/blobs/ab/cd/<sha256>`. Both live on the same
 * file system, so a commit is an atomic rename: a blob is either absent or complete.
 */
export function createLocalBlobStore(options: { root: string }): BlobStore {
  const root = path.resolve(options.root);
  const tempDir = path.join(root, "tmp");
  const pathOf = (key: string) => {
    assertBlobKey(key);
    return path.join(root, key);
  };
  const exists = async (key: string) => {
    const file = pathOf(key);
    try {
      await access(file);
      return true;
    } catch {
      return false;
    }
  };

  return {
    receive: (stream, { maxBytes }) => receiveToTemp(tempDir, stream, maxBytes),

    async commit(tempPath, sha256) {
      assertTempPath(tempDir, tempPath);
      const key = blobKey(sha256);
      const target = pathOf(key);
      if (await exists(key)) {
        await unlink(tempPath);
        return { key };
      }
      await mkdir(path.dirname(target), { recursive: true });
      await rename(tempPath, target);
      await fsyncDirectory(path.dirname(target));
      return { key };
    },

    async discard(tempPath) {
      assertTempPath(tempDir, tempPath);
      await unlink(tempPath).catch((error: NodeJS.ErrnoException) => {
        if (error.code !== "ENOENT") throw error;
      });
    },

    async read(key): Promise<Readable> {
      // Open first so that a missing blob rejects here, not later on the stream.
      const handle = await open(pathOf(key), "r");
      return handle.createReadStream();
    },

    exists,

    cleanupTemp: (olderThanMs = 0) => removeStaleTempFiles(tempDir, olderThanMs),
  };
}

/** Makes the rename itself durable, not only the file's contents. */
async function fsyncDirectory(dir: string): Promise<void> {
  const handle = await open(dir, "r");
  try {
    await handle.sync();
  } finally {
    await handle.close();
  }
}
