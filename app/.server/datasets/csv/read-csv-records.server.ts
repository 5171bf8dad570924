import { createReadStream } from "node:fs";
import { open } from "node:fs/promises";
import { Writable } from "node:stream";
import { pipeline } from "node:stream/promises";
import { CsvError, Parser } from "csv-parse";
import type { DatasetProblem } from "~/datasets/dataset-problem";
import { detectDelimiter, type CsvDelimiter } from "~/datasets/detect-delimiter";
import { locateInvalidUtf8Line } from "./locate-invalid-utf8.server";
import { createUtf8Guard, NotUtf8Error } from "./utf8-guard.server";

/** Returned by a record callback to end reading early (preview, row limit). */
export const STOP = Symbol("stop reading");

export type RecordCallback = (fields: string[], line: number) => void | typeof STOP;

export interface ReadCsvOutcome {
  delimiter: CsvDelimiter;
  /** True when the callback asked to stop before the end of the file. */
  stopped: boolean;
  /** Set when the file could not be read to its end: not UTF-8, or broken CSV quoting. */
  fatal: DatasetProblem | null;
}

// Enough to hold the header line of any sensible file; only used to choose the delimiter.
const SNIFF_BYTES = 64 * 1024;
// Small chunks: csv-parse handles one chunk without yielding, so this bounds how long a large
// upload holds the event loop at a time (docs/decisions/0012-hardening.md).
const CHUNK_BYTES = 64 * 1024;
/** The longest record (the header line included), in characters; csvSyntaxProblem names it. */
const MAX_RECORD_CHARS = 128_000;
/** The most columns a line may have; a measurement's table has a handful. */
export const MAX_COLUMNS = 1000;

class StopSignal extends Error {}
class TooManyColumns extends Error {
  constructor(readonly line: number, readonly count: number) {
    super("too many columns");
  }
}

/**
 * Streams a CSV file through csv-parse and calls `onRecord` for every record with the line
 * of the file on which it starts (line 1 is the header). Empty lines are skipped but counted.
 * The delimiter is chosen from the header line; a UTF-8 byte order mark is dropped; quoting
 * is RFC 4180 (fields in double quotes, "" for a quote), record ends CRLF, LF or CR.
 *
 * csv-parse's own line counter counts a CRLF inside a quoted field twice, so lines are
 * counted here from the records: one line per record plus the line breaks inside its fields.
 */
export async function readCsvRecords(
  filePath: string,
  onRecord: RecordCallback,
  options: { onStart?: (info: { delimiter: CsvDelimiter; estimatedLines: number }) => void } = {},
): Promise<ReadCsvOutcome> {
  const { delimiter, estimatedLines } = await sniff(filePath);
  options.onStart?.({ delimiter, estimatedLines });
  let nextLine = 1;
  let stopped = false;
  const sink = new Writable({
    objectMode: true,
    highWaterMark: 256,
    write(fields: string[], _encoding, callback) {
      const line = nextLine;
      nextLine += 1 + lineBreaksInside(fields);
      if (fields.length === 1 && fields[0].trim() === "") {
        callback();
        return;
      }
      if (fields.length > MAX_COLUMNS) {
        callback(new TooManyColumns(line, fields.length));
        return;
      }
      let verdict: void | typeof STOP;
      try {
        verdict = onRecord(fields, line);
      } catch (error) {
        callback(error as Error);
        return;
      }
      callback(verdict === STOP ? new StopSignal() : null);
    },
  });
  const parser = new Parser({
    delimiter,
    bom: true,
    relax_column_count: true,
    skip_empty_lines: false,
    // Fields stay strings: numbers are parsed by our own strict reader, which explains
    // what is wrong with a field instead of guessing.
    cast: false,
    // A 40 MB header line is refused at its 128,000th character instead of being parsed whole.
    max_record_size: MAX_RECORD_CHARS,
  });
  try {
    await pipeline(createReadStream(filePath, { highWaterMark: CHUNK_BYTES }), createUtf8Guard(), parser, sink);
  } catch (error) {
    if (error instanceof StopSignal) {
      stopped = true;
    } else if (error instanceof NotUtf8Error) {
      const line = await locateInvalidUtf8Line(filePath);
      return { delimiter, stopped, fatal: notUtf8Problem(line) };
    } else if (error instanceof TooManyColumns) {
      return { delimiter, stopped, fatal: tooManyColumnsProblem(error) };
    } else if (error instanceof CsvError) {
      return { delimiter, stopped, fatal: csvSyntaxProblem(error) };
    } else {
      throw error;
    }
  }
  return { delimiter, stopped, fatal: null };
}

