import type { FigureModel, FigureObservable, XVariable } from "./figure-model";

/**
 * TeX for the words a figure writes by default: units, axis titles, reactions. Authors may
 * overwrite every label; these are the starting points, written the way papers set them
 * (upright units and d, italic variables).
 */

/** "ub/sr" → "\mu\mathrm{b}/\mathrm{sr}", "GeV^-2/sr" → "\mathrm{GeV}^{-2}/\mathrm{sr}". */
export function unitTex(unit: string): string {
  return unit
    .split("/")
    .map((part) =>
      part
        .split(/[.*\s]+/)
        .filter((factor) => factor !== "")
        .map((factor) => {
          const m = /^([A-Za-z]+)(?:\^(-?\d+))?$/.exec(factor);
          if (!m) return `\\mathrm{${factor.replace(/[\\{}]/g, "")}}`;
          const [, name, power] = m;
          const micro = name.startsWith("u") && name.length > 1 ? `\\mu\\mathrm{${name.slice(1)}}` : `\\mathrm{${name}}`;
          return power === undefined ? micro : `${micro}^{${power}}`;
        })
        .join("\\,"),
    )
    .join("/");
}

const OBSERVABLE_TEX: Record<FigureObservable, string> = {
  "dsigma/dOmega": "\\mathrm{d}\\sigma/\\mathrm{d}\\Omega",
  "dsigma/dcos": "\\mathrm{d}\\sigma/\\mathrm{d}\\cos\\theta",
  "dsigma/dt": "\\mathrm{d}\\sigma/\\mathrm{d}t",
  sigma: "\\sigma",
};

export function yLabelTex(observable: FigureObservable, unit: string, frame: "lab" | "cm"): string {
  const frameMark = observable === "dsigma/dOmega" || observable === "dsigma/dcos" ? `_{\\mathrm{${frame === "lab" ? "lab" : "CM"}}}` : "";
  const base = observable === "sigma" ? OBSERVABLE_TEX.sigma : `(${OBSERVABLE_TEX[observable]})${frameMark}`;
  return `${base}\\ [${unitTex(unit)}]`;
}

export function xLabelTex(variable: XVariable, frame: "lab" | "cm", energyUnit: string): string {
  const f = `\\mathrm{${frame === "lab" ? "lab" : "CM"}}`;
  switch (variable) {
    case "thetaDeg":
      return `\\theta_{${f}}\\ [\\mathrm{deg}]`;
    case "cosTheta":
      return `\\cos\\theta_{${f}}`;
    case "t":
      return `t\\ [\\mathrm{GeV}^{2}]`;
    case "sqrtS":
      return `\\sqrt{s}\\ [${unitTex(energyUnit)}]`;
    case "beam":
      return `E_{\\mathrm{beam}}\\ [${unitTex(energyUnit)}]`;
    case "kinetic":
      return `T_{\\mathrm{beam}}\\ [${unitTex(energyUnit)}]`;
  }
}

const REACTION_SYMBOLS: Record<string, string> = {
  "⁺": "^{+}",
  "⁻": "^{-}",
  "⁰": "^{0}",
  "→": "\\to ",
  γ: "\\gamma ",
  φ: "\\phi ",
  π: "\\pi ",
  μ: "\\mu ",
  " ": "",
};

/** "e⁺e⁻ → γγ" → "e^{+}e^{-}\to \gamma \gamma ". */
export function reactionTex(reaction: string): string {
  return [...reaction].map((c) => REACTION_SYMBOLS[c] ?? c).join("").trim();
}

/** Characters the figure font has only in math: written as TeX math between the text runs. */
const MATH_IN_TEXT: Record<string, string> = {
  "⁺": "^{+}", "⁻": "^{-}", "⁰": "^{0}", "¹": "^{1}", "²": "^{2}", "³": "^{3}",
  "₀": "_{0}", "₁": "_{1}", "₂": "_{2}",
  "→": "\\to ", "±": "\\pm ", "×": "\\times ", "·": "\\cdot ", "−": "-", "≈": "\\approx ", "≤": "\\le ", "≥": "\\ge ",
  γ: "\\gamma ", φ: "\\phi ", π: "\\pi ", μ: "\\mu ", µ: "\\mu ", θ: "\\theta ", σ: "\\sigma ", Ω: "\\Omega ", α: "\\alpha ", Λ: "\\Lambda ",
  "√": "\\surd ",
};

/**
 * Plain words (a dataset's name) as TeX: runs of text in \text{…} with the TeX specials escaped,
 * and the signs the figure font has only in math (e⁺e⁻ → γγ) written as math between them.
 */
export function plainTextTex(text: string): string {
  const out: string[] = [];
  let run = "";
  const flush = () => {
    if (run !== "") out.push(`\\text{${run}}`);
    run = "";
  };
  for (const c of text) {
    const math = MATH_IN_TEXT[c];
    if (math !== undefined) {
      flush();
      out.push(math);
    } else if (c === "\\" || c === "~" || c === "^") {
      continue;
    } else {
      run += /[{}$&#_%]/.test(c) ? `\\${c}` : c;
    }
  }
  flush();
  return out.join("").trim() || "\\text{}";
}

/** A sentence for the alt-text field: what is plotted against what, over which ranges. */
export function describeFigure(model: FigureModel, ranges: { x: [number, number]; y: [number, number] }): string {
  const yWords = { "dsigma/dOmega": "dσ/dΩ", "dsigma/dcos": "dσ/dcosθ", "dsigma/dt": "dσ/dt", sigma: "σ" }[model.y.observable];
  const frame = model.x.frame === "lab" ? "lab" : "CM";
  const xWords = {
    thetaDeg: `θ (${frame}, degrees)`,
    cosTheta: `cos θ (${frame})`,
    t: "t (GeV²)",
    sqrtS: `√s (${model.x.energyUnit})`,
    beam: `beam energy (${model.x.energyUnit})`,
    kinetic: `beam kinetic energy (${model.x.energyUnit})`,
  }[model.x.variable];
  const g = (v: number) => Number(v.toPrecision(3)).toString();
  const layers = model.panels.flatMap((p) => p.layers);
  const datasets = layers.filter((l) => l.kind === "dataset").length;
  const predictions = layers.filter((l) => l.kind === "prediction").length;
  const strips = model.panels.filter((p) => p.strip !== "none").map((p) => (p.strip === "ratio" ? "data/prediction ratio" : "pull"));
  const parts = [
    `${yWords} in ${model.y.unit} (${model.y.scale} scale, ${g(ranges.y[0])} to ${g(ranges.y[1])}) against ${xWords} from ${g(ranges.x[0])} to ${g(ranges.x[1])}`,
    `${datasets} measured dataset${datasets === 1 ? "" : "s"} with error bars and ${predictions} prediction${predictions === 1 ? "" : "s"}`,
  ];
  if (model.panels.length > 1) parts.push(`in ${model.panels.length} panels`);
  if (strips.length > 0) parts.push(`with a ${[...new Set(strips)].join(" and ")} strip below`);
  return `${parts.join(", ")}.`;
}
