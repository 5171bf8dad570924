import { describe, expect, it } from "vitest";
import { runPrediction } from "../index";
import { PHYSICAL_CONSTANTS } from "../physical-constants";
import type { Frame, ProcessId } from "../process-definition";
import { createProcessKernel } from "../process-kernel";
import { PROCESS_DEFINITIONS } from "../process-registry";
import { cmMomenta, labMomentaMasslessReference } from "../testing/oracle-kinematics";
import { oracleDsigmaDOmegaCm, oracleDsigmaDOmegaLab } from "../testing/oracle-cross-section";
import { oracleMasses } from "../testing/oracle-fixtures";
import { seededRandom } from "../testing/seeded-random";

// Every closed form against the independent numerical amplitude (explicit spinors, polarisation
// vectors and vertices, brute-force spin sums), at full masses, ≥ 200 random points per process
// and frame. Relative tolerance 1e-9.
const TOLERANCE = 1e-9;
const POINTS = 200;
const alpha = PHYSICAL_CONSTANTS.alpha;
const e = Math.sqrt(4 * Math.PI * alpha);

function logUniform(rand: () => number, lo: number, hi: number): number {
  return lo * Math.exp(rand() * Math.log(hi / lo));
}

interface Failure {
  input: Record<string, number | string>;
  got: number;
  expected: number;
  difference: number;
}

function report(failures: Failure[]): string {
  return failures
    .slice(0, 5)
    .map((f) => `input ${JSON.stringify(f.input)} got ${f.got} expected ${f.expected} relative difference ${f.difference} tolerance ${TOLERANCE}`)
    .join("\n");
}

describe("closed forms agree with the numerical tree amplitudes", () => {
  for (const def of PROCESS_DEFINITIONS) {
    const id = def.info.id as ProcessId;
    for (const frame of def.info.frames as readonly Frame[]) {
      it(`${id} in the ${frame} frame at ${POINTS} random points (relative ${TOLERANCE})`, () => {
        const seed = 1000 + PROCESS_DEFINITIONS.indexOf(def) * 10 + (frame === "lab" ? 1 : 0);
        const rand = seededRandom(seed);
        const failures: Failure[] = [];
        let checked = 0;
        for (let i = 0; i < POINTS; i++) {
          // half the points at the PDG masses, half at other masses: the closed forms keep masses exactly
          const scaleMass = i % 2 === 0 ? 1 : logUniform(rand, 0.2, 5);
          const scaleFinal = i % 2 === 0 ? 1 : logUniform(rand, 0.2, 5);
          const mass = def.info.defaultMass * scaleMass;
          const finalMass = (def.info.defaultFinalMass ?? def.info.defaultMass) * scaleFinal;
          const m = oracleMasses(id, mass, finalMass);
          const cos = 2 * rand() - 1;
          const phi = 2 * Math.PI * rand();
          const params = { e, mass, finalMass };
          let got: number;
          let expected: number;
          let input: Record<string, number | string>;
          if (frame === "cm") {
            const threshold = Math.max(m.a + m.b, m.c + m.d);
            const sqrtS = threshold * (1 + logUniform(rand, 1e-3, 30));
            expected = oracleDsigmaDOmegaCm(id, cmMomenta(sqrtS, m, cos, phi), params);
            got = createProcessKernel(def, sqrtS * sqrtS, mass, finalMass, alpha).dsigmaDOmega("cm", cos);
            input = { id, frame, sqrtS, cos, mass, finalMass, seed, i };
          } else {
            // beam kinetic energy from 1e-3 to 30 times the target mass (photon beams: ω)
            const kinetic = m.b * logUniform(rand, 1e-3, 30);
            const beamEnergy = kinetic + m.a;
            const s = m.a * m.a + m.b * m.b + 2 * beamEnergy * m.b;
            expected = oracleDsigmaDOmegaLab(id, labMomentaMasslessReference(beamEnergy, m, cos, phi), params);
            got = createProcessKernel(def, s, mass, finalMass, alpha).dsigmaDOmega("lab", cos);
            input = { id, frame, kinetic, cosLab: cos, mass, finalMass, seed, i };
          }
          const difference = Math.abs(got - expected) / Math.abs(expected);
          checked++;
          if (!(difference <= TOLERANCE)) failures.push({ input, got, expected, difference });
        }
        expect(checked).toBe(POINTS);
        expect(failures, report(failures)).toEqual([]);
      });

      it(`${id} in the ${frame} frame: ${POINTS} random angles in one runPrediction request (the array path; relative ${TOLERANCE})`, () => {
        const rand = seededRandom(5000 + PROCESS_DEFINITIONS.indexOf(def) * 10 + (frame === "lab" ? 1 : 0));
        const mass = def.info.defaultMass;
        const finalMass = def.info.defaultFinalMass ?? mass;
        const m = oracleMasses(id, mass, finalMass);
        const cosines = Array.from({ length: POINTS }, () => -0.999 + 1.998 * rand());
        const params = { e, mass, finalMass };
        let expected: number[];
        let energy: Record<string, number>;
        if (frame === "cm") {
          const sqrtS = 3 * Math.max(m.a + m.b, m.c + m.d);
          energy = { sqrtS };
          expected = cosines.map((cos) => oracleDsigmaDOmegaCm(id, cmMomenta(sqrtS, m, cos, 0.7), params));
        } else {
          const kinetic = 2 * m.b;
          energy = { kinetic };
          expected = cosines.map((cos) => oracleDsigmaDOmegaLab(id, labMomentaMasslessReference(kinetic + m.a, m, cos, 0.7), params));
        }
        const got = runPrediction({ process: id, frame, energy, cosTheta: cosines, unit: "GeV^-2/sr" }).values;
        const failures: Failure[] = [];
        got.forEach((value, i) => {
          const difference = Math.abs(value - expected[i]) / Math.abs(expected[i]);
          if (!(difference <= TOLERANCE)) failures.push({ input: { id, frame, ...energy, cos: cosines[i] }, got: value, expected: expected[i], difference });
        });
        expect(got).toHaveLength(POINTS);
        expect(failures, report(failures)).toEqual([]);
      });
    }
  }
});
