// The engine's public boundary: everything outside app/engine imports from here.
export { ENGINE_VERSION } from "./engine-version";
export { EngineInputError } from "./engine-input-error";
export { PHYSICAL_CONSTANTS } from "./physical-constants";
export { PROCESSES } from "./process-registry";
export type { Frame, ProcessId, ProcessInfo } from "./process-definition";
export { runPrediction, type PredictionResponse } from "./run-prediction";
export type { PredictionParameters } from "./prediction-request";
export { parseUnit, type ParsedUnit, type UnitDimension } from "./units";
export { canonicalJson } from "./canonical-json";
export { parametersHash } from "./parameters-hash";
export { integrateAdaptive, type QuadratureOptions, type QuadratureResult } from "./adaptive-quadrature";
export type { AngleVariable, Observable } from "./observables";
export { compareToData, compareWithNormalisation, type Comparison, type NormalisedComparison } from "./statistics/compare-to-data";
export { chiSquarePValue } from "./statistics/chi-square-p-value";
export { envelopeBand, type Band } from "./statistics/envelope-band";
export { uncertaintyTowards, type MeasuredPoint, type Uncertainty } from "./statistics/measured-point";