/**
 * The delimiter, from the header line, and the number of lines the file probably has,
 * extrapolated from the start of the file, so the caller can size its arrays once.
 */
async function sniff(filePath: string): Promise<{ delimiter: CsvDelimiter; estimatedLines: number }> {
  const handle = await open(filePath, "r");
  try {
    const { size } = await handle.stat();
    const buffer = Buffer.alloc(SNIFF_BYTES);
    const { bytesRead } = await handle.read(buffer, 0, SNIFF_BYTES, 0);
    const start = buffer.subarray(0, bytesRead);
    let lines = 0;
    for (let i = start.indexOf(10); i !== -1; i = start.indexOf(10, i + 1)) lines++;
    const estimatedLines = bytesRead === 0 ? 0 : Math.ceil(((lines + 1) * size) / bytesRead);
    return { delimiter: detectDelimiter(new TextDecoder().decode(start)), estimatedLines };
  } finally {
    await handle.close();
  }
}

/** Line breaks inside quoted fields; CRLF is one break, as an editor shows it. */
function lineBreaksInside(fields: string[]): number {
  let breaks = 0;
  for (const field of fields) {
    if (field.indexOf("\n") === -1 && field.indexOf("\r") === -1) continue;
    for (let i = 0; i < field.length; i++) {
      const c = field.charCodeAt(i);
      if (c === 10) breaks++;
      else if (c === 13 && field.charCodeAt(i + 1) !== 10) breaks++;
    }
  }
  return breaks;
}

function notUtf8Problem(line: number | null): DatasetProblem {
  return {
    code: "not-utf8",
    row: line,
    column: null,
    header: null,
    message: `the file is not UTF-8${line === null ? "" : ` (the first byte that is not UTF-8 is on line ${line})`}; save it as UTF-8 ("CSV UTF-8" in spreadsheet programs) and upload it again`,
  };
}

function tooManyColumnsProblem(error: TooManyColumns): DatasetProblem {
  return {
    code: "too-many-columns",
    row: error.line,
    column: null,
    header: null,
    message: `line ${error.line} has ${error.count.toLocaleString("en")} columns; a dataset takes at most ${MAX_COLUMNS.toLocaleString("en")} — is the delimiter right, and is this the measurement's table?`,
  };
}

function csvSyntaxProblem(error: CsvError): DatasetProblem {
  const line = typeof error.lines === "number" ? error.lines : null;
  const messages: Record<string, string> = {
    CSV_QUOTE_NOT_CLOSED: 'a quoted field is opened but never closed; add the closing double quote (") or remove the opening one',
    CSV_INVALID_CLOSING_QUOTE:
      'a double quote inside a quoted field must be written twice (""); or text follows the closing quote of a field',
    CSV_NON_TRIMABLE_CHAR_AFTER_CLOSING_QUOTE: "text follows the closing quote of a field; put it inside the quotes or remove it",
    CSV_INVALID_OPENING_QUOTE:
      'a double quote appears inside a field that is not quoted; quote the whole field and write the inner quote twice ("")',
    CSV_MAX_RECORD_SIZE: `a line is longer than ${MAX_RECORD_CHARS.toLocaleString("en")} characters (the header line included), which no measurement needs; is this a CSV file?`,
  };
  return {
    code: "csv-syntax",
    row: line,
    column: null,
    header: null,
    message: messages[error.code] ?? error.message,
  };
}
