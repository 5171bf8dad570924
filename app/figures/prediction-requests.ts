import type { AngleVariable, EnergyKind, Frame } from "~/engine";
import type { FigureObservable, PredictionLayer } from "./figure-model";

/** The x values of a request: points or bins of an angle variable, or of an energy (GeV). */
export type RequestAbscissa =
  | { kind: "angle"; variable: AngleVariable; frame: Frame; points?: number[]; bins?: [number, number][] }
  | { kind: "energy"; variable: EnergyKind; points?: number[]; bins?: [number, number][] };

export interface RequestOptions {
  observable: FigureObservable;
  /** Any unit the engine parses that fits the observable. */
  unit: string;
  /** A band's edge: the varied parameter and its value. */
  vary?: { parameter: NonNullable<PredictionLayer["band"]>["parameter"]; value: number };
}

/**
 * The engine request (the prediction contract, docs/decisions/0003) of a prediction layer at the
 * given abscissa. Parameters left null in the layer are left out, so the engine's defaults (PDG
 * masses, α(0)) apply and appear in the response's parameters.
 */
export function predictionRequest(layer: PredictionLayer, x: RequestAbscissa, options: RequestOptions): Record<string, unknown> {
  const vary = options.vary;
  const energy = vary?.parameter === "energy" ? { ...layer.energy, value: vary.value } : layer.energy;
  const request: Record<string, unknown> = {
    process: layer.process,
    frame: x.kind === "angle" ? x.frame : "cm",
    observable: options.observable,
    unit: options.unit,
  };
  const mass = vary?.parameter === "mass" ? vary.value : layer.mass;
  if (mass !== null) request.mass = mass;
  if (layer.finalMass !== null) request.finalMass = layer.finalMass;
  const alpha = vary?.parameter === "alpha" ? vary.value : layer.alpha;
  if (alpha !== null) request.alpha = alpha;
  if (layer.formFactor !== null) {
    request.formFactor = vary?.parameter === "formFactor.lambda" && layer.formFactor.model === "monopole" ? { ...layer.formFactor, lambda: vary.value } : layer.formFactor;
  }
  if (x.kind === "angle") {
    request.energy = { [energy.kind]: energy.value, unit: energy.unit };
    if (x.points) request[x.variable] = x.points;
    else request[`${x.variable}Bins`] = x.bins;
  } else {
    // An energy scan: the frame of a fixed angle is the CM frame unless the layer's process
    // is compared in the lab (σ needs no frame).
    request.scan = { [x.points ? x.variable : `${x.variable}Bins`]: x.points ?? x.bins, unit: "GeV" };
    if (options.observable === "sigma") {
      if (layer.acceptanceThetaDeg !== null) request.acceptance = { thetaDeg: layer.acceptanceThetaDeg };
    } else {
      request.thetaDeg = [layer.fixedThetaDeg ?? 90];
    }
  }
  return request;
}

/** The band's parameter as the figure's legend and alt text name it. */
export const BAND_PARAMETER_LABELS: Record<NonNullable<PredictionLayer["band"]>["parameter"], string> = {
  "formFactor.lambda": "form-factor scale Λ",
  alpha: "α",
  mass: "mass",
  energy: "beam energy",
};
