import type { ProcessId } from "../process-definition";
import type { OracleMasses } from "./oracle-kinematics";

/**
 * Which masses the oracle puts on legs a b c d for a process, given the request's "mass" and
 * "finalMass" — written out by hand here (not taken from the engine's process table).
 */
export function oracleMasses(id: ProcessId, mass: number, finalMass: number): OracleMasses {
  switch (id) {
    case "scalar-annihilation":
    case "pair-annihilation":
      return { a: mass, b: mass, c: 0, d: 0 };
    case "scalar-compton":
    case "compton":
      return { a: 0, b: mass, c: 0, d: mass };
    case "photon-fusion-scalar":
    case "breit-wheeler":
      return { a: 0, b: 0, c: mass, d: mass };
    case "scalar-pair-production":
    case "muon-pair":
      return { a: mass, b: mass, c: finalMass, d: finalMass };
    case "bhabha":
    case "moller":
      return { a: mass, b: mass, c: mass, d: mass };
  }
}
