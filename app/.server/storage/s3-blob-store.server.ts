import { createReadStream } from "node:fs";
import { stat, unlink } from "node:fs/promises";
import type { Readable } from "node:stream";
import { GetObjectCommand, HeadObjectCommand, PutObjectCommand, S3Client, S3ServiceException } from "@aws-sdk/client-s3";
import { assertBlobKey, blobKey, type BlobStore } from "./blob-store.server";
import { assertTempPath, receiveToTemp, removeStaleTempFiles } from "./receive-to-temp.server";

export interface S3BlobStoreOptions {
  /** Local folder for temporary files: the CSV reader needs a file to stream. */
  tempDir: string;
  bucket: string;
  region: string;
  /** For S3-compatible services; omit for AWS itself. */
  endpoint?: string;
  credentials?: { accessKeyId: string; secretAccessKey: string };
  /** Path-style URLs (`endpoint/bucket/key`), which most S3-compatible services need. */
  forcePathStyle?: boolean;
}

/**
 * Blobs in an S3-compatible bucket under the same keys as on disk (`blobs/ab/cd/<sha256>`).
 * Objects are written once and never changed, so an existing key means the content is there.
 */
export function createS3BlobStore(options: S3BlobStoreOptions): BlobStore & { destroy(): void } {
  const client = new S3Client({
    region: options.region,
    endpoint: options.endpoint,
    credentials: options.credentials,
    forcePathStyle: options.forcePathStyle ?? true,
    // Newer SDKs add flexible checksums and aws-chunked bodies by default, which many
    // S3-compatible servers do not understand; checksums are only sent where required.
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  });
  const bucket = options.bucket;

  const exists = async (key: string) => {
    assertBlobKey(key);
    try {
      await client.send(new HeadObjectCommand({ Bucket: bucket, Key: key }));
      return true;
    } catch (error) {
      if (isNotFound(error)) return false;
      throw error;
    }
  };

  return {
    receive: (stream, { maxBytes }) => receiveToTemp(options.tempDir, stream, maxBytes),

    async commit(tempPath, sha256) {
      assertTempPath(options.tempDir, tempPath);
      const key = blobKey(sha256);
      if (!(await exists(key))) {
        const { size } = await stat(tempPath);
        await client.send(
          new PutObjectCommand({
            Bucket: bucket,
            Key: key,
            Body: createReadStream(tempPath),
            ContentLength: size,
            ContentType: "application/octet-stream",
          }),
        );
      }
      await unlink(tempPath);
      return { key };
    },

    async discard(tempPath) {
      assertTempPath(options.tempDir, tempPath);
      await unlink(tempPath).catch((error: NodeJS.ErrnoException) => {
        if (error.code !== "ENOENT") throw error;
      });
    },

    async read(key): Promise<Readable> {
      assertBlobKey(key);
      const object = await client.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
      if (object.Body === undefined) throw new Error(`blob ${key} has no body`);
      return object.Body as Readable;
    },

    exists,

    cleanupTemp: (olderThanMs = 0) => removeStaleTempFiles(options.tempDir, olderThanMs),

    /** Closes the client's kept-alive connections (tests, shutdown). */
    destroy: () => client.destroy(),
  };
}

function isNotFound(error: unknown): boolean {
  if (error instanceof S3ServiceException) {
    return error.$metadata.httpStatusCode === 404 || error.name === "NotFound" || error.name === "NoSuchKey";
  }
  return false;
}
