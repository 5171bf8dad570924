import type { Readable } from "node:stream";

/** A file received into temporary storage, not yet part of the content-addressed store. */
export interface ReceivedBlob {
  tempPath: string;
  /** SHA-256 of the bytes, lower-case hex. */
  sha256: string;
  bytes: number;
}

/**
 * Content-addressed storage of raw uploads. Bytes are first received into a local temporary
 * file (so the CSV reader can stream it, whatever the backend), then committed under the key
 * derived from their hash. Committing the same content twice is a no-op.
 */
export interface BlobStore {
  /** Streams the bytes into a temporary file (fsync), hashing as it goes; throws TooLargeError past maxBytes. */
  receive(stream: AsyncIterable<Uint8Array> | ReadableStream<Uint8Array>, opts: { maxBytes: number }): Promise<ReceivedBlob>;
  /** Moves a received temporary file to its content-addressed key; the temporary file is gone afterwards. */
  commit(tempPath: string, sha256: string): Promise<{ key: string }>;
  /** Removes a received temporary file that will not be committed. */
  discard(tempPath: string): Promise<void>;
  read(key: string): Promise<Readable>;
  exists(key: string): Promise<boolean>;
  /** Removes temporary files left by interrupted uploads; returns how many. Called at server start. */
  cleanupTemp(olderThanMs?: number): Promise<number>;
}

/** Thrown when an upload is larger than allowed; the route answers 413 naming the limit. */
export class TooLargeError extends Error {
  readonly limit: { kind: "bytes"; max: number };
  constructor(maxBytes: number) {
    super(`the file is larger than the limit of ${maxBytes} bytes`);
    this.name = "TooLargeError";
    this.limit = { kind: "bytes", max: maxBytes };
  }
}

const SHA256_HEX = /^[0-9a-f]{64}$/;
const KEY = /^blobs\/[0-9a-f]{2}\/[0-9a-f]{2}\/[0-9a-f]{64}$/;

/** The key of a content hash: `blobs/ab/cd/abcd…`, two levels so no folder grows huge. */
export function blobKey(sha256: string): string {
  if (!SHA256_HEX.test(sha256)) throw new Error(`not a SHA-256 hex digest: ${JSON.stringify(sha256)}`);
  return `blobs/${sha256.slice(0, 2)}/${sha256.slice(2, 4)}/${sha256}`;
}

/** Refuses anything but a key made by `blobKey`, so a key can never address a path outside the store. */
export function assertBlobKey(key: string): void {
  if (!KEY.test(key)) throw new Error(`not a blob key: ${JSON.stringify(key)}`);
}
