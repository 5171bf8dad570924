import { describe, expect, it } from "vitest";
import { equivalentEnergy } from "./equivalent-energy";

// m_e from CODATA 2018 (0.51099895000 MeV), as the engine's default.
const ME = 0.51099895e-3;
const close = (got: number | null, expected: number, rel = 1e-12) => {
  if (got === null) throw new Error(`got null, expected ${expected}`);
  const diff = Math.abs(got - expected) / Math.abs(expected);
  if (diff > rel) throw new Error(`got ${got}, expected ${expected}, relative difference ${diff} > ${rel}`);
};

describe("equivalentEnergy", () => {
  it("gives the √s of a photon of energy k on an electron at rest: s = m² + 2km (fixed-target kinematics, Review of Particle Physics)", () => {
    const got = equivalentEnergy({ process: "compton", kind: "kinetic", valueGeV: 0.5, mass: null, finalMass: null }, { process: "bhabha", kind: "sqrtS", mass: null, finalMass: null });
    close(got, Math.sqrt(ME * ME + 2 * 0.5 * ME));
  });

  it("gives a positron's kinetic energy T on an electron at rest from s = 2m(T + 2m) and back", () => {
    const T = 0.5;
    const sqrtS = Math.sqrt(2 * ME * (T + 2 * ME));
    close(equivalentEnergy({ process: "pair-annihilation", kind: "kinetic", valueGeV: T, mass: null, finalMass: null }, { process: "bhabha", kind: "sqrtS", mass: null, finalMass: null }), sqrtS);
    close(equivalentEnergy({ process: "bhabha", kind: "sqrtS", valueGeV: sqrtS, mass: null, finalMass: null }, { process: "pair-annihilation", kind: "kinetic", mass: null, finalMass: null }), T, 1e-9);
    close(equivalentEnergy({ process: "bhabha", kind: "sqrtS", valueGeV: sqrtS, mass: null, finalMass: null }, { process: "pair-annihilation", kind: "beam", mass: null, finalMass: null }), T + ME, 1e-9);
  });

  it("has none below the new reaction's threshold or for a kind the process cannot take", () => {
    // √s = 0.1 GeV is below the μ⁺μ⁻ threshold 2 × 0.10566 GeV (PDG muon mass).
    expect(equivalentEnergy({ process: "bhabha", kind: "sqrtS", valueGeV: 0.1, mass: null, finalMass: null }, { process: "muon-pair", kind: "sqrtS", mass: null, finalMass: null })).toBeNull();
    expect(equivalentEnergy({ process: "bhabha", kind: "sqrtS", valueGeV: 1, mass: null, finalMass: null }, { process: "breit-wheeler", kind: "kinetic", mass: null, finalMass: null })).toBeNull();
    expect(equivalentEnergy({ process: "bhabha", kind: "sqrtS", valueGeV: Number.NaN, mass: null, finalMass: null }, { process: "moller", kind: "sqrtS", mass: null, finalMass: null })).toBeNull();
  });
});
