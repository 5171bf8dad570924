import { describe, expect, it } from "vitest";
import { EngineInputError } from "./engine-input-error";
import { formFactorSquared, type FormFactorSpec } from "./form-factor";
import { runPrediction } from "./index";
import { PHYSICAL_CONSTANTS } from "./physical-constants";
import { createProcessKernel } from "./process-kernel";
import { PROCESS_DEFINITIONS } from "./process-registry";
import { seededRandom } from "./testing/seeded-random";
import { cosThetaFromT, mandelstamT, reactionThreshold } from "./two-body-kinematics";

// The array path of runPrediction (evaluate-angles.ts: one loop per process over all points)
// against the kernel's one-point functions composed point by point, the way point values were
// computed before the array path existed: the same bits are expected (same operations in the
// same order), for every process, frame, observable, angle variable and form factor.
// The closed forms themselves are checked against the numerical amplitude in
// processes/oracle-agreement.test.ts, through this same array path.

const DEG = Math.PI / 180;
const NATURAL = { "dsigma/dOmega": "GeV^-2/sr", "dsigma/dcos": "GeV^-2", "dsigma/dt": "GeV^-4" } as const;
type Observable = keyof typeof NATURAL;

describe("runPrediction's array path equals the one-point path bit for bit", () => {
  for (const def of PROCESS_DEFINITIONS) {
    const info = def.info;
    for (const frame of info.frames) {
      it(`${info.id}, ${frame} frame, 60 random requests`, () => {
        const rand = seededRandom(7000 + PROCESS_DEFINITIONS.indexOf(def) * 2 + (frame === "lab" ? 1 : 0));
        for (let r = 0; r < 60; r++) {
          const mass = info.defaultMass * (r % 3 === 0 ? 0.5 + rand() : 1);
          const finalMass = info.defaultFinalMass === null ? null : info.defaultFinalMass * (r % 4 === 0 ? 0.5 + rand() : 1);
          const masses = def.reactionMasses(mass, finalMass ?? mass);
          const sqrtS = Math.sqrt(reactionThreshold(masses) * (1 + 10 ** (-3 + 6 * rand())));
          const s = sqrtS * sqrtS; // what the engine makes of the request's √s
          const alpha = r % 5 === 0 ? 1 / 128 : PHYSICAL_CONSTANTS.alpha;
          const spec: FormFactorSpec | null =
            info.acceptsScalarFormFactor && r % 2 === 0
              ? r % 4 === 0
                ? { model: "monopole", lambda: 0.5 + 2 * rand(), q2: rand() < 0.5 ? "s" : "t" }
                : { model: "vmd", mass: 0.775, width: 0.149, q2: rand() < 0.5 ? "s" : "t" }
              : null;
          const kernel = createProcessKernel(def, s, mass, finalMass ?? mass, alpha, spec === null ? null : formFactorSquared(spec));
          const kin = kernel.kinematics;
          const observable = (["dsigma/dOmega", "dsigma/dcos", "dsigma/dt"] as const)[r % 3];
          const variable = (["thetaDeg", "cosTheta", "t"] as const)[Math.floor(r / 3) % 3];
          const tMin = mandelstamT(kin, -1);
          const points = Array.from({ length: 1 + Math.floor(rand() * 40) }, () => {
            const u = 0.001 + 0.998 * rand(); // away from the divergent ends of Bhabha and Møller
            return variable === "thetaDeg" ? 180 * u : variable === "cosTheta" ? 2 * u - 1 : tMin + u * (kin.tForward - tMin);
          });
          const request: Record<string, unknown> = { process: info.id, frame, energy: { sqrtS }, observable, [variable]: points, alpha, unit: NATURAL[observable] };
          if (mass !== info.defaultMass) request.mass = mass;
          if (finalMass !== null && finalMass !== info.defaultFinalMass) request.finalMass = finalMass;
          if (spec !== null) request.formFactor = spec;
          const got = runPrediction(request).values;

          const onePoint = (x: number): number => {
            if ((observable as Observable) === "dsigma/dt") {
              const c = variable === "t" ? cosThetaFromT(kin, x) : kernel.cmCos(frame, variable === "cosTheta" ? x : Math.cos(x * DEG));
              return (2 * Math.PI * kernel.dsigmaDOmegaCm(c)) / (2 * kin.pIn * kin.pOut);
            }
            const factor = observable === "dsigma/dcos" ? 2 * Math.PI : 1;
            const cosFrame = variable === "t" ? kernel.frameCos(frame, cosThetaFromT(kin, x)) : variable === "cosTheta" ? x : Math.cos(x * DEG);
            return factor * kernel.dsigmaDOmega(frame, cosFrame);
          };
          points.forEach((x, i) => {
            const expected = onePoint(x);
            if (!Object.is(got[i], expected)) {
              throw new Error(`${JSON.stringify(request)}: point ${i} (${variable} = ${x}): got ${got[i]}, expected ${expected}, relative difference ${Math.abs(got[i] / expected - 1)}, tolerance 0 (same bits)`);
            }
          });
        }
      });
    }
  }
});

describe("runPrediction's array path: checks and reuse of its work arrays", () => {
  it("names the first point that is out of range or divergent, wherever it sits in a long list", () => {
    const many = Array.from({ length: 5000 }, (_, i) => 1 + (178 * i) / 4999);
    const at = (list: number[]) => {
      try {
        runPrediction({ process: "moller", frame: "cm", energy: { sqrtS: 1 }, thetaDeg: list });
      } catch (error) {
        if (error instanceof EngineInputError) return [error.code, error.field];
        throw error;
      }
      return null;
    };
    expect(at(many.map((x, i) => (i === 4321 ? 180 : x)))).toEqual(["divergent_angle", "thetaDeg[4321]"]);
    expect(at(many.map((x, i) => (i === 17 ? 181 : i === 4000 ? 0 : x)))).toEqual(["angle_out_of_range", "thetaDeg[17]"]);
    expect(at(many.map((x, i) => (i === 2500 ? Number.NaN : x)))).toEqual(["not_a_number", "thetaDeg[2500]"]);
  });

  it("gives the same values for a request whatever ran before it (large, small, other process)", () => {
    const small = { process: "compton", frame: "lab", energy: { beam: 1, unit: "MeV" }, thetaDeg: [10, 20, 30], unit: "ub/sr" };
    const first = runPrediction(small).values;
    runPrediction({ process: "bhabha", frame: "cm", energy: { sqrtS: 1 }, cosTheta: Array.from({ length: 100_000 }, (_, i) => -0.99 + (1.9 * i) / 99_999) });
    expect(runPrediction(small).values).toEqual(first);
    const large = { ...small, thetaDeg: Array.from({ length: 50_000 }, (_, i) => (180 * i) / 49_999) };
    const before = runPrediction(large).values;
    runPrediction(small);
    expect(runPrediction(large).values).toEqual(before);
  });
});
