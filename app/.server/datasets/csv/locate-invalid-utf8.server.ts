import { createReadStream } from "node:fs";

/**
 * The line (1-based, counted by LF) holding the first byte sequence that is not UTF-8, or
 * null if the file turns out to be valid. Only called after the guard has failed, so the
 * good path never pays for it. It feeds a fatal streaming TextDecoder one line at a time,
 * each piece ending with its LF: an LF byte never occurs inside a multi-byte sequence, so a
 * sequence broken by a line end fails within its own line.
 */
export async function locateInvalidUtf8Line(filePath: string): Promise<number | null> {
  const decoder = new TextDecoder("utf-8", { fatal: true });
  let line = 1;
  for await (const chunk of createReadStream(filePath, { highWaterMark: 1 << 20 }) as AsyncIterable<Buffer>) {
    let start = 0;
    while (start < chunk.length) {
      const nl = chunk.indexOf(10, start);
      const end = nl === -1 ? chunk.length : nl + 1;
      try {
        decoder.decode(chunk.subarray(start, end), { stream: true });
      } catch {
        return line;
      }
      if (nl === -1) break;
      line++;
      start = end;
    }
  }
  try {
    decoder.decode();
  } catch {
    return line;
  }
  return null;
}
