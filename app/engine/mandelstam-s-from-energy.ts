import { EngineInputError } from "./engine-input-error";
import type { ProcessInfo } from "./process-definition";
import type { ReactionMasses } from "./two-body-kinematics";

export type EnergyKind = "sqrtS" | "beam" | "kinetic";

/**
 * Mandelstam s from an energy: √s itself, or the beam on the target at rest with total energy
 * $E_b$ or kinetic energy $T = E_b - m_a$:
 * $s = m_a^2 + m_b^2 + 2E_b m_b$ (a the beam, b the target; standard fixed-target kinematics,
 * Review of Particle Physics, "Kinematics"). Units: GeV in, GeV² out.
 * Throws EngineInputError when the kind is meaningless (a photon target cannot be at rest) or
 * the energy is not physical (E_b < m_a, T < 0). Thresholds are checked by the caller.
 */
export function mandelstamSFromEnergy(kind: EnergyKind, valueGeV: number, info: ProcessInfo, masses: ReactionMasses, field: string): number {
  if (kind === "sqrtS") {
    if (!(valueGeV > 0)) throw new EngineInputError("invalid_energy", field, `√s must be positive, got ${valueGeV} GeV`);
    return valueGeV * valueGeV;
  }
  if (info.needsSqrtS) {
    throw new EngineInputError(
      "energy_kind_unavailable",
      field,
      `${info.reaction} has no target at rest (a photon cannot be at rest): give the energy as sqrtS`,
    );
  }
  const ma = masses.axis;
  const mb = masses.partner;
  const beamEnergy = kind === "beam" ? valueGeV : valueGeV + ma;
  if (kind === "kinetic" && !(valueGeV > 0)) {
    throw new EngineInputError("invalid_energy", field, `the beam kinetic energy must be positive, got ${valueGeV} GeV`);
  }
  if (kind === "beam" && !(beamEnergy > ma)) {
    throw new EngineInputError(
      "invalid_energy",
      field,
      `the total beam energy ${valueGeV} GeV must exceed the ${info.beamParticle} mass ${ma} GeV (it includes the rest energy)`,
    );
  }
  return ma * ma + mb * mb + 2 * beamEnergy * mb;
}
