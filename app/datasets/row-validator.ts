import { CANONICAL_DIGITS, canonicalMidpoint, canonicalTextFromPrecision, canonicalTextOfShortDecimal } from "./canonical-number";
import { mappedColumnEntries, type ColumnMapping } from "./column-mapping";
import type { DatasetProblem } from "./dataset-problem";
import { normalFormSlots, SLOT, storedSlots } from "./normal-form";
import { parseNumberField, readPlainDecimal, readShiftedDecimal, shiftDecimalText, type NumberFieldResult } from "./parse-number-field";
import type { ProblemCollector } from "./problem-collector";
import { X_LABELS, type QuantityDescription, type XKind } from "./quantity";
import { resolveQuantityScales, type QuantityScales } from "./quantity-scales";
import { isInXDomain, xDomainViolation } from "./x-domain";

export type RowValidatorResult =
  | { ok: true; validator: RowValidator }
  | { ok: false; problems: DatasetProblem[] };

type Role = "x" | "y" | "error";

const SLOT_OF_FIELD: Record<string, readonly number[]> = {
  x: [SLOT.x],
  xLow: [SLOT.xLow],
  xHigh: [SLOT.xHigh],
  y: [SLOT.y],
  "stat.column": [SLOT.statMinus, SLOT.statPlus],
  "stat.minus": [SLOT.statMinus],
  "stat.plus": [SLOT.statPlus],
  "syst.column": [SLOT.systMinus, SLOT.systPlus],
  "syst.minus": [SLOT.systMinus],
  "syst.plus": [SLOT.systPlus],
};

const ERROR_LABEL: Record<string, string> = {
  "stat.column": "statistical",
  "stat.minus": "statistical",
  "stat.plus": "statistical",
  "syst.column": "systematic",
  "syst.minus": "systematic",
  "syst.plus": "systematic",
};

/**
 * Checks the header line against the mapping and, if it fits, returns a validator for the
 * data rows. Header problems are reported on line 1.
 */
export function createRowValidator(
  headers: readonly string[],
  mapping: ColumnMapping,
  quantity: QuantityDescription,
): RowValidatorResult {
  const names = headers.map((h) => h.trim());
  const problems: DatasetProblem[] = [];

  const nonEmpty = names.filter((n) => n !== "");
  if (nonEmpty.length > 0 && nonEmpty.every((n) => parseNumberField(n).ok)) {
    problems.push({
      code: "header-numeric",
      row: 1,
      column: null,
      header: null,
      message: `line 1 (${truncateList(names)}) looks like data, not a header; add a first line that names the columns`,
    });
    return { ok: false, problems };
  }

  const fields: { field: string; index: number }[] = [];
  for (const [field, name] of mappedColumnEntries(mapping)) {
    const at: number[] = [];
    names.forEach((n, i) => {
      if (n === name) at.push(i);
    });
    if (at.length === 0) {
      problems.push({
        code: "header-missing",
        row: 1,
        column: null,
        header: name,
        message: `the mapping uses column "${name}" for ${describeField(field)}, but the header has no such column (it has ${truncateList(names)}); rename the column in the file or change the mapping`,
      });
    } else if (at.length > 1) {
      problems.push({
        code: "header-duplicate",
        row: 1,
        column: at[1] + 1,
        header: name,
        message: `the column name "${name}" appears more than once in the header (columns ${at.map((i) => i + 1).join(", ")}); give the columns distinct names`,
      });
    } else {
      fields.push({ field, index: at[0] });
    }
  }
  if (problems.length > 0) return { ok: false, problems };

  return { ok: true, validator: new RowValidator(names, mapping, quantity, fields) };
}

/**
 * Validates and normalises one data row at a time. Kept allocation-free on the good path
 * because it runs once per row of files with millions of rows.
 */
export class RowValidator {
  /** Slots of `out` that the normal form writes, in order. */
  readonly slots: readonly number[];
  /** Slots of `out` kept for the database: the normal form's and x, derived or not. */
  readonly storedSlots: readonly number[];
  readonly scales: QuantityScales;
  readonly hasBins: boolean;
  /** No x column: x is each bin's centre (docs/decisions/0013-bins-without-a-centre.md). */
  readonly derivesX: boolean;
  private readonly xKind: XKind;
  private readonly fieldIndex: Int32Array;
  private readonly shifts: Int32Array;
  private readonly shiftSuffix: string[];
  private readonly factor: Float64Array;
  private readonly role: Role[];
  private readonly label: string[];
  private readonly raw: string[];
  private readonly text: string[];
  private readonly entries: { field: string; index: number; slots: readonly number[] }[];
  // The same entries as flat arrays for the per-row loop: field index, first slot, and the
  // second slot a symmetric error fills (-1 if none).
  private readonly entryIndex: Int32Array;
  private readonly entrySlot: Int32Array;
  private readonly entryTwin: Int32Array;

