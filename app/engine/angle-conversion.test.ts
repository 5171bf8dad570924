import { describe, expect, it } from "vitest";
import { angleConverter } from "./angle-conversion";
import { runPrediction } from "./run-prediction";
import { labMomentaMasslessReference } from "./testing/oracle-kinematics";
import type { Vec4 } from "./testing/dirac-algebra";

const ME = 0.00051099895; // electron mass, GeV (CODATA 2018)
const minkowski = (p: Vec4, q: Vec4) => p[0] * q[0] - p[1] * q[1] - p[2] * q[2] - p[3] * q[3];
const diff = (p: Vec4, q: Vec4): Vec4 => [p[0] - q[0], p[1] - q[1], p[2] - q[2], p[3] - q[3]];

function close(got: number, expected: number, rel: number, what: string) {
  const d = Math.abs(got - expected) / Math.max(Math.abs(expected), 1e-300);
  if (!(d <= rel)) throw new Error(`${what}: got ${got}, expected ${expected}, relative difference ${d} > ${rel}`);
}

describe("angleConverter against explicit four-momenta (oracle kinematics built directly in the lab frame)", () => {
  // Compton scattering of a 1 MeV photon on an electron at rest.
  const beam = 0.001;
  const conv = angleConverter({ process: "compton", energy: { kind: "beam", valueGeV: beam }, mass: null, finalMass: null });
  const masses = { a: 0, b: ME, c: 0, d: ME };

  it("maps a lab angle to t = (k − k′)² computed from the four-vectors", () => {
    for (const theta of [1, 20, 60, 90, 135, 179]) {
      const p = labMomentaMasslessReference(beam, masses, Math.cos((theta * Math.PI) / 180), 0.3);
      const t = minkowski(diff(p.a, p.c), diff(p.a, p.c));
      close(conv.convert({ variable: "thetaDeg", frame: "lab" }, { variable: "t", frame: "lab" }, theta), t, 1e-9, `t at θ_lab = ${theta}°`);
    }
  });

  it("maps a lab angle to the CM angle given by t and the CM energies (an independent route: invariants, not the aberration formula)", () => {
    const s = ME * ME + 2 * beam * ME;
    const k = (s - ME * ME) / (2 * Math.sqrt(s)); // photon CM energy, before and after (elastic)
    for (const theta of [5, 30, 90, 150]) {
      const p = labMomentaMasslessReference(beam, masses, Math.cos((theta * Math.PI) / 180), 0);
      const t = minkowski(diff(p.a, p.c), diff(p.a, p.c));
      const cosCm = 1 + t / (2 * k * k); // t = −2k²(1 − cos θ*) for a massless elastic pair
      close(conv.cmCos({ variable: "thetaDeg", frame: "lab" }, theta), cosCm, 1e-9, `cos θ* at θ_lab = ${theta}°`);
      close(conv.convert({ variable: "cosTheta", frame: "cm" }, { variable: "thetaDeg", frame: "lab" }, cosCm), theta, 1e-9, `θ_lab back from cos θ*`);
    }
  });

  it("transforms a point dσ/dΩ from the lab to the CM frame as the engine's own CM prediction has it", () => {
    const base = { process: "compton", energy: { beam, unit: "GeV" }, unit: "ub/sr" };
    for (const theta of [10, 45, 100, 170]) {
      const lab = runPrediction({ ...base, frame: "lab", thetaDeg: [theta] }).values[0];
      const cosCm = conv.cmCos({ variable: "thetaDeg", frame: "lab" }, theta);
      const cm = runPrediction({ ...base, frame: "cm", cosTheta: [cosCm] }).values[0];
      const from = { observable: "dsigma/dOmega" as const, frame: "lab" as const };
      const to = { observable: "dsigma/dOmega" as const, frame: "cm" as const };
      close((lab * conv.measureDerivative(from, cosCm)) / conv.measureDerivative(to, cosCm), cm, 1e-12, `dσ/dΩ* at θ_lab = ${theta}°`);
    }
  });

  it("relates dσ/dt and dσ/dΩ* by 2π/(2p p′) (standard kinematics) through the measure derivatives", () => {
    const conv2 = angleConverter({ process: "bhabha", energy: { kind: "sqrtS", valueGeV: 1 }, mass: null, finalMass: null });
    const dt = conv2.measureDerivative({ observable: "dsigma/dt", frame: "cm" }, 0.2);
    const dOmega = conv2.measureDerivative({ observable: "dsigma/dOmega", frame: "cm" }, 0.2);
    const p = Math.sqrt(0.25 - ME * ME); // CM momentum at √s = 1 GeV
    close(dOmega / dt, (2 * Math.PI) / (2 * p * p), 1e-12, "dΩ*/dt");
  });

  it("refuses a lab frame for a process without a target at rest", () => {
    const c = angleConverter({ process: "breit-wheeler", energy: { kind: "sqrtS", valueGeV: 1 }, mass: null, finalMass: null });
    expect(() => c.cmCos({ variable: "thetaDeg", frame: "lab" }, 30)).toThrow(/no lab frame/);
  });
});
