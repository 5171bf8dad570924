import { EngineInputError } from "./engine-input-error";
import type { FormFactorSquared } from "./process-kernel";

/**
 * A multiplicative form factor |F(q²)|² for a composite scalar, q² = s or t (GeV²):
 * monopole $|F|^2 = 1/(1 - q^2/\Lambda^2)^2$;
 * vector-meson-dominance pole $|F|^2 = \left|\frac{m_V^2}{m_V^2 - q^2 - i m_V\Gamma_V}\right|^2
 *   = \frac{m_V^4}{(m_V^2-q^2)^2 + m_V^2\Gamma_V^2}$ (standard phenomenology, e.g. J. J. Sakurai,
 * Currents and Mesons, 1969). Both are 1 at q² = 0. Units: Λ, m_V, Γ_V in GeV.
 */
export type FormFactorSpec =
  | { readonly model: "monopole"; readonly lambda: number; readonly q2: "s" | "t" }
  | { readonly model: "vmd"; readonly mass: number; readonly width: number; readonly q2: "s" | "t" };

export function formFactorSquared(spec: FormFactorSpec): FormFactorSquared {
  if (spec.model === "monopole") {
    const inv = 1 / (spec.lambda * spec.lambda);
    return spec.q2 === "s"
      ? (s) => 1 / ((1 - s * inv) * (1 - s * inv))
      : (_s, t) => 1 / ((1 - t * inv) * (1 - t * inv));
  }
  const m2 = spec.mass * spec.mass;
  const m4 = m2 * m2;
  const mg2 = m2 * spec.width * spec.width;
  return spec.q2 === "s" ? (s) => m4 / ((m2 - s) * (m2 - s) + mg2) : (_s, t) => m4 / ((m2 - t) * (m2 - t) + mg2);
}

/**
 * Rejects a q² range [q2Min, q2Max] that reaches a pole of the form factor (the monopole at
 * q² = Λ², a VMD pole of zero width at q² = m_V²).
 */
export function checkFormFactorRange(spec: FormFactorSpec, q2Min: number, q2Max: number): void {
  const pole = spec.model === "monopole" ? spec.lambda * spec.lambda : spec.width === 0 ? spec.mass * spec.mass : null;
  if (pole !== null && q2Min <= pole && pole <= q2Max) {
    const name = spec.model === "monopole" ? "the monopole pole q² = Λ²" : "the VMD pole q² = m_V² (zero width)";
    throw new EngineInputError(
      "form_factor_pole",
      "formFactor",
      `${spec.q2} reaches ${name} = ${pole} GeV²: choose another scale or use a VMD form factor with a width`,
    );
  }
}
