import { z } from "zod";
import { PROCESSES } from "~/engine";

/**
 * The figure model: plain JSON, stored as a figure's draft and frozen into sealed versions.
 * Everything that decides the picture is here; the rows of the dataset revisions and the engine's
 * predictions are inputs computed from it (docs/decisions/0008-figure-model.md).
 *
 * Sizes are in the units journals use: the width comes from the size preset (mm), font sizes and
 * line widths in pt at final size. Angles follow the engine's conventions (θ in degrees of the
 * reference particle in the figure's frame).
 */

export const FIGURE_MODEL_VERSION = 1;

const hexColour = z.string().regex(/^#[0-9a-f]{6}$/, "a colour is written #rrggbb (lower case)");
const tex = (what: string) => z.string().max(400, `${what} is longer than 400 characters`);
const finite = z.number().refine(Number.isFinite, "must be a finite number");
const range = z
  .tuple([finite, finite])
  .refine(([a, b]) => a < b, "the lower end must be below the upper end");
const layerId = z.string().regex(/^[a-z][a-z0-9-]{0,39}$/, "a layer id is lower-case letters, digits and dashes");

export const X_VARIABLES = ["thetaDeg", "cosTheta", "t", "sqrtS", "beam", "kinetic"] as const;
export type XVariable = (typeof X_VARIABLES)[number];
export const ANGLE_X_VARIABLES: readonly XVariable[] = ["thetaDeg", "cosTheta", "t"];
export const ENERGY_X_VARIABLES: readonly XVariable[] = ["sqrtS", "beam", "kinetic"];

export const OBSERVABLES = ["dsigma/dOmega", "dsigma/dcos", "dsigma/dt", "sigma"] as const;
export type FigureObservable = (typeof OBSERVABLES)[number];

const energyUnit = z.enum(["GeV", "MeV", "keV"]);

export const xAxisSchema = z.object({
  variable: z.enum(X_VARIABLES),
  /** Frame of angles and of frame-dependent observables (dσ/dΩ, dσ/dcosθ). */
  frame: z.enum(["lab", "cm"]),
  /** Unit of an energy axis; t is always in GeV². */
  energyUnit: energyUnit.default("GeV"),
  scale: z.enum(["linear", "log"]).default("linear"),
  domain: range.nullable().default(null),
  label: tex("the x label"),
});

export const yAxisSchema = z.object({
  observable: z.enum(OBSERVABLES),
  /** A unit the engine parses (e.g. ub/sr, nb, pb/GeV^2) fitting the observable. */
  unit: z.string().min(1).max(40),
  scale: z.enum(["linear", "log"]).default("log"),
  domain: range.nullable().default(null),
  label: tex("the y label"),
});

const energySchema = z.object({ kind: z.enum(["sqrtS", "beam", "kinetic"]), value: finite.refine((v) => v > 0, "an energy must be positive"), unit: energyUnit });

const formFactorSchema = z.discriminatedUnion("model", [
  z.object({ model: z.literal("monopole"), lambda: finite, q2: z.enum(["s", "t"]) }),
  z.object({ model: z.literal("vmd"), mass: finite, width: finite, q2: z.enum(["s", "t"]) }),
]);

/** What a prediction's band varies: one parameter between two values. */
export const BAND_PARAMETERS = ["formFactor.lambda", "alpha", "mass", "energy"] as const;
export type BandParameter = (typeof BAND_PARAMETERS)[number];

export const predictionLayerSchema = z.object({
  kind: z.literal("prediction"),
  id: layerId,
  label: tex("the legend entry"),
  process: z.enum(PROCESSES.map((p) => p.id) as [string, ...string[]]),
  /** The beam energy (angle axes); ignored on an energy axis, which scans it. */
  energy: energySchema,
  /** The fixed angle of an energy scan of a differential observable, θ in degrees. */
  fixedThetaDeg: finite.nullable().default(null),
  /** σ on an energy axis: the acceptance in θ (degrees), or null for the total. */
  acceptanceThetaDeg: range.nullable().default(null),
  mass: finite.nullable().default(null),
  finalMass: finite.nullable().default(null),
  alpha: finite.nullable().default(null),
  formFactor: formFactorSchema.nullable().default(null),
  band: z.object({ parameter: z.enum(BAND_PARAMETERS), low: finite, high: finite }).nullable().default(null),
  colour: hexColour,
  dash: z.enum(["solid", "dashed", "dotted", "dashdot"]).default("solid"),
  /** Points of the drawn curve. */
  samples: z.number().int().min(20).max(5000).default(400),
});

export const datasetLayerSchema = z.object({
  kind: z.literal("dataset"),
  id: layerId,
  label: tex("the legend entry"),
  datasetId: z.uuid(),
  /** Pinned: a figure always shows this revision until someone moves it to another. */
  revisionNumber: z.number().int().min(1),
  colour: hexColour,
  marker: z.string().min(1).max(40),
  /** Relative, fully correlated normalisation uncertainty (e.g. 0.03), profiled in χ²; null: none. */
  normalisationUncertainty: finite.refine((v) => v > 0 && v < 1, "a fraction between 0 and 1, e.g. 0.03").nullable().default(null),
  /** The prediction layer this dataset is compared with in the strip and the statistics. */
  compareWith: layerId.nullable().default(null),
});

export const annotationLayerSchema = z.object({
  kind: z.literal("annotation"),
  id: layerId,
  tex: tex("the annotation"),
  /** Position in the panel, as fractions of its width and height from the lower left corner. */
  at: z.tuple([finite.refine((v) => v >= 0 && v <= 1, "0 to 1"), finite.refine((v) => v >= 0 && v <= 1, "0 to 1")]),
});

export const layerSchema = z.discriminatedUnion("kind", [datasetLayerSchema, predictionLayerSchema, annotationLayerSchema]);

export const panelSchema = z.object({
  id: layerId,
  /** TeX title drawn inside the panel's upper edge, e.g. a beam energy of a small multiple. */
  title: tex("the panel title").default(""),
  strip: z.enum(["none", "ratio", "pull"]).default("none"),
  stripDomain: range.nullable().default(null),
  layers: z.array(layerSchema).max(20, "at most 20 layers in a panel"),
});

export const figureModelSchema = z
  .object({
    version: z.literal(FIGURE_MODEL_VERSION),
    preset: z.string().min(1).max(60),
    /** Height of one main panel's plotting area, mm. */
    panelHeightMm: finite.refine((v) => v >= 20 && v <= 200, "between 20 and 200 mm"),
    columns: z.number().int().min(1).max(3).default(1),
    fontSizePt: finite.refine((v) => v >= 5 && v <= 14, "between 5 and 14 pt"),
    lineWidthPt: finite.refine((v) => v >= 0.1 && v <= 3, "between 0.1 and 3 pt"),
    x: xAxisSchema,
    y: yAxisSchema,
    legend: z.object({
      position: z.enum(["upper-right", "upper-left", "lower-left", "lower-right", "none"]).default("upper-right"),
      statistics: z.enum(["none", "legend", "caption"]).default("legend"),
    }),
    panels: z.array(panelSchema).min(1).max(6, "at most six panels"),
    altText: z.string().max(2000).default(""),
  })
  .superRefine((m, ctx) => {
    const ids = new Set<string>();
    m.panels.forEach((panel, p) => {
      panel.layers.forEach((layer, l) => {
        if (ids.has(layer.id)) ctx.addIssue({ code: "custom", path: ["panels", p, "layers", l, "id"], message: `layer id "${layer.id}" is used twice` });
        ids.add(layer.id);
      });
      panel.layers.forEach((layer, l) => {
        if (layer.kind !== "dataset" || layer.compareWith === null) return;
        const target = panel.layers.find((other) => other.id === layer.compareWith);
        if (target?.kind !== "prediction") {
          ctx.addIssue({ code: "custom", path: ["panels", p, "layers", l, "compareWith"], message: `"${layer.compareWith}" is not a prediction in this panel` });
        }
      });
    });
    if (m.x.scale === "log" && m.x.domain !== null && m.x.domain[0] <= 0) {
      ctx.addIssue({ code: "custom", path: ["x", "domain"], message: "a log axis needs a positive range" });
    }
    if (m.y.scale === "log" && m.y.domain !== null && m.y.domain[0] <= 0) {
      ctx.addIssue({ code: "custom", path: ["y", "domain"], message: "a log axis needs a positive range" });
    }
  });

export type FigureModel = z.infer<typeof figureModelSchema>;
export type FigurePanel = FigureModel["panels"][number];
export type FigureLayer = FigurePanel["layers"][number];
export type DatasetLayer = z.infer<typeof datasetLayerSchema>;
export type PredictionLayer = z.infer<typeof predictionLayerSchema>;
export type AnnotationLayer = z.infer<typeof annotationLayerSchema>;
export type XAxis = FigureModel["x"];
export type YAxis = FigureModel["y"];

/** Input type (defaults may be omitted), e.g. from the API. */
export type FigureModelInput = z.input<typeof figureModelSchema>;

/** The issues of a model in the API's and the form's shape: a dotted path and a message. */
export function figureModelIssues(error: z.ZodError): { path: string; message: string }[] {
  return error.issues.map((issue) => ({ path: issue.path.map(String).join("."), message: issue.message }));
}
