import { parseUnit, type ParsedUnit, type UnitDimension } from "~/engine/units";
import type { EnergyUnit, QuantityDescription, TUnit } from "./quantity";

/**
 * How a file's numbers become canonical values. A conversion between units that differ by a
 * power of ten is done on the decimal text (its exponent is shifted), never by multiplying
 * doubles: 1500 pb and 1.5 nb are then the same decimal, read into the same double, and give
 * the same revision hash. A multiplication by 1500 × 10⁻¹² and 1.5 × 10⁻⁹ would differ in the
 * last bit about once in five thousand values, and decimal rounding can then fall either way.
 */
export interface QuantityScales {
  /** x_canonical = Number(x_text · 10^xShift) (x canonical: degrees, 1, GeV² or GeV). */
  xShift: number;
  /** 10^xShift, for showing a canonical x in the file's unit. */
  xFactor: number;
  /** The canonical x unit as the normal form writes it. */
  xCanonicalUnit: "deg" | "1" | "GeV^2" | "GeV";
  /** The x unit as the file has it, for messages. */
  xFileUnit: string;
  /**
   * y_canonical = round₁₂(Number(y_text · 10^yShift) · yFactor), and likewise every error:
   * for a unit of the barn family (b, mb, µb, nb, pb, fb, fm², cm²; per sr or per GeV²) the
   * shift takes it to mb and yFactor is the engine's toNatural of mb; for GeV⁻² units the
   * shift is 0 and yFactor their toNatural (1).
   */
  yShift: number;
  yFactor: number;
  yUnit: ParsedUnit;
}

const T_SHIFTS: Record<TUnit, number> = { "GeV^2": 0, "MeV^2": -6 };
const ENERGY_SHIFTS: Record<EnergyUnit, number> = { GeV: 0, MeV: -3, keV: -6 };
const REFERENCE: Record<UnitDimension, string> = { area: "mb", "area/sr": "mb/sr", "area/GeV2": "mb/GeV^2" };

/**
 * Scales of a quantity that `quantitySchema` has accepted. The y unit is parsed by the
 * engine (throws its EngineInputError for a unit it does not know); only its factor is used.
 */
export function resolveQuantityScales(quantity: QuantityDescription): QuantityScales {
  const yUnit = parseUnit(quantity.y.unit);
  const reference = parseUnit(REFERENCE[yUnit.dimension]).toNatural;
  const ratio = yUnit.toNatural / reference;
  const power = Math.round(Math.log10(ratio));
  const decimal = Math.abs(ratio / 10 ** power - 1) < 1e-9;
  const y = decimal ? { yShift: power, yFactor: reference, yUnit } : { yShift: 0, yFactor: yUnit.toNatural, yUnit };

  const x = quantity.x;
  switch (x.kind) {
    case "theta_lab_deg":
    case "theta_cm_deg":
      return { xShift: 0, xFactor: 1, xCanonicalUnit: "deg", xFileUnit: "°", ...y };
    case "cos_theta":
      return { xShift: 0, xFactor: 1, xCanonicalUnit: "1", xFileUnit: "", ...y };
    case "t":
      return { xShift: T_SHIFTS[x.unit], xFactor: 10 ** T_SHIFTS[x.unit], xCanonicalUnit: "GeV^2", xFileUnit: ` ${x.unit}`, ...y };
    case "sqrt_s":
    case "beam_energy":
    case "beam_kinetic":
      return {
        xShift: ENERGY_SHIFTS[x.unit],
        xFactor: 10 ** ENERGY_SHIFTS[x.unit],
        xCanonicalUnit: "GeV",
        xFileUnit: ` ${x.unit}`,
        ...y,
      };
  }
}
