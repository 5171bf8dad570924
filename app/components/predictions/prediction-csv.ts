import type { PredictionResponse } from "~/engine";

const OBSERVABLE_COLUMN: Record<PredictionResponse["observable"], string> = {
  "dsigma/dOmega": "dsigma_dOmega",
  "dsigma/dcos": "dsigma_dcos_theta",
  "dsigma/dt": "dsigma_dt",
  sigma: "sigma",
};

function variableColumn(variable: NonNullable<PredictionResponse["variable"]>, energyUnit: string): string {
  switch (variable) {
    case "thetaDeg": return "theta_deg";
    case "cosTheta": return "cos_theta";
    case "t": return "t_GeV2";
    case "sqrtS": return `sqrt_s_${energyUnit}`;
    case "beam": return `beam_energy_${energyUnit}`;
    case "kinetic": return `beam_kinetic_energy_${energyUnit}`;
  }
}

// Column names stay plain ASCII identifiers so that every CSV reader takes them.
const unitSuffix = (unit: string) => unit.replace(/\//g, "_per_").replace(/\^/g, "");

/**
 * The table behind the curve as CSV. `#` lines say what produced it: engine version,
 * parameters hash and the request exactly as sent, so that `npm run predict` on that request
 * reproduces every number (numbers are written in the shortest round-trip form, as in the JSON).
 */
export function predictionCsv(r: PredictionResponse, request: unknown): string {
  const scanUnit = r.parameters.scan?.unit ?? "GeV";
  const head = [
    "# Steradian prediction: tree level (Born), no radiative corrections, resolution or acceptance effects",
    `# engine_version: ${r.engineVersion}`,
    `# parameters_sha256: ${r.parametersHash}`,
    `# request: ${JSON.stringify(request)}`,
    `# process: ${r.process}; frame: ${r.frame}; observable: ${r.observable}; unit: ${r.unit}`,
  ];
  if (!Array.isArray(r.sqrtS)) head.push(`# sqrt_s_GeV: ${r.sqrtS}`);
  const valueColumn = `${OBSERVABLE_COLUMN[r.observable]}_${unitSuffix(r.unit)}`;
  const sqrtS = Array.isArray(r.sqrtS) ? r.sqrtS : null;
  const columns: string[] = [];
  if (r.variable !== null) {
    const x = variableColumn(r.variable, scanUnit);
    columns.push(...(r.binned ? [`${x}_low`, `${x}_high`] : [x]));
  }
  if (sqrtS) columns.push("sqrt_s_GeV");
  columns.push(valueColumn);
  const rows = r.values.map((v, i) => {
    const cells: (number | string)[] = [];
    if (r.variable !== null) cells.push(...(r.binned ? r.bins![i] : [r.points![i]]));
    if (sqrtS) cells.push(sqrtS[i]);
    cells.push(v);
    return cells.join(",");
  });
  return [...head, columns.join(","), ...rows].join("\n") + "\n";
}
