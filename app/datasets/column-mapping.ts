import { z } from "zod";

/** A column is referenced by its header name, so a saved mapping survives reordered columns. */
const columnName = z
  .string({ error: (issue) => (issue.input === undefined ? "choose a column" : "name the column by its header, as text") })
  .trim()
  .min(1, "choose a column");

export const errorMappingSchema = z.discriminatedUnion(
  "kind",
  [
  z.object({ kind: z.literal("symmetric"), column: columnName }),
  z.object({ kind: z.literal("asymmetric"), minus: columnName, plus: columnName }),
  ],
  { error: 'give its kind: { "kind": "symmetric", "column": … } or { "kind": "asymmetric", "minus": …, "plus": … }' },
);
export type ErrorMapping = z.infer<typeof errorMappingSchema>;

/**
 * Which header names hold x (with an optional bin [xLow, xHigh]), y and the statistical and
 * systematic uncertainties. Errors are magnitudes in the unit of y; an asymmetric error has
 * a minus and a plus column, both non-negative. x may be left out when both bin edges are
 * mapped: each point is then its bin, plotted at the bin's centre
 * (docs/decisions/0013-bins-without-a-centre.md).
 */
export const columnMappingSchema = z
  .object(
    {
    x: columnName.optional(),
    xLow: columnName.optional(),
    xHigh: columnName.optional(),
    y: columnName,
    stat: errorMappingSchema.optional(),
    syst: errorMappingSchema.optional(),
    },
    { error: 'a mapping is an object naming the columns, such as { "x": "theta_cm", "y": "dsdo_ub_sr" }' },
  )
  .superRefine((m, ctx) => {
    if (m.x === undefined && (m.xLow === undefined || m.xHigh === undefined)) {
      ctx.addIssue({
        code: "custom",
        path: ["x"],
        message: "choose the column that holds x, or map both edges of the bin (each point is then plotted at its bin's centre)",
      });
    }
    if ((m.xLow === undefined) !== (m.xHigh === undefined)) {
      ctx.addIssue({
        code: "custom",
        path: [m.xLow === undefined ? "xLow" : "xHigh"],
        message: "a bin needs both its low and its high edge: map both columns or neither",
      });
    }
    const seen = new Map<string, string>();
    for (const [field, name] of mappedColumnEntries(m)) {
      const first = seen.get(name);
      if (first !== undefined) {
        ctx.addIssue({
          code: "custom",
          path: field.split("."),
          message: `column "${name}" is already mapped as ${first}; each column can hold one quantity only`,
        });
      } else {
        seen.set(name, field);
      }
    }
  });
export type ColumnMapping = z.infer<typeof columnMappingSchema>;

/**
 * The mapped fields in their canonical order, as `[field, header name]`. The order is part of
 * the dataset normal form (docs/decisions/0004-dataset-normal-form.md), so do not reorder.
 */
export function mappedColumnEntries(m: ColumnMapping): [string, string][] {
  const entries: [string, string][] = m.x !== undefined ? [["x", m.x]] : [];
  if (m.xLow !== undefined) entries.push(["xLow", m.xLow]);
  if (m.xHigh !== undefined) entries.push(["xHigh", m.xHigh]);
  entries.push(["y", m.y]);
  for (const key of ["stat", "syst"] as const) {
    const e = m[key];
    if (e === undefined) continue;
    if (e.kind === "symmetric") entries.push([`${key}.column`, e.column]);
    else entries.push([`${key}.minus`, e.minus], [`${key}.plus`, e.plus]);
  }
  return entries;
}

const FIELD_WORDS: Record<string, string> = {
  x: "x", xLow: "the bin's low edge", xHigh: "the bin's high edge", y: "y",
  stat: "the statistical error", "stat.kind": "the statistical error", "syst.kind": "the systematic error", "stat.column": "the statistical error", "stat.minus": "the statistical error's − column", "stat.plus": "the statistical error's + column",
  syst: "the systematic error", "syst.column": "the systematic error", "syst.minus": "the systematic error's − column", "syst.plus": "the systematic error's + column",
};

/** A mapping field's path (`x`, `stat.minus`) as a reader names it ("the statistical error's − column"). */
export function mappingFieldWords(path: string): string {
  return FIELD_WORDS[path] ?? path;
}
