import type { ColumnMapping } from "./column-mapping";
import type { QuantityDescription } from "./quantity";
import { NATURAL_Y_UNIT } from "./quantity";
import type { QuantityScales } from "./quantity-scales";

/** Slots of a normalised row, in the order the normal form writes them. */
export const ROW_SLOTS = ["x", "xLow", "xHigh", "y", "statMinus", "statPlus", "systMinus", "systPlus"] as const;
export type RowSlot = (typeof ROW_SLOTS)[number];
export const SLOT = { x: 0, xLow: 1, xHigh: 2, y: 3, statMinus: 4, statPlus: 5, systMinus: 6, systPlus: 7 } as const;

/**
 * The first lines of the normal form: the format version, what x and y are in canonical
 * units, and which columns follow. Header names are absent on purpose (renaming a column is
 * not a new revision); what x is, and whether errors are symmetric, are present on purpose.
 * See docs/decisions/0004-dataset-normal-form.md.
 */
export function normalFormHeader(mapping: ColumnMapping, quantity: QuantityDescription, scales: QuantityScales): string {
  const columns = normalFormColumns(mapping);
  return (
    "steradian-dataset-normal-form/1\n" +
    `x=${quantity.x.kind} [${scales.xCanonicalUnit}]\n` +
    `y=${quantity.y.kind} [${NATURAL_Y_UNIT[quantity.y.kind]}]\n` +
    `columns=${columns.join(",")}\n`
  );
}

/**
 * Column names of the normal form's rows; a symmetric error is one column. An x that the file
 * does not give (bins without a centre) is not written: the normal form holds what the file
 * says, and the centre is derived from it (docs/decisions/0013-bins-without-a-centre.md).
 */
export function normalFormColumns(mapping: ColumnMapping): string[] {
  const columns = mapping.x !== undefined ? ["x"] : [];
  if (mapping.xLow !== undefined) columns.push("x_low", "x_high");
  columns.push("y");
  for (const key of ["stat", "syst"] as const) {
    const e = mapping[key];
    if (e === undefined) continue;
    if (e.kind === "symmetric") columns.push(key);
    else columns.push(`${key}_minus`, `${key}_plus`);
  }
  return columns;
}

/**
 * The slots written per row, matching `normalFormColumns`. A symmetric error fills both
 * its minus and plus slots with the same value but is written once.
 */
export function normalFormSlots(mapping: ColumnMapping): number[] {
  const slots: number[] = mapping.x !== undefined ? [SLOT.x] : [];
  if (mapping.xLow !== undefined) slots.push(SLOT.xLow, SLOT.xHigh);
  slots.push(SLOT.y);
  if (mapping.stat !== undefined) {
    if (mapping.stat.kind === "symmetric") slots.push(SLOT.statMinus);
    else slots.push(SLOT.statMinus, SLOT.statPlus);
  }
  if (mapping.syst !== undefined) {
    if (mapping.syst.kind === "symmetric") slots.push(SLOT.systMinus);
    else slots.push(SLOT.systMinus, SLOT.systPlus);
  }
  return slots;
}

/**
 * The slots kept per row for the database: those of the normal form and, always, x (the bin's
 * centre when the file gives only the edges).
 */
export function storedSlots(mapping: ColumnMapping): number[] {
  const slots = normalFormSlots(mapping);
  return slots.includes(SLOT.x) ? slots : [SLOT.x, ...slots];
}

/** One row of the normal form: canonical numbers joined by commas, ending in "\n". */
export function normalFormRow(values: ArrayLike<number>, slots: readonly number[]): string {
  let line = String(values[slots[0]]);
  for (let i = 1; i < slots.length; i++) line += "," + String(values[slots[i]]);
  return line + "\n";
}
