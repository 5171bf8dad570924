import { Transform, type TransformCallback } from "node:stream";

/** Thrown by the guard; the reader then locates the line with `locateInvalidUtf8Line`. */
export class NotUtf8Error extends Error {
  constructor() {
    super("the file is not valid UTF-8");
    this.name = "NotUtf8Error";
  }
}

/**
 * Passes bytes through unchanged while a fatal streaming TextDecoder checks that they are
 * UTF-8 (a truncated sequence at the very end counts as invalid too). The decoded text is
 * thrown away: the CSV parser reads the bytes itself.
 */
export function createUtf8Guard(): Transform {
  const decoder = new TextDecoder("utf-8", { fatal: true });
  return new Transform({
    transform(chunk: Buffer, _encoding: BufferEncoding, callback: TransformCallback) {
      try {
        decoder.decode(chunk, { stream: true });
      } catch {
        callback(new NotUtf8Error());
        return;
      }
      callback(null, chunk);
    },
    flush(callback: TransformCallback) {
      try {
        decoder.decode();
      } catch {
        callback(new NotUtf8Error());
        return;
      }
      callback();
    },
  });
}
