import { EngineInputError, quoteValue } from "./engine-input-error";
import { PHYSICAL_CONSTANTS } from "./physical-constants";

export type UnitDimension = "area" | "area/sr" | "area/GeV2";

/** A parsed cross-section unit: value_in_unit × toNatural = value in GeV⁻² (per sr / per GeV²). */
export interface ParsedUnit {
  text: string;
  dimension: UnitDimension;
  toNatural: number;
}

// 1 GeV⁻² = (ħc)² mb, so 1 mb = 1/(ħc)² GeV⁻²; 1 b = 100 fm² = 1e-24 cm².
const MB = 1 / PHYSICAL_CONSTANTS.hbarC2GeV2mb;
const AREAS: Record<string, number> = {
  "GeV^-2": 1,
  b: 1e3 * MB,
  mb: MB,
  ub: 1e-3 * MB,
  "µb": 1e-3 * MB, // U+00B5 micro sign
  "μb": 1e-3 * MB, // U+03BC Greek mu
  nb: 1e-6 * MB,
  pb: 1e-9 * MB,
  fb: 1e-12 * MB,
  "fm^2": 10 * MB,
  "cm^2": 1e27 * MB,
};

// Spellings of the same thing: superscripts, without caret, 1/GeV^2.
function normaliseSpelling(text: string): string {
  return text
    .replace(/\s+/g, "")
    .replace(/⁻²/g, "^-2")
    .replace(/²/g, "^2")
    .replace(/^1\/GeV\^?2/, "GeV^-2")
    .replace(/GeV-2/g, "GeV^-2")
    .replace(/(fm|cm)2(?![0-9])/g, "$1^2")
    .replace(/GeV2(?![0-9])/g, "GeV^2");
}

const ALLOWED =
  "an area (GeV^-2, cm^2, fm^2, b, mb, ub, µb, nb, pb, fb), optionally per sr (e.g. ub/sr) or per GeV^2 (e.g. nb/GeV^2, or GeV^-4)";

/**
 * Parses a cross-section unit: an area (GeV⁻², cm², fm², b, mb, µb/μb/ub, nb, pb, fb), an
 * area per steradian ("nb/sr") or an area per GeV² ("nb/GeV^2", and "GeV^-4" for GeV⁻²/GeV²).
 * Conversion: $1\,\mathrm{GeV}^{-2} = (\hbar c)^2 = 0.3893793721$ mb (CODATA 2018); 1 b = 100 fm²
 * = 10⁻²⁴ cm². Unit strings are case-sensitive (mb is not Mb). Throws EngineInputError
 * (code "unknown_unit", field "unit") for anything else.
 */
export function parseUnit(text: string): ParsedUnit {
  if (typeof text !== "string" || text.trim() === "") {
    throw new EngineInputError("unknown_unit", "unit", `a unit is required: ${ALLOWED}`);
  }
  const spelled = normaliseSpelling(text);
  if (spelled === "GeV^-4") return { text, dimension: "area/GeV2", toNatural: 1 };
  const slash = spelled.indexOf("/");
  const area = slash < 0 ? spelled : spelled.slice(0, slash);
  const per = slash < 0 ? "" : spelled.slice(slash + 1);
  const toNatural = AREAS[area];
  if (toNatural === undefined || (per !== "" && per !== "sr" && per !== "GeV^2")) {
    throw new EngineInputError("unknown_unit", "unit", `unit ${quoteValue(text)} is not known: use ${ALLOWED}`);
  }
  const dimension: UnitDimension = per === "sr" ? "area/sr" : per === "GeV^2" ? "area/GeV2" : "area";
  return { text, dimension, toNatural };
}
