import { env } from "../platform/env.server";
import type { BlobStore } from "./blob-store.server";
import { createBlobStore } from "./create-blob-store.server";

/** The blob store the environment configures (STORAGE_DRIVER, STORAGE_DIR, S3_*). */
export function createBlobStoreFromEnv(): BlobStore {
  if (env.STORAGE_DRIVER === "local") return createBlobStore({ driver: "local", root: env.STORAGE_DIR });
  if (env.S3_BUCKET === undefined) throw new Error("STORAGE_DRIVER=s3 needs S3_BUCKET");
  return createBlobStore({
    driver: "s3",
    root: env.STORAGE_DIR,
    bucket: env.S3_BUCKET,
    region: env.S3_REGION,
    endpoint: env.S3_ENDPOINT,
    accessKeyId: env.S3_ACCESS_KEY_ID,
    secretAccessKey: env.S3_SECRET_ACCESS_KEY,
  });
}
