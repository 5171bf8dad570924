import { createHash } from "node:crypto";
import { canonicalNumber } from "~/datasets/canonical-number";
import type { ColumnMapping } from "~/datasets/column-mapping";
import type { DatasetProblem } from "~/datasets/dataset-problem";
import type { CsvDelimiter } from "~/datasets/detect-delimiter";
import { findDuplicatePoints } from "~/datasets/find-duplicate-points";
import { normalFormHeader, SLOT } from "~/datasets/normal-form";
import { ProblemCollector } from "~/datasets/problem-collector";
import { X_LABELS, type QuantityDescription } from "~/datasets/quantity";
import { createRowValidator, type RowValidator } from "~/datasets/row-validator";
import { readRefusedLines, type RefusedLines } from "./preview-csv.server";
import { readCsvRecords, STOP } from "./read-csv-records.server";

export interface IngestOptions {
  mapping: ColumnMapping;
  /** Must have passed `quantitySchema`. */
  quantity: QuantityDescription;
  limits: { maxRows: number };
  /**
   * On refusal, also read the lines the problems point at, as the file has them, for the page
   * that shows the bad cells (read here, on the ingest's worker thread, not on the event loop).
   */
  refusedLines?: boolean;
}

/**
 * The normalised rows, one array per quantity, ready for a bulk COPY. An unmapped column is
 * null. A symmetric error is one array shared by its minus and plus fields.
 */
export interface IngestColumns {
  x: Float64Array;
  xLow: Float64Array | null;
  xHigh: Float64Array | null;
  y: Float64Array;
  statMinus: Float64Array | null;
  statPlus: Float64Array | null;
  systMinus: Float64Array | null;
  systPlus: Float64Array | null;
}

export type IngestResult =
  | {
      ok: true;
      rowCount: number;
      /** SHA-256 (hex) of the normal form: the revision's identity. */
      hash: string;
      columns: IngestColumns;
      delimiter: CsvDelimiter;
      headers: string[];
    }
  | { ok: false; reason: "problems"; problems: DatasetProblem[]; problemCount: number; refused: RefusedLines | null }
  | { ok: false; reason: "limit"; limit: { kind: "rows"; max: number } };

const HASH_FLUSH_CHARS = 1 << 16;
const INITIAL_CAPACITY = 1 << 14;

/**
 * Streams a stored CSV file, validates every row against the mapping and either returns
 * the normalised columns with the hash of the normal form, or the problems (first 100 and
 * the total); never a part of the data. Memory is the columns (8 bytes per mapped value)
 * plus 4 bytes per row for the line numbers, whatever the size of the file's text.
 */
export async function ingestCsv(filePath: string, options: IngestOptions): Promise<IngestResult> {
  const { mapping, quantity } = options;
  const maxRows = options.limits.maxRows;
  const problems = new ProblemCollector();
  const hash = createHash("sha256");
  let pendingText = "";
  let validator: RowValidator | null = null;
  let headers: string[] | null = null;
  let store: ColumnStore | null = null;
  let rowCount = 0;
  let overLimit = false;
  const out = new Float64Array(8);
  let capacity = INITIAL_CAPACITY;

  const onRecord = (fields: string[], line: number): void | typeof STOP => {
    if (headers === null) {
      headers = fields.map((f) => f.trim());
      const created = createRowValidator(headers, mapping, quantity);
      if (!created.ok) {
        for (const p of created.problems) problems.add(p);
        return STOP;
      }
      validator = created.validator;
      store = new ColumnStore(validator.storedSlots, capacity);
      pendingText = normalFormHeader(mapping, quantity, validator.scales);
      return;
    }
    const v = validator as RowValidator | null;
    if (v === null || store === null) return STOP;
    if (++rowCount > maxRows) {
      overLimit = true;
      return STOP;
    }
    if (v.validate(fields, line, problems, out)) {
      if (problems.isEmpty) {
        pendingText += v.normalFormLine();
        if (pendingText.length > HASH_FLUSH_CHARS) {
          hash.update(pendingText);
          pendingText = "";
        }
      }
    } else {
      // A failed row takes no part in the duplicate check.
      out[SLOT.x] = out[SLOT.xLow] = out[SLOT.xHigh] = NaN;
    }
    store.append(out, line);
  };

  const outcome = await readCsvRecords(filePath, onRecord, {
    // Sized once from the file's first lines: growing by doubling would briefly hold the
    // old and the new arrays, the largest part of the peak memory of a big upload.
    onStart: ({ estimatedLines }) => {
      capacity = Math.max(INITIAL_CAPACITY, Math.min(maxRows, Math.ceil(estimatedLines * 1.02)));
    },
  });

  if (overLimit) return { ok: false, reason: "limit", limit: { kind: "rows", max: maxRows } };
  if (outcome.fatal !== null) problems.add(outcome.fatal);
  if (headers === null) {
    if (outcome.fatal === null) problems.add(emptyFileProblem());
  } else if (validator !== null && store !== null && rowCount === 0 && outcome.fatal === null) {
    problems.add({
      code: "no-data-rows",
      row: 2,
      column: null,
      header: null,
      message: "the file has a header line but no data rows; add the measured points below the header",
    });
  }
  const v = validator as RowValidator | null;
  const s = store as ColumnStore | null;
  if (v !== null && s !== null && rowCount > 0) reportDuplicates(v, s, quantity, problems);

  if (!problems.isEmpty || v === null || s === null || headers === null) {
    const sorted = sortByLine(problems.problems);
    const refused = options.refusedLines ? await readRefusedLines(filePath, sorted) : null;
    return { ok: false, reason: "problems", problems: sorted, problemCount: problems.count, refused };
  }
  hash.update(pendingText);
  return {
    ok: true,
    rowCount: s.length,
    hash: hash.digest("hex"),
    columns: s.columns(mapping),
    delimiter: outcome.delimiter,
    headers,
  };
}

