import type { Observable } from "~/engine";

const AREAS = ["GeV^-2", "cm^2", "fm^2", "mb", "ub", "nb", "pb", "fb"] as const;
type Area = (typeof AREAS)[number];

function withArea(area: Area, observable: Observable): string {
  if (observable === "dsigma/dOmega") return `${area}/sr`;
  if (observable === "dsigma/dt") return area === "GeV^-2" ? "GeV^-4" : `${area}/GeV^2`;
  return area;
}

function areaOf(unit: string): Area {
  if (unit === "GeV^-4") return "GeV^-2";
  const head = unit.split("/")[0];
  return (AREAS as readonly string[]).includes(head) ? (head as Area) : "nb";
}

/** The units (as the API spells them) that fit an observable's dimension, and only those. */
export function unitChoices(observable: Observable): string[] {
  return AREAS.map((a) => withArea(a, observable));
}

/** The same area prefix in the new observable's dimension: µb/sr becomes µb for σ. */
export function carryUnit(unit: string, observable: Observable): string {
  return withArea(areaOf(unit), observable);
}

/** The unit as a reader writes it: µb/sr, GeV⁻², nb/GeV². */
export function unitLabel(unit: string): string {
  return unit.replace(/^ub/, "µb").replace("^-2", "⁻²").replace("^-4", "⁻⁴").replace(/\^2/g, "²");
}
