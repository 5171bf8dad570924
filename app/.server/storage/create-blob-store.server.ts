import path from "node:path";
import { z } from "zod";
import type { BlobStore } from "./blob-store.server";
import { createLocalBlobStore } from "./local-blob-store.server";
import { createS3BlobStore } from "./s3-blob-store.server";

export const blobStoreConfigSchema = z.discriminatedUnion("driver", [
  z.object({ driver: z.literal("local"), root: z.string().min(1).default("storage") }),
  z.object({
    driver: z.literal("s3"),
    /** Local storage root; its tmp/ folder holds uploads while they are parsed. */
    root: z.string().min(1).default("storage"),
    bucket: z.string().min(1),
    region: z.string().min(1).default("us-east-1"),
    endpoint: z.url().optional(),
    accessKeyId: z.string().min(1).optional(),
    secretAccessKey: z.string().min(1).optional(),
    forcePathStyle: z.boolean().default(true),
  }),
]);
export type BlobStoreConfig = z.input<typeof blobStoreConfigSchema>;

/** The blob store a configuration asks for: the local disk, or an S3-compatible bucket. */
export function createBlobStore(config: BlobStoreConfig): BlobStore {
  const c = blobStoreConfigSchema.parse(config);
  if (c.driver === "local") return createLocalBlobStore({ root: c.root });
  if ((c.accessKeyId === undefined) !== (c.secretAccessKey === undefined)) {
    throw new Error("S3 credentials need both an access key id and a secret access key");
  }
  return createS3BlobStore({
    tempDir: path.join(path.resolve(c.root), "tmp"),
    bucket: c.bucket,
    region: c.region,
    endpoint: c.endpoint,
    credentials:
      c.accessKeyId !== undefined && c.secretAccessKey !== undefined
        ? { accessKeyId: c.accessKeyId, secretAccessKey: c.secretAccessKey }
        : undefined,
    forcePathStyle: c.forcePathStyle,
  });
}
