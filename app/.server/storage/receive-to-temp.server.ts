import { createHash, randomUUID } from "node:crypto";
import { mkdir, open, readdir, stat, unlink } from "node:fs/promises";
import path from "node:path";
import { TooLargeError, type ReceivedBlob } from "./blob-store.server";

export const TEMP_SUFFIX = ".upload";
const TEMP_NAME = /^[0-9a-f-]{36}\.upload$/;

/**
 * Writes a stream into a new file in `tempDir`, hashing and counting as it goes, and fsyncs
 * it before resolving. On any failure (the stream errors, the limit is passed) the file is
 * removed before the error is rethrown; a process that dies meanwhile leaves it for
 * `removeStaleTempFiles`.
 */
export async function receiveToTemp(
  tempDir: string,
  stream: AsyncIterable<Uint8Array> | ReadableStream<Uint8Array>,
  maxBytes: number,
): Promise<ReceivedBlob> {
  await mkdir(tempDir, { recursive: true });
  const tempPath = path.join(tempDir, `${randomUUID()}${TEMP_SUFFIX}`);
  const handle = await open(tempPath, "wx");
  const hash = createHash("sha256");
  let bytes = 0;
  try {
    for await (const chunk of stream as AsyncIterable<Uint8Array>) {
      bytes += chunk.byteLength;
      if (bytes > maxBytes) throw new TooLargeError(maxBytes);
      hash.update(chunk);
      let written = 0;
      while (written < chunk.byteLength) {
        const { bytesWritten } = await handle.write(chunk, written, chunk.byteLength - written);
        written += bytesWritten;
      }
    }
    await handle.sync();
  } catch (error) {
    await handle.close().catch(() => undefined);
    await unlink(tempPath).catch(() => undefined);
    throw error;
  }
  await handle.close();
  return { tempPath, sha256: hash.digest("hex"), bytes };
}

/** Refuses a path that is not a temporary file of this store. */
export function assertTempPath(tempDir: string, tempPath: string): void {
  const resolved = path.resolve(tempPath);
  if (path.dirname(resolved) !== path.resolve(tempDir) || !TEMP_NAME.test(path.basename(resolved))) {
    throw new Error(`not a temporary upload of this store: ${tempPath}`);
  }
}

/** Deletes temporary uploads last modified at least `olderThanMs` ago; returns how many. */
export async function removeStaleTempFiles(tempDir: string, olderThanMs: number): Promise<number> {
  let names: string[];
  try {
    names = await readdir(tempDir);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === "ENOENT") return 0;
    throw error;
  }
  const now = Date.now();
  let removed = 0;
  for (const name of names) {
    if (!TEMP_NAME.test(name)) continue;
    const file = path.join(tempDir, name);
    try {
      const info = await stat(file);
      if (!info.isFile() || now - info.mtimeMs < olderThanMs) continue;
      await unlink(file);
      removed++;
    } catch (error) {
      // Another process may have committed or removed it in the meantime.
      if ((error as NodeJS.ErrnoException).code !== "ENOENT") throw error;
    }
  }
  return removed;
}
