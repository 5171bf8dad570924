import type { ColumnMapping, ErrorMapping } from "./column-mapping";
import type { XKind } from "./quantity";

export type MappingField = "x" | "bin" | "y" | "stat" | "syst";

export interface MappingGuess {
  /** What could be guessed; the UI pre-fills these and asks for the rest. */
  mapping: Partial<ColumnMapping>;
  /** What x probably is, when the x header says so ("theta_cm", "cos", "sqrt_s", …). */
  xKind: XKind | null;
  guessed: MappingField[];
  notGuessed: MappingField[];
  /** Fields for which several headers fit equally well: nothing was guessed for them. */
  ambiguous: { field: MappingField; headers: string[] }[];
}

type Role =
  | "x"
  | "xLow"
  | "xHigh"
  | "y"
  | "stat"
  | "statMinus"
  | "statPlus"
  | "syst"
  | "systMinus"
  | "systPlus";

/**
 * Reduces a header to lower-case words joined by "_": units in brackets are dropped (but a
 * frame in brackets, "θ (CM)", is kept), a trailing "+" or "-" becomes "plus" or "minus", and
 * a greek θ is spelled out.
 */
function normalise(header: string): string {
  return header
    .toLowerCase()
    .replace(/[([]\s*(c\.?\s*m\.?|cms|lab)\s*[)\]]/g, (_, frame: string) => ` ${frame.replace(/[.\s]/g, "")} `)
    .replace(/\([^)]*\)|\[[^\]]*\]/g, " ")
    .replace(/θ/g, "theta")
    .replace(/σ/g, "sigma")
    .replace(/\+\s*$/, " plus")
    .replace(/-\s*$/, " minus")
    .replace(/[^a-z0-9]+/g, "_")
    .replace(/^_+|_+$/g, "");
}

const ERROR_SIDE = "(?:_?(minus|plus|lo|low|hi|high|down|up|neg|pos|m|p))?";
const STAT = new RegExp(`^(?:d_?|err_?|error_?|unc_?|sigma_?)?stat(?:istical)?(?:_?(?:err|error|unc|uncertainty))?${ERROR_SIDE}$`);
const SYST = new RegExp(`^(?:d_?|err_?|error_?|unc_?|sigma_?)?sys(?:t|tematic)?(?:_?(?:err|error|unc|uncertainty))?${ERROR_SIDE}$`);
const BIN_LOW = /^(?:x|theta|theta_cm|theta_lab|cos|cos_?theta|costh|t|sqrt_?s|e|e_?beam|bin)?_?(?:lo|low|min|lower|from)$/;
const BIN_HIGH = /^(?:x|theta|theta_cm|theta_lab|cos|cos_?theta|costh|t|sqrt_?s|e|e_?beam|bin)?_?(?:hi|high|max|upper|to)$/;
// dσ/dΩ and friends as people abbreviate them in headers, with or without a unit after:
// dsig_domega, d_sigma, ds_dcos, dsdo_ub_sr, dsdt, dxs, xsec_nb, sigma_nb.
const Y = /^(?:y|dsig\w*|d_sigma\w*|ds_?d\w*|dxs\w*|xsec\w*|xs(?:_(?:mb|ub|nb|pb|fb)\w*)?|cross_?section\w*|sigma(?:_(?:mb|ub|nb|pb|fb)\w*)?|sig)$/;

const X_KIND_OF: [RegExp, XKind | null][] = [
  [/^(?:theta|th|angle)_?(?:c_?m|cms|star)(?:_?deg)?$/, "theta_cm_deg"],
  [/^(?:theta|th|angle)_?lab(?:_?deg)?$/, "theta_lab_deg"],
  [/^(?:cos|cos_?theta|costh|cos_?th|cos_?theta_?(?:cm|lab|star))$/, "cos_theta"],
  [/^(?:t|mandelstam_t)$/, "t"],
  [/^(?:sqrt_?s|ecm|e_cm|w)$/, "sqrt_s"],
  [/^(?:e_?beam|beam_?energy|e)$/, "beam_energy"],
  [/^(?:t_?kin|e_?kin|kinetic_?energy|beam_?kinetic|t_?beam)$/, "beam_kinetic"],
  [/^(?:x|theta|th|angle)(?:_?deg)?$/, null],
];

