// The public face of app/datasets for routes and components; internals stay importable for tests.
export { columnMappingSchema, errorMappingSchema, mappedColumnEntries } from "./column-mapping";
export type { ColumnMapping, ErrorMapping } from "./column-mapping";
export type { DatasetProblem, DatasetProblemCode } from "./dataset-problem";
export { diffRevisions, REVISION_ROW_FIELDS } from "./diff-revisions";
export type { ChangedRow, DiffSide, RevisionDiff, RevisionRow, RevisionRowField } from "./diff-revisions";
export { guessMapping } from "./guess-mapping";
export type { MappingField, MappingGuess } from "./guess-mapping";
export { MAX_LISTED_PROBLEMS } from "./problem-collector";
export { normalFormColumns, normalFormHeader, normalFormRow, ROW_SLOTS, SLOT } from "./normal-form";
export {
  ENERGY_UNITS,
  NATURAL_Y_UNIT,
  quantitySchema,
  T_UNITS,
  X_KINDS,
  X_LABELS,
  xQuantitySchema,
  Y_DIMENSIONS,
  Y_KINDS,
  Y_LABELS,
  yQuantitySchema,
} from "./quantity";
export type { EnergyUnit, QuantityDescription, TUnit, XKind, XQuantity, YKind, YQuantity } from "./quantity";
export { resolveQuantityScales } from "./quantity-scales";
export type { QuantityScales } from "./quantity-scales";
