/**
 * A measured value with its uncertainties, in the prediction's unit. An error is symmetric (a
 * number) or asymmetric ({ minus, plus }, both ≥ 0: the downward and upward uncertainty).
 */
export type Uncertainty = number | { readonly minus: number; readonly plus: number };

export interface MeasuredPoint {
  readonly value: number;
  readonly stat: Uncertainty;
  readonly syst?: Uncertainty;
}

/**
 * The total uncertainty of a point towards `prediction`: for asymmetric errors the side on
 * which the prediction lies (upper error if prediction > value), then statistical and
 * systematic added in quadrature, $\sigma = \sqrt{\sigma_{stat}^2 + \sigma_{syst}^2}$.
 * (Convention: docs/decisions/0003; common practice, e.g. the PDG's treatment of asymmetric
 * errors is more elaborate and is not used here.)
 */
export function uncertaintyTowards(point: MeasuredPoint, prediction: number): number {
  const side = (u: Uncertainty | undefined): number => {
    if (u === undefined) return 0;
    if (typeof u === "number") return u;
    return prediction > point.value ? u.plus : u.minus;
  };
  const stat = side(point.stat);
  const syst = side(point.syst);
  return Math.sqrt(stat * stat + syst * syst);
}