function roleOf(name: string): { role: Role; xKind?: XKind | null } | null {
  const side = (m: RegExpExecArray): "minus" | "plus" | null => {
    const s = m[1];
    if (s === undefined) return null;
    return ["minus", "lo", "low", "down", "neg", "m"].includes(s) ? "minus" : "plus";
  };
  let m = STAT.exec(name);
  if (m) return { role: side(m) === null ? "stat" : side(m) === "minus" ? "statMinus" : "statPlus" };
  m = SYST.exec(name);
  if (m) return { role: side(m) === null ? "syst" : side(m) === "minus" ? "systMinus" : "systPlus" };
  if (BIN_LOW.test(name)) return { role: "xLow" };
  if (BIN_HIGH.test(name)) return { role: "xHigh" };
  if (Y.test(name)) return { role: "y" };
  for (const [pattern, kind] of X_KIND_OF) if (pattern.test(name)) return { role: "x", xKind: kind };
  return null;
}

/**
 * Guesses the column mapping from header names, only where one header clearly fits a field:
 * two candidates for the same field guess nothing for it, and a bin or an asymmetric error
 * is only guessed when both of its columns are found.
 */
export function guessMapping(headers: readonly string[]): MappingGuess {
  const byRole = new Map<Role, string[]>();
  let xKind: XKind | null = null;
  for (const header of headers) {
    const trimmed = header.trim();
    if (trimmed === "") continue;
    const found = roleOf(normalise(trimmed));
    if (found === null) continue;
    byRole.set(found.role, [...(byRole.get(found.role) ?? []), trimmed]);
    if (found.role === "x") xKind = found.xKind ?? null;
  }

  const mapping: Partial<ColumnMapping> = {};
  const guessed: MappingField[] = [];
  const ambiguous: { field: MappingField; headers: string[] }[] = [];
  const single = (role: Role): string | null | undefined => {
    const list = byRole.get(role);
    if (list === undefined) return undefined;
    return list.length === 1 ? list[0] : null;
  };
  const candidates = (...roles: Role[]) => roles.flatMap((r) => byRole.get(r) ?? []);

  const x = single("x");
  if (typeof x === "string") {
    mapping.x = x;
    guessed.push("x");
  } else if (x === null) {
    ambiguous.push({ field: "x", headers: candidates("x") });
  }
  if (x === null || x === undefined) xKind = null;

  const lo = single("xLow");
  const hi = single("xHigh");
  if (typeof lo === "string" && typeof hi === "string") {
    mapping.xLow = lo;
    mapping.xHigh = hi;
    guessed.push("bin");
  } else if (lo === null || hi === null) {
    ambiguous.push({ field: "bin", headers: candidates("xLow", "xHigh") });
  }

  const y = single("y");
  if (typeof y === "string") {
    mapping.y = y;
    guessed.push("y");
  } else if (y === null) {
    ambiguous.push({ field: "y", headers: candidates("y") });
  }

  for (const key of ["stat", "syst"] as const) {
    const sym = single(key);
    const minus = single(`${key}Minus`);
    const plus = single(`${key}Plus`);
    const hasSym = sym !== undefined;
    const hasAsym = minus !== undefined || plus !== undefined;
    let guess: ErrorMapping | null = null;
    if (hasSym && !hasAsym && typeof sym === "string") {
      guess = { kind: "symmetric", column: sym };
    } else if (!hasSym && typeof minus === "string" && typeof plus === "string") {
      guess = { kind: "asymmetric", minus, plus };
    } else if ((hasSym && hasAsym) || sym === null || minus === null || plus === null) {
      ambiguous.push({ field: key, headers: candidates(key, `${key}Minus`, `${key}Plus`) });
    }
    if (guess !== null) {
      mapping[key] = guess;
      guessed.push(key);
    }
  }

  const all: MappingField[] = ["x", "bin", "y", "stat", "syst"];
  return { mapping, xKind, guessed, notGuessed: all.filter((f) => !guessed.includes(f)), ambiguous };
}
