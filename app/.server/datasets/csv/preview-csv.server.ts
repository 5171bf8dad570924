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
/** A shown field is cut after this many characters. */
export const REFUSED_FIELD_CHARS = 40;
/** Files wider than this show only their first columns and the bad ones. */
export const REFUSED_COLUMNS_SHOWN = 12;

export interface RefusedLines {
  /** 1-based numbers of the file's columns that are shown, in order. */
  columns: number[];
  /** Their header names. */
  headers: string[];
  /** The total number of columns of the file. */
  columnCount: number;
  /** The lines that problems point at (the first REFUSED_LINES_SHOWN of them), the shown columns' fields as the file has them, each cut at REFUSED_FIELD_CHARS characters. */
  rows: { line: number; fields: string[] }[];
}

const cut = (field: string) => (field.length > REFUSED_FIELD_CHARS ? field.slice(0, REFUSED_FIELD_CHARS) + "…" : field);

/**
 * The header and the data lines that problems point at in a stored CSV file, as text, so that
 * a refused file's bad cells can be shown where they are: at most REFUSED_LINES_SHOWN lines,
 * fields cut at REFUSED_FIELD_CHARS characters, and in a file of more than
 * REFUSED_COLUMNS_SHOWN columns only the first ones and those with a problem. Reads only as
 * far as the last line shown; null when no problem points at a data line and column, or when
 * the file cannot be read as CSV up to there.
 */
export async function readRefusedLines(filePath: string, problems: readonly Pick<DatasetProblem, "row" | "column">[]): Promise<RefusedLines | null> {
  const located = problems.filter((p): p is { row: number; column: number } => p.row !== null && p.row >= 2 && p.column !== null);
  const wanted = new Set([...new Set(located.map((p) => p.row))].sort((a, b) => a - b).slice(0, REFUSED_LINES_SHOWN));
  if (wanted.size === 0) return null;
  const last = Math.max(...wanted);
  const bad = new Set(located.filter((p) => wanted.has(p.row)).map((p) => p.column));
  let headers: string[] | null = null;
  let columns: number[] = [];
  const rows: { line: number; fields: string[] }[] = [];
  const outcome = await readCsvRecords(filePath, (fields, line) => {
    if (headers === null) {
      headers = fields.map((f) => f.trim());
      columns = headers.map((_, i) => i + 1).filter((c) => headers!.length <= REFUSED_COLUMNS_SHOWN || c <= REFUSED_COLUMNS_SHOWN || bad.has(c));
      return;
    }
    if (wanted.has(line)) rows.push({ line, fields: columns.map((c) => cut(fields[c - 1] ?? "")) });
    if (line >= last) return STOP;
  });
  const found = headers as string[] | null;
  if (found === null || (outcome.fatal !== null && rows.length === 0)) return null;
  return { columns, headers: columns.map((c) => cut(found[c - 1] ?? "")), columnCount: found.length, rows };
}
