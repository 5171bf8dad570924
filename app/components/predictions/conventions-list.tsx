import type { PredictionResponse, ProcessInfo } from "~/engine";
import { unitLabel } from "./unit-choices";

const frameName = (frame: string) => (frame === "cm" ? "CM" : "lab");

function formFactorText(ff: PredictionResponse["parameters"]["formFactor"]): string {
  if (ff === null) return "none: point-like particles";
  const q = ff.q2 === "s" ? "|F(s)|²" : "|F(t)|²";
  return ff.model === "monopole"
    ? `${q}, monopole 1/(1 − q²/Λ²)², Λ = ${ff.lambda} GeV`
    : `${q}, vector-meson pole m_V⁴/((m_V² − q²)² + m_V²Γ_V²), m_V = ${ff.mass} GeV, Γ_V = ${ff.width} GeV`;
}

/**
 * The conventions a reader needs to use the numbers (docs/product.md asks for them beside every
 * prediction): from the process registry, and from the answer itself once there is one, so
 * that what is printed is what was computed.
 */
export function ConventionsList({ info, frame, response }: { info: ProcessInfo; frame: string; response: PredictionResponse | null }) {
  const c = response?.conventions;
  const p = response?.parameters;
  return (
    <dl className="grid grid-cols-[10rem_1fr] gap-x-4 gap-y-1.5 text-sm" aria-label="Conventions">
      <dt className="text-ink-soft">reaction</dt>
      <dd>{c?.reaction ?? info.reaction}, {info.theory}</dd>
      <dt className="text-ink-soft">θ is the angle of</dt>
      <dd>{c?.referenceParticle ?? info.referenceParticle}</dd>
      <dt className="text-ink-soft">measured from</dt>
      <dd>the direction of {c?.axisParticle ?? info.axisParticle}, in the {frameName(frame)} frame</dd>
      {info.needsSqrtS ? null : (
        <>
          <dt className="text-ink-soft">beam energies</dt>
          <dd>the {info.beamParticle} beam on the {info.targetParticle} at rest, whichever frame θ is in</dd>
        </>
      )}
      <dt className="text-ink-soft">identical particles</dt>
      <dd>
        {(c?.identicalFinalParticles ?? info.identicalFinalParticles)
          ? "dσ/dΩ counts one particle in dΩ (no ½); σ is ½∫dΩ over the acceptance, the total over 4π"
          : "the final particles are distinct"}
      </dd>
      {p ? (
        <>
          <dt className="text-ink-soft">masses</dt>
          <dd className="num">
            {p.mass} GeV ({info.massMeaning.replace(" (GeV)", "")})
            {p.finalMass !== null ? `; ${p.finalMass} GeV (${(info.finalMassMeaning ?? "").replace(" (GeV)", "")})` : ""}
          </dd>
          <dt className="text-ink-soft">coupling</dt>
          <dd className="num">α = 1/{Number((1 / p.alpha).toPrecision(12))}</dd>
          {info.acceptsScalarFormFactor ? (
            <>
              <dt className="text-ink-soft">form factor</dt>
              <dd>{formFactorText(p.formFactor)}</dd>
            </>
          ) : null}
          <dt className="text-ink-soft">units</dt>
          <dd>
            values in {unitLabel(response.unit)}; 1 GeV⁻² = (ħc)² = 0.3893793721 mb (CODATA 2018); energies in GeV
          </dd>
        </>
      ) : null}
      <dt className="text-ink-soft">approximation</dt>
      <dd>
        tree level (Born), unpolarised
        {response?.quadrature
          ? `; integrals by adaptive quadrature to a relative ${response.quadrature.relativeTolerance}${response.quadrature.converged ? "" : " — not reached"}`
          : ""}
      </dd>
    </dl>
  );
}
