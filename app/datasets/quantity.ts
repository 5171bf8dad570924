import { z } from "zod";
import { parseUnit, type UnitDimension } from "~/engine/units";

/**
 * What the x column of a dataset measures. Angles are always in degrees and cosθ is
 * dimensionless, so only t and the energies carry a unit of their own.
 */
export const X_KINDS = [
  "theta_lab_deg",
  "theta_cm_deg",
  "cos_theta",
  "t",
  "sqrt_s",
  "beam_energy",
  "beam_kinetic",
] as const;
export type XKind = (typeof X_KINDS)[number];

export const T_UNITS = ["GeV^2", "MeV^2"] as const;
export type TUnit = (typeof T_UNITS)[number];

export const ENERGY_UNITS = ["GeV", "MeV", "keV"] as const;
export type EnergyUnit = (typeof ENERGY_UNITS)[number];

/** What the y column measures; its unit is a free string read by the engine's unit parser. */
export const Y_KINDS = ["dsigma_domega", "dsigma_dcos", "dsigma_dt", "sigma"] as const;
export type YKind = (typeof Y_KINDS)[number];

export const xQuantitySchema = z.discriminatedUnion("kind", [
  z.object({ kind: z.enum(["theta_lab_deg", "theta_cm_deg", "cos_theta"]) }),
  z.object({ kind: z.literal("t"), unit: z.enum(T_UNITS) }),
  z.object({ kind: z.enum(["sqrt_s", "beam_energy", "beam_kinetic"]), unit: z.enum(ENERGY_UNITS) }),
]);
export type XQuantity = z.infer<typeof xQuantitySchema>;

export const yQuantitySchema = z.object({
  kind: z.enum(Y_KINDS),
  unit: z.string().trim().min(1, "give the unit of y, for example nb/sr"),
});
export type YQuantity = z.infer<typeof yQuantitySchema>;

/** The dimension of y that each y kind needs (the engine's unit dimensions). */
export const Y_DIMENSIONS: Record<YKind, UnitDimension> = {
  dsigma_domega: "area/sr",
  dsigma_dcos: "area",
  dsigma_dt: "area/GeV2",
  sigma: "area",
};

/**
 * The unit in which a revision stores y: the engine's natural unit (GeV⁻², per sr or per GeV²
 * where the kind asks for it). Part of the dataset normal form (docs/decisions/0004), so the
 * spelling must not change.
 */
export const NATURAL_Y_UNIT: Record<YKind, string> = {
  dsigma_domega: "GeV^-2/sr",
  dsigma_dcos: "GeV^-2",
  dsigma_dt: "GeV^-4",
  sigma: "GeV^-2",
};

const Y_UNIT_EXAMPLES: Record<YKind, string> = {
  dsigma_domega: "nb/sr, ub/sr, pb/sr or GeV^-2/sr",
  dsigma_dcos: "nb, ub, pb or GeV^-2",
  dsigma_dt: "nb/GeV^2 or GeV^-4",
  sigma: "nb, ub, pb or GeV^-2",
};

/**
 * What a dataset's x and y are. The y unit goes through the engine's unit parser, so that
 * there is exactly one notion of a valid unit in the product, and its dimension must fit
 * the y kind (dσ/dΩ per steradian, dσ/dt per GeV², dσ/dcosθ and σ an area).
 */
export const quantitySchema = z
  .object({ x: xQuantitySchema, y: yQuantitySchema })
  .superRefine((q, ctx) => {
    let dimension: UnitDimension;
    try {
      dimension = parseUnit(q.y.unit).dimension;
    } catch (error) {
      const reason = error instanceof Error ? error.message : String(error);
      ctx.addIssue({ code: "custom", path: ["y", "unit"], message: reason });
      return;
    }
    const wanted = Y_DIMENSIONS[q.y.kind];
    if (dimension !== wanted) {
      ctx.addIssue({
        code: "custom",
        path: ["y", "unit"],
        message: `"${q.y.unit}" is ${describeDimension(dimension)}, but ${Y_LABELS[q.y.kind]} needs ${describeDimension(wanted)}: use for example ${Y_UNIT_EXAMPLES[q.y.kind]}`,
      });
    }
  });
export type QuantityDescription = z.infer<typeof quantitySchema>;

/** Names as a physicist reads them, for messages. */
export const Y_LABELS: Record<YKind, string> = {
  dsigma_domega: "dσ/dΩ",
  dsigma_dcos: "dσ/dcosθ",
  dsigma_dt: "dσ/dt",
  sigma: "σ",
};

export const X_LABELS: Record<XKind, string> = {
  theta_lab_deg: "θ (lab)",
  theta_cm_deg: "θ (CM)",
  cos_theta: "cosθ",
  t: "t",
  sqrt_s: "√s",
  beam_energy: "the beam energy",
  beam_kinetic: "the beam kinetic energy",
};

function describeDimension(dimension: UnitDimension): string {
  switch (dimension) {
    case "area":
      return "an area";
    case "area/sr":
      return "an area per steradian";
    case "area/GeV2":
      return "an area per GeV²";
  }
}
