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
