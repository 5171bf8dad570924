import { z } from "zod";
import { type ColumnMapping, columnMappingSchema, mappingFieldWords } from "~/datasets/column-mapping";
import { ENERGY_UNITS, T_UNITS, X_KINDS, Y_KINDS, quantitySchema } from "~/datasets/quantity";
import { PROCESSES } from "~/engine";

const PROCESS_IDS = PROCESSES.map((p) => p.id) as [string, ...string[]];

const optionalText = (max: number) => z.string().trim().max(max, `At most ${max} characters.`).optional().transform((v) => (v ? v : null));

/** The dataset as the API takes it (JSON). */
export const DatasetInput = z.object({
  name: z.string().trim().min(1, "Name the dataset, e.g. “dσ/dΩ at 0.5 GeV”.").max(200, "At most 200 characters."),
  quantity: quantitySchema,
  mapping: columnMappingSchema.optional(),
  metadata: z
    .object({
      process: z.enum(PROCESS_IDS, { message: `Choose one of: ${PROCESS_IDS.join(", ")}.` }).optional(),
      beamEnergyGeV: z.number({ message: "Give the beam energy in GeV as a number." }).positive("The beam energy must be positive.").finite().optional(),
      target: optionalText(200),
      description: z.string().trim().max(4000, "At most 4000 characters.").optional(),
    })
    .default({ target: null }),
});
export type DatasetInputValue = z.infer<typeof DatasetInput>;

const numberOrEmpty = z
  .string()
  .trim()
  .transform((v, ctx) => {
    if (v === "") return undefined;
    const n = Number(v);
    if (!Number.isFinite(n)) {
      ctx.addIssue({ code: "custom", message: v.includes(",") ? "Use a decimal point, not a comma." : "Enter a number." });
      return z.NEVER;
    }
    return n;
  });

/** The same from the HTML form, whose fields are flat strings. */
export const DatasetForm = z
  .object({
    name: z.string(),
    xKind: z.enum(X_KINDS, { message: "Say what x is." }),
    xUnit: z.string().optional(),
    yKind: z.enum(Y_KINDS, { message: "Say what y is." }),
    yUnit: z.string(),
    process: z.string().optional(),
    beamEnergyGeV: numberOrEmpty.optional(),
    target: z.string().optional(),
    description: z.string().optional(),
  })
  .transform((f): z.input<typeof DatasetInput> => ({
    name: f.name,
    quantity: {
      x: xQuantity(f.xKind, f.xUnit),
      y: { kind: f.yKind, unit: f.yUnit },
    },
    metadata: { process: f.process || undefined, beamEnergyGeV: f.beamEnergyGeV, target: f.target, description: f.description },
  }))
  .pipe(DatasetInput);

/** The flat form field of each nested path of DatasetInput, for errors shown beside the field. */
export const DATASET_FORM_FIELDS: Record<string, string> = {
  "quantity.y.unit": "yUnit",
  "quantity.x.unit": "xUnit",
  "metadata.beamEnergyGeV": "beamEnergyGeV",
  "metadata.process": "process",
};

function xQuantity(kind: (typeof X_KINDS)[number], unit: string | undefined): z.input<typeof quantitySchema>["x"] {
  if (kind === "t") return { kind, unit: (unit || "GeV^2") as (typeof T_UNITS)[number] };
  if (kind === "sqrt_s" || kind === "beam_energy" || kind === "beam_kinetic") return { kind, unit: (unit || "GeV") as (typeof ENERGY_UNITS)[number] };
  return { kind };
}


/** The column mapping from the HTML mapping form (flat fields; empty means not mapped). */
export const MappingForm = z
  .object({
    x: z.string(),
    xLow: z.string().optional(),
    xHigh: z.string().optional(),
    y: z.string(),
    statKind: z.enum(["none", "symmetric", "asymmetric"]).default("none"),
    stat: z.string().optional(),
    statMinus: z.string().optional(),
    statPlus: z.string().optional(),
    systKind: z.enum(["none", "symmetric", "asymmetric"]).default("none"),
    syst: z.string().optional(),
    systMinus: z.string().optional(),
    systPlus: z.string().optional(),
  })
  .transform((f): z.input<typeof columnMappingSchema> => {
    const err = (kind: string, sym?: string, minus?: string, plus?: string) =>
      kind === "symmetric" ? { kind: "symmetric" as const, column: sym ?? "" } : kind === "asymmetric" ? { kind: "asymmetric" as const, minus: minus ?? "", plus: plus ?? "" } : undefined;
    return {
      ...(f.x ? { x: f.x } : {}),
      ...(f.xLow || f.xHigh ? { xLow: f.xLow || undefined, xHigh: f.xHigh || undefined } : {}),
      y: f.y,
      stat: err(f.statKind, f.stat, f.statMinus, f.statPlus),
      syst: err(f.systKind, f.syst, f.systMinus, f.systPlus),
    };
  })
  .pipe(columnMappingSchema);

const jsonText = z.string().transform((text, ctx) => {
  try {
    return JSON.parse(text) as unknown;
  } catch {
    ctx.addIssue({ code: "custom", message: "The “mapping” field is not valid JSON." });
    return z.NEVER;
  }
});

/**
 * The `mapping` field of an API upload: a column mapping as JSON text. Absent, blank or not
 * text, it is undefined: the dataset's saved mapping applies.
 */
export const MappingField = z.preprocess(
  (field) => (typeof field === "string" && field.trim() !== "" ? field : undefined),
  jsonText.pipe(columnMappingSchema).optional(),
);

export type UploadMapping =
  | { ok: true; mapping: ColumnMapping }
  | { ok: false; code: "invalid-mapping" | "missing-mapping"; message: string; field: string };

/** The mapping an API upload is read with: the one sent in its `mapping` field, else the dataset's saved one. */
export function uploadMapping(field: unknown, saved: unknown): UploadMapping {
  const sent = MappingField.safeParse(field);
  const parsed = sent.success && sent.data === undefined && saved != null ? columnMappingSchema.safeParse(saved) : sent;
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const path = issue.path.join(".");
    const message = path === "" ? issue.message.charAt(0).toUpperCase() + issue.message.slice(1) : `The mapping of ${mappingFieldWords(path)} (“${path}”): ${issue.message}.`;
    return { ok: false, code: "invalid-mapping", message, field: ["mapping", ...issue.path].join(".") };
  }
  if (parsed.data === undefined) {
    return { ok: false, code: "missing-mapping", message: "This dataset has no saved column mapping yet: send one in the “mapping” field.", field: "mapping" };
  }
  return { ok: true, mapping: parsed.data };
}
