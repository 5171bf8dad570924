import { MaxFileSizeExceededError, type FileUpload, type FileUploadHandler } from "@mjackson/form-data-parser";
import { TooLargeError, type BlobStore, type ReceivedBlob } from "./blob-store.server";

export interface StoredUpload extends ReceivedBlob {
  fieldName: string;
  /** The name the client gave the file (for display only; never used as a path). */
  fileName: string;
  mediaType: string;
}

export interface UploadReceiver {
  /** Pass to `parseFormData(request, { maxFileSize }, handler)`. */
  handler: FileUploadHandler;
  /** Files received so far, in the order of the form. */
  uploads: StoredUpload[];
  /** Removes every received file not yet committed; call in `finally` when a request fails. */
  discardAll(): Promise<void>;
}

/**
 * Receives the file parts of a multipart form into the store's temporary area. Parts of
 * other field names are refused (an unexpected file is never written to disk). The handler
 * returns null, so the FormData holds only the text fields; the files are in `uploads`.
 */
export function createUploadReceiver(
  store: BlobStore,
  options: { maxBytes: number; fieldNames: readonly string[] },
): UploadReceiver {
  const uploads: StoredUpload[] = [];
  const handler = async (file: FileUpload) => {
    if (!options.fieldNames.includes(file.fieldName)) return null;
    const received = await store.receive(file.stream(), { maxBytes: options.maxBytes });
    uploads.push({ ...received, fieldName: file.fieldName, fileName: file.name, mediaType: file.type });
    return null;
  };
  return {
    handler,
    uploads,
    async discardAll() {
      const pending = uploads.splice(0);
      await Promise.all(pending.map((u) => store.discard(u.tempPath)));
    },
  };
}

/**
 * The byte limit an error reports, from our store or from the form parser (which buffers a
 * file part up to its maxFileSize before the handler sees it), or null for any other error.
 */
export function uploadLimitOf(error: unknown, maxBytes: number): { kind: "bytes"; max: number } | null {
  if (error instanceof TooLargeError) return error.limit;
  if (error instanceof MaxFileSizeExceededError) return { kind: "bytes", max: maxBytes };
  return null;
}