  constructor(
    readonly headers: readonly string[],
    mapping: ColumnMapping,
    quantity: QuantityDescription,
    fields: { field: string; index: number }[],
  ) {
    this.scales = resolveQuantityScales(quantity);
    this.slots = normalFormSlots(mapping);
    this.storedSlots = storedSlots(mapping);
    this.hasBins = mapping.xLow !== undefined;
    this.derivesX = mapping.x === undefined;
    this.xKind = quantity.x.kind;
    this.fieldIndex = new Int32Array(8).fill(-1);
    this.shifts = new Int32Array(8);
    this.shiftSuffix = new Array<string>(8).fill("");
    this.factor = new Float64Array(8);
    this.role = new Array<Role>(8);
    this.label = new Array<string>(8);
    this.raw = new Array<string>(8).fill("");
    this.text = new Array<string>(8).fill("");
    this.entries = fields.map((f) => ({ ...f, slots: SLOT_OF_FIELD[f.field] }));
    this.entryIndex = Int32Array.from(this.entries, (e) => e.index);
    this.entrySlot = Int32Array.from(this.entries, (e) => e.slots[0]);
    this.entryTwin = Int32Array.from(this.entries, (e) => e.slots[1] ?? -1);
    for (const { field, index, slots } of this.entries) {
      for (const slot of slots) {
        this.fieldIndex[slot] = index;
        const isX = slot <= SLOT.xHigh;
        this.shifts[slot] = isX ? this.scales.xShift : this.scales.yShift;
        this.shiftSuffix[slot] = `e${this.shifts[slot]}`;
        this.factor[slot] = isX ? 1 : this.scales.yFactor;
        this.role[slot] = isX ? "x" : slot === SLOT.y ? "y" : "error";
        this.label[slot] = ERROR_LABEL[field] ?? "";
      }
    }
  }

  /**
   * Fills `out` (length 8, indexed by SLOT) with the row's canonical values and returns true,
   * or reports every problem of the row and returns false. Absent slots are NaN.
   */
  validate(fields: readonly string[], line: number, problems: ProblemCollector, out: Float64Array): boolean {
    if (fields.length !== this.headers.length) {
      problems.add({
        code: "ragged-row",
        row: line,
        column: null,
        header: null,
        message: `this row has ${fields.length} field${fields.length === 1 ? "" : "s"}, the header has ${this.headers.length}; give every row one field per header column${fields.length > this.headers.length ? " (a decimal comma such as 1,5 in a comma-separated file splits one number into two fields)" : ""}`,
      });
      return false;
    }
    let ok = true;
    const { entryIndex, entrySlot, entryTwin, shifts, shiftSuffix, factor, raw, text: texts } = this;
    for (let e = 0; e < entryIndex.length; e++) {
      const index = entryIndex[e];
      const slot = entrySlot[e];
      const twin = entryTwin[e];
      const text = fields[index].trim();
      const shift = shifts[slot];
      const f = factor[slot];
      // The value in canonical units before rounding: the decimal shifted by `shift`. Most
      // fields have no exponent; for them one Number() call both checks and reads the field.
      let value: number;
      let shifted: number;
      if (shift === 0) {
        value = shifted = readPlainDecimal(text);
      } else if (text.indexOf("e") === -1 && text.indexOf("E") === -1) {
        value = shifted = readShiftedDecimal(text, shiftSuffix[slot]);
      } else {
        value = readPlainDecimal(text);
        shifted = value !== value ? NaN : Number(shiftDecimalText(text, shift));
      }
      if (!(shifted - shifted === 0)) {
        ok = false;
        out[slot] = NaN;
        if (twin !== -1) out[twin] = NaN;
        if (Number.isNaN(readPlainDecimal(text))) this.reportUnreadable(text, slot, index, line, problems);
        else problems.add(this.problem("not-finite", line, index, `"${text}" is too large once converted to canonical units`));
        continue;
      }
      let canonical: number;
      let canonicalText: string;
      if (f === 1 && text.length <= CANONICAL_DIGITS) {
        // At most 12 characters hold at most 12 significant digits, and a shift of the decimal
        // exponent keeps them: the value is already canonical, and toPrecision (the costliest
        // step per field) is skipped. -0 → 0.
        canonical = shifted === 0 ? 0 : shifted;
        canonicalText = shift === 0 ? canonicalTextOfShortDecimal(text, value) : String(canonical);
      } else {
        const scaled = shifted * f;
        if (scaled === 0) {
          canonical = 0;
          canonicalText = "0";
        } else if (scaled - scaled !== 0) {
          ok = false;
          out[slot] = NaN;
          if (twin !== -1) out[twin] = NaN;
          problems.add(this.problem("not-finite", line, index, `"${text}" is too large once converted to canonical units`));
          continue;
        } else {
          // canonicalNumber and formatCanonicalNumber in one toPrecision call.
          const p = scaled.toPrecision(CANONICAL_DIGITS);
          canonical = Number(p);
          canonicalText = canonicalTextFromPrecision(p);
        }
      }
      out[slot] = canonical;
      raw[slot] = text;
      texts[slot] = canonicalText;
      if (twin !== -1) {
        out[twin] = canonical;
        raw[twin] = text;
        texts[twin] = canonicalText;
      }
    }
    for (let s = 0; s < 8; s++) if (this.fieldIndex[s] === -1) out[s] = NaN;
    if (!ok) return false;

    for (let e = 0; e < entryIndex.length; e++) {
      const slot = entrySlot[e];
      if (slot < SLOT.statMinus || !(out[slot] < 0)) continue;
      const { field, index } = this.entries[e];
      const text = this.raw[slot];
      const side = field.endsWith(".minus") ? "minus " : field.endsWith(".plus") ? "plus " : "";
      problems.add(
        this.problem(
          "negative-error",
          line,
          index,
          `the ${this.label[slot]} ${side}uncertainty ${text} is negative; write its size, ${text.replace(/^-/, "")}${side === "minus " ? " (the minus column holds a magnitude, not a signed offset)" : ""}`,
        ),
      );
      ok = false;
    }

    for (let s = SLOT.x; s <= SLOT.xHigh; s++) {
      if (this.fieldIndex[s] === -1 || isInXDomain(this.xKind, out[s])) continue;
      const why = xDomainViolation(this.xKind, out[s], this.raw[s] + this.scales.xFileUnit);
      if (why !== null) {
        problems.add(this.problem("out-of-domain", line, this.fieldIndex[s], s === SLOT.x ? why : `bin edge: ${why}`));
        ok = false;
      }
    }
    if (this.hasBins && ok) {
      const lo = out[SLOT.xLow];
      const hi = out[SLOT.xHigh];
      if (lo > hi) {
        problems.add(
          this.problem(
            "bin-order",
            line,
            this.fieldIndex[SLOT.xLow],
            `the bin's low edge ${this.raw[SLOT.xLow]} is above its high edge ${this.raw[SLOT.xHigh]}; swap the two values`,
          ),
        );
        ok = false;
      } else if (this.derivesX) {
        const centre = canonicalMidpoint(this.text[SLOT.xLow], this.text[SLOT.xHigh]);
        out[SLOT.x] = centre.value;
        this.text[SLOT.x] = centre.text;
      } else if (out[SLOT.x] < lo || out[SLOT.x] > hi) {
        problems.add(
          this.problem(
            "x-outside-bin",
            line,
            this.fieldIndex[SLOT.x],
            `${X_LABELS[this.xKind]} = ${this.raw[SLOT.x]} lies outside its bin [${this.raw[SLOT.xLow]}, ${this.raw[SLOT.xHigh]}]; the point must lie within its bin`,
          ),
        );
        ok = false;
      }
    }
    return ok;
  }

