import { parseUnit, type ParsedUnit } from "~/engine/units";
import type { EnergyUnit, QuantityDescription, TUnit } from "./quantity";

/** Factors from the units a file is written in to the canonical units of the normal form. */
export interface QuantityScales {
  /** x_canonical = x_file · xFactor (x canonical: degrees, 1, GeV² or GeV). */
  xFactor: number;
  /** The canonical x unit as the normal form writes it. */
  xCanonicalUnit: "deg" | "1" | "GeV^2" | "GeV";
  /** The x unit as the file has it, for messages. */
  xFileUnit: string;
  /** y_canonical = y_file · yFactor, likewise for the errors (the engine's natural units). */
  yFactor: number;
  yUnit: ParsedUnit;
}

const T_FACTORS: Record<TUnit, number> = { "GeV^2": 1, "MeV^2": 1e-6 };
const ENERGY_FACTORS: Record<EnergyUnit, number> = { GeV: 1, MeV: 1e-3, keV: 1e-6 };

/**
 * Scales of a quantity that `quantitySchema` has accepted. The y unit is parsed by the
 * engine (throws its EngineInputError for a unit it does not know).
 */
export function resolveQuantityScales(quantity: QuantityDescription): QuantityScales {
  const yUnit = parseUnit(quantity.y.unit);
  const x = quantity.x;
  switch (x.kind) {
    case "theta_lab_deg":
    case "theta_cm_deg":
      return { xFactor: 1, xCanonicalUnit: "deg", xFileUnit: "°", yFactor: yUnit.toNatural, yUnit };
    case "cos_theta":
      return { xFactor: 1, xCanonicalUnit: "1", xFileUnit: "", yFactor: yUnit.toNatural, yUnit };
    case "t":
      return { xFactor: T_FACTORS[x.unit], xCanonicalUnit: "GeV^2", xFileUnit: ` ${x.unit}`, yFactor: yUnit.toNatural, yUnit };
    case "sqrt_s":
    case "beam_energy":
    case "beam_kinetic":
      return { xFactor: ENERGY_FACTORS[x.unit], xCanonicalUnit: "GeV", xFileUnit: ` ${x.unit}`, yFactor: yUnit.toNatural, yUnit };
  }
}