function reportDuplicates(
  validator: RowValidator,
  store: ColumnStore,
  quantity: QuantityDescription,
  problems: ProblemCollector,
): void {
  const bins = validator.hasBins;
  const a = store.slot(bins ? SLOT.xLow : SLOT.x);
  const b = bins ? store.slot(SLOT.xHigh) : null;
  const { column, header } = validator.columnOf(bins ? SLOT.xLow : SLOT.x);
  const { xFactor, xFileUnit } = validator.scales;
  const shown = (value: number) => `${canonicalNumber(value / xFactor)}${xFileUnit}`;
  for (const { first, duplicate } of findDuplicatePoints(a, b, store.length)) {
    const firstLine = store.lines[first];
    const what = bins
      ? `the bin [${shown(a[duplicate])}, ${shown((b as Float64Array)[duplicate])}] already appears on line ${firstLine}; each bin may appear once`
      : `${X_LABELS[quantity.x.kind]} = ${shown(a[duplicate])} already appears on line ${firstLine}; each point needs its own x`;
    problems.add({
      code: "duplicate-x",
      row: store.lines[duplicate],
      column,
      header,
      message: `${what}: remove or merge one of the two rows`,
    });
  }
}

function emptyFileProblem(): DatasetProblem {
  return {
    code: "empty-file",
    row: null,
    column: null,
    header: null,
    message: "the file is empty; upload a CSV file with a header line and one line per measured point",
  };
}

function sortByLine(list: DatasetProblem[]): DatasetProblem[] {
  return [...list].sort((p, q) => (p.row ?? 0) - (q.row ?? 0) || (p.column ?? 0) - (q.column ?? 0));
}

/** Growable typed arrays for the written slots, plus the line of every row. */
class ColumnStore {
  length = 0;
  private readonly data: (Float64Array | null)[];
  private lineData: Uint32Array;
  private readonly written: Int32Array;
  // The written columns in the order of `written`, so append needs no null checks.
  private stored: Float64Array[];

  constructor(
    slots: readonly number[],
    private capacity: number,
  ) {
    this.written = Int32Array.from(slots);
    this.data = Array.from({ length: 8 }, (_, s) => (slots.includes(s) ? new Float64Array(capacity) : null));
    this.stored = slots.map((s) => this.data[s] as Float64Array);
    this.lineData = new Uint32Array(capacity);
  }

  get lines(): Uint32Array {
    return this.lineData;
  }

  append(values: Float64Array, line: number): void {
    if (this.length === this.capacity) this.grow();
    const i = this.length++;
    const { stored, written } = this;
    for (let k = 0; k < stored.length; k++) stored[k][i] = values[written[k]];
    this.lineData[i] = line;
  }

  slot(s: number): Float64Array {
    const column = this.data[s];
    if (column === null) throw new Error(`slot ${s} is not stored`);
    return column.subarray(0, this.length);
  }

  columns(mapping: ColumnMapping): IngestColumns {
    const get = (s: number) => (this.data[s] === null ? null : this.slot(s));
    const statMinus = get(SLOT.statMinus);
    const systMinus = get(SLOT.systMinus);
    return {
      x: this.slot(SLOT.x),
      xLow: get(SLOT.xLow),
      xHigh: get(SLOT.xHigh),
      y: this.slot(SLOT.y),
      statMinus,
      statPlus: mapping.stat?.kind === "symmetric" ? statMinus : get(SLOT.statPlus),
      systMinus,
      systPlus: mapping.syst?.kind === "symmetric" ? systMinus : get(SLOT.systPlus),
    };
  }

  private grow(): void {
    this.capacity *= 2;
    for (let s = 0; s < 8; s++) {
      const old = this.data[s];
      if (old === null) continue;
      const next = new Float64Array(this.capacity);
      next.set(old);
      this.data[s] = next;
    }
    this.stored = Array.from(this.written, (s) => this.data[s] as Float64Array);
    const lines = new Uint32Array(this.capacity);
    lines.set(this.lineData);
    this.lineData = lines;
  }
}
