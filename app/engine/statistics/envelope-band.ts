import { EngineInputError } from "../engine-input-error";

export interface Band {
  lower: number[];
  upper: number[];
}

/**
 * The band of a prediction under parameter variations (e.g. beam-energy spread, mass, α): at each
 * point the minimum and maximum over the central curve and all varied curves (the envelope).
 * All curves are sampled at the same points.
 */
export function envelopeBand(central: readonly number[], variations: readonly (readonly number[])[]): Band {
  const curves = [central, ...variations];
  curves.forEach((c, j) => {
    if (c.length !== central.length) throw new EngineInputError("length_mismatch", `variations[${j - 1}]`, `every varied curve needs ${central.length} values`);
  });
  const lower = central.map((_, i) => Math.min(...curves.map((c) => c[i])));
  const upper = central.map((_, i) => Math.max(...curves.map((c) => c[i])));
  return { lower, upper };
}
