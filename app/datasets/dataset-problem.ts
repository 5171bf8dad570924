/** Why a file was refused; one code per kind of mistake, so tests and the UI can tell them apart. */
export type DatasetProblemCode =
  | "empty-file"
  | "no-data-rows"
  | "not-utf8"
  | "csv-syntax"
  | "too-many-columns"
  | "header-numeric"
  | "header-missing"
  | "header-duplicate"
  | "ragged-row"
  | "empty-value"
  | "not-a-number"
  | "decimal-comma"
  | "not-finite"
  | "negative-error"
  | "bin-order"
  | "x-outside-bin"
  | "out-of-domain"
  | "duplicate-x";

/**
 * One precise reason why a file cannot become a revision.
 * `row` is the line of the file as an editor shows it (the header is line 1; a quoted field
 * spanning lines counts every line); `column` is 1-based. Both are null when the problem
 * concerns the file as a whole, and `column` is null for a mapped column that does not exist.
 */
export interface DatasetProblem {
  code: DatasetProblemCode;
  row: number | null;
  column: number | null;
  header: string | null;
  message: string;
}