  private reportUnreadable(text: string, slot: number, index: number, line: number, problems: ProblemCollector): void {
    const parsed = parseNumberField(text) as Extract<NumberFieldResult, { ok: false }>;
    const reason =
      parsed.code === "empty-value" && this.role[slot] === "error"
        ? `is empty; write 0 if this point has no ${this.label[slot]} uncertainty`
        : parsed.reason;
    problems.add(this.problem(parsed.code, line, index, parsed.code === "empty-value" ? `the field ${reason}` : reason));
  }

  /**
   * The normal-form line of the row last validated successfully: the same text as
   * `normalFormRow(out, slots)`, built from texts made while reading the fields.
   */
  normalFormLine(): string {
    const slots = this.slots;
    let line = this.text[slots[0]];
    for (let i = 1; i < slots.length; i++) line += "," + this.text[slots[i]];
    return line + "\n";
  }

  /** Header name and 1-based column of the field mapped to a slot, for reports made later. */
  columnOf(slot: number): { column: number; header: string } {
    const index = this.fieldIndex[slot];
    return { column: index + 1, header: this.headers[index] };
  }

  private problem(code: DatasetProblem["code"], line: number, index: number, message: string): DatasetProblem {
    return { code, row: line, column: index + 1, header: this.headers[index], message };
  }
}

function describeField(field: string): string {
  switch (field) {
    case "x":
      return "x";
    case "xLow":
      return "the bin's low edge";
    case "xHigh":
      return "the bin's high edge";
    case "y":
      return "y";
    default: {
      const [kind, part] = field.split(".");
      const name = kind === "stat" ? "statistical" : "systematic";
      return part === "column" ? `the ${name} uncertainty` : `the ${name} uncertainty (${part})`;
    }
  }
}

function truncateList(names: readonly string[]): string {
  const shown = names.slice(0, 8).map((n) => `"${n.length > 30 ? n.slice(0, 30) + "…" : n}"`);
  return shown.join(", ") + (names.length > 8 ? `, … (${names.length} columns)` : "");
}
