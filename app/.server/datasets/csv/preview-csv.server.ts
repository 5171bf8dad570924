import type { DatasetProblem } from "~/datasets/dataset-problem";
import type { CsvDelimiter } from "~/datasets/detect-delimiter";
import { guessMapping, type MappingGuess } from "~/datasets/guess-mapping";
import { readCsvRecords, STOP } from "./read-csv-records.server";

export type CsvPreview =
  | {
      ok: true;
      delimiter: CsvDelimiter;
      headers: string[];
      /** The first data rows as text, each with the line of the file it starts on. */
      rows: { line: number; fields: string[] }[];
      /** True when the file has more data rows than shown. */
      more: boolean;
      guess: MappingGuess;
    }
  | { ok: false; problems: DatasetProblem[] };

/**
 * The header and the first data rows of a stored CSV file, for the mapping step. Reads only
 * as far as it shows (UTF-8 is therefore checked only that far; the ingest checks it all).
 */
export async function previewCsv(filePath: string, options: { rows: number } = { rows: 20 }): Promise<CsvPreview> {
  let headers: string[] | null = null;
  const rows: { line: number; fields: string[] }[] = [];
  let more = false;
  const outcome = await readCsvRecords(filePath, (fields, line) => {
    if (headers === null) {
      headers = fields.map((f) => f.trim());
      return options.rows > 0 ? undefined : STOP;
    }
    if (rows.length >= options.rows) {
      more = true;
      return STOP;
    }
    rows.push({ line, fields });
  });
  if (outcome.fatal !== null) return { ok: false, problems: [outcome.fatal] };
  const found = headers as string[] | null;
  if (found === null) {
    return {
      ok: false,
      problems: [
        {
          code: "empty-file",
          row: null,
          column: null,
          header: null,
          message: "the file is empty; upload a CSV file with a header line and one line per measured point",
        },
      ],
    };
  }
  return { ok: true, delimiter: outcome.delimiter, headers: found, rows, more, guess: guessMapping(found) };
}

/** At most this many lines of a refused file are shown with their bad cells marked. */
export const REFUSED_LINES_SHOWN = 20;

export interface RefusedLines {
  headers: string[];
  /** The lines that problems point at (the first REFUSED_LINES_SHOWN of them), as the file has them. */
  rows: { line: number; fields: string[] }[];
}

/**
 * The header and the given data lines of a stored CSV file, as text, so that a refused file's
 * bad cells can be shown where they are. Reads only as far as the last line asked for; null
 * when the file cannot be read as CSV up to there.
 */
export async function readRefusedLines(filePath: string, lines: readonly number[]): Promise<RefusedLines | null> {
  const wanted = new Set([...new Set(lines)].filter((l) => l >= 2).sort((a, b) => a - b).slice(0, REFUSED_LINES_SHOWN));
  if (wanted.size === 0) return null;
  const last = Math.max(...wanted);
  let headers: string[] | null = null;
  const rows: { line: number; fields: string[] }[] = [];
  const outcome = await readCsvRecords(filePath, (fields, line) => {
    if (headers === null) {
      headers = fields.map((f) => f.trim());
      return;
    }
    if (wanted.has(line)) rows.push({ line, fields });
    if (line >= last) return STOP;
  });
  const found = headers as string[] | null;
  if (found === null || (outcome.fatal !== null && rows.length === 0)) return null;
  return { headers: found, rows };
}
