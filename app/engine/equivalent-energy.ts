import { findProcess } from "./process-registry";
import type { EnergyKind } from "./mandelstam-s-from-energy";
import { reactionThreshold } from "./two-body-kinematics";

export interface EnergyOfProcess {
  process: string;
  kind: EnergyKind;
  /** GeV */
  valueGeV: number;
  /** GeV; the process's defaults when null. */
  mass: number | null;
  finalMass: number | null;
}

/**
 * The energy of kind `to.kind` for process `to.process` that has the same Mandelstam s as
 * `from`, or null when there is none (a kind the process cannot take, an unphysical input, or
 * an s at or below the new reaction's threshold). Fixed-target kinematics as in
 * mandelstam-s-from-energy.ts: $s = m_a^2 + m_b^2 + 2E_b m_b$, inverted as
 * $E_b = (s - m_a^2 - m_b^2)/(2 m_b)$ and $T = E_b - m_a$ (a the beam, b the target at rest;
 * Review of Particle Physics, "Kinematics"). Units GeV.
 */
export function equivalentEnergy(from: EnergyOfProcess, to: { process: string; kind: EnergyKind; mass: number | null; finalMass: number | null }): number | null {
  const s = mandelstamS(from);
  if (s === null) return null;
  const def = findProcess(to.process);
  if (!def) return null;
  const mass = to.mass ?? def.info.defaultMass;
  const masses = def.reactionMasses(mass, to.finalMass ?? def.info.defaultFinalMass ?? mass);
  if (!(s > reactionThreshold(masses))) return null;
  if (to.kind === "sqrtS") return Math.sqrt(s);
  if (def.info.needsSqrtS || !(masses.partner > 0)) return null;
  const beam = (s - masses.axis ** 2 - masses.partner ** 2) / (2 * masses.partner);
  const value = to.kind === "beam" ? beam : beam - masses.axis;
  return value > 0 && Number.isFinite(value) ? value : null;
}

/** Mandelstam s of an energy of a process, GeV², or null when the input is not physical. */
function mandelstamS(e: EnergyOfProcess): number | null {
  const def = findProcess(e.process);
  if (!def || !(e.valueGeV > 0) || !Number.isFinite(e.valueGeV)) return null;
  const mass = e.mass ?? def.info.defaultMass;
  const masses = def.reactionMasses(mass, e.finalMass ?? def.info.defaultFinalMass ?? mass);
  if (e.kind === "sqrtS") return e.valueGeV ** 2;
  if (def.info.needsSqrtS) return null;
  const beam = e.kind === "beam" ? e.valueGeV : e.valueGeV + masses.axis;
  if (!(beam > masses.axis)) return null;
  return masses.axis ** 2 + masses.partner ** 2 + 2 * beam * masses.partner;
}
