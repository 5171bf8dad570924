import { describe, expect, it } from "vitest";
import { EngineInputError } from "./engine-input-error";
import { ENGINE_VERSION, PROCESSES, runPrediction } from "./index";
import { integrateAdaptive } from "./adaptive-quadrature";
import integrateSimpson from "integrate-adaptive-simpson";

const EXAMPLE_REQUEST = { process: "scalar-annihilation", frame: "lab", energy: { kinetic: 0.5 }, thetaDeg: [30, 60, 90], unit: "ub/sr" };

function errorOf(request: unknown): EngineInputError {
  try {
    runPrediction(request);
  } catch (error) {
    if (error instanceof EngineInputError) return error;
    throw error;
  }
  throw new Error(`expected an EngineInputError for ${JSON.stringify(request)}`);
}

describe("runPrediction: the prediction contract (docs/product.md; request fields in docs/decisions/0003)", () => {
  it("answers the contract's example request with one finite value per angle and the required fields", () => {
    const r = runPrediction(EXAMPLE_REQUEST);
    expect(r.engineVersion).toBe(ENGINE_VERSION);
    expect(r.process).toBe("scalar-annihilation");
    expect(r.frame).toBe("lab");
    expect(r.unit).toBe("ub/sr");
    expect(r.values).toHaveLength(3);
    r.values.forEach((v) => expect(Number.isFinite(v) && v > 0).toBe(true));
    expect(r.parametersHash).toMatch(/^[0-9a-f]{64}$/);
    // √s for a φ⁺ of kinetic energy 0.5 GeV on φ⁻ at rest: s = 2m² + 2(T + m)m
    const m = 0.13957039;
    expect(r.sqrtS).toBeCloseTo(Math.sqrt(2 * m * m + 2 * (0.5 + m) * m), 14);
  });

  it("gives byte-identical JSON for the same request, and the same hash for other key orders and number spellings", () => {
    const a = JSON.stringify(runPrediction(EXAMPLE_REQUEST));
    const b = JSON.stringify(runPrediction(structuredClone(EXAMPLE_REQUEST)));
    expect(a).toBe(b);
    const respelled = JSON.parse('{"unit":"ub/sr","thetaDeg":[3e1,60.0,90],"energy":{"kinetic":5e-1},"frame":"lab","process":"scalar-annihilation"}');
    expect(runPrediction(respelled).parametersHash).toBe(runPrediction(EXAMPLE_REQUEST).parametersHash);
    expect(runPrediction({ ...EXAMPLE_REQUEST, thetaDeg: [30, 60, 91] }).parametersHash).not.toBe(runPrediction(EXAMPLE_REQUEST).parametersHash);
  });

  it("converts units consistently: ub/sr = 1000 nb/sr; MeV beside the energy", () => {
    const ub = runPrediction(EXAMPLE_REQUEST).values;
    const nb = runPrediction({ ...EXAMPLE_REQUEST, unit: "nb/sr" }).values;
    nb.forEach((v, i) => expect(v / (1000 * ub[i]) - 1).toBeCloseTo(0, 12));
    const mev = runPrediction({ ...EXAMPLE_REQUEST, energy: { kinetic: 500, unit: "MeV" } }).values;
    mev.forEach((v, i) => expect(v / ub[i] - 1).toBeCloseTo(0, 12));
  });

  it("relates the observables: dσ/dcosθ = 2π dσ/dΩ; dσ/dt at the same point; σ = ½∫ for identical photons", () => {
    const base = { process: "pair-annihilation", frame: "cm", energy: { sqrtS: 0.01 } };
    const dOmega = runPrediction({ ...base, cosTheta: [0.3], unit: "nb/sr" }).values[0];
    const dcos = runPrediction({ ...base, observable: "dsigma/dcos", cosTheta: [0.3], unit: "nb" }).values[0];
    expect(dcos / (2 * Math.PI * dOmega) - 1).toBeCloseTo(0, 12);
    const s = 1e-4;
    const m = 0.00051099895;
    const p = Math.sqrt(s / 4 - m * m);
    const q = Math.sqrt(s) / 2;
    // t = (p_e⁺ − k)² = m² − 2(E ω − p ω cosθ) with E = ω = √s/2 in the CM frame
    const tExact = m * m - 2 * (q * q - p * q * 0.3);
    const dt = runPrediction({ ...base, observable: "dsigma/dt", t: [tExact], unit: "nb/GeV^2" }).values[0];
    expect(dt / (dcos / (2 * p * q)) - 1).toBeCloseTo(0, 9);
    const total = runPrediction({ ...base, observable: "sigma", unit: "nb" }).values[0];
    const half = 0.5 * integrateSimpson((c) => runPrediction({ ...base, observable: "dsigma/dcos", cosTheta: [c], unit: "nb" }).values[0], -1, 1, 1e-6 * dcos, 30);
    expect(total / half - 1).toBeCloseTo(0, 8);
  });

  // bin means of angle bins (σ(bin)/ΔX, docs/decisions/0006-bin-means.md): bin-means.test.ts

  it("runs energy scans (points and bins) of σ and of dσ/dΩ at a fixed angle", () => {
    const scan = runPrediction({ process: "muon-pair", frame: "cm", observable: "sigma", scan: { sqrtS: [1, 2, 4] }, unit: "nb" });
    expect(scan.sqrtS).toEqual([1, 2, 4]);
    const v = scan.values;
    expect(v[0] / v[1]).toBeGreaterThan(3.5); // ≈ 1/s
    const point = runPrediction({ process: "muon-pair", frame: "cm", observable: "sigma", energy: { sqrtS: 2 }, unit: "nb" }).values[0];
    expect(v[1]).toBe(point);
    const bins = runPrediction({ process: "muon-pair", frame: "cm", observable: "sigma", scan: { sqrtSBins: [[1, 2]] }, unit: "nb" });
    const ref = integrateAdaptive((x) => runPrediction({ process: "muon-pair", frame: "cm", observable: "sigma", energy: { sqrtS: x }, unit: "nb" }).values[0], 1, 2).value;
    expect(bins.values[0] / ref - 1).toBeCloseTo(0, 8);
    const diff = runPrediction({ process: "bhabha", frame: "cm", scan: { beam: [1, 2], unit: "GeV" }, thetaDeg: [90], unit: "nb/sr" });
    expect(diff.values).toHaveLength(2);
  });

  it("applies a VMD form factor |m²/(m² − s − imΓ)|² to e⁺e⁻ → π⁺π⁻ and shows its parameters", () => {
    const base = { process: "scalar-pair-production", frame: "cm", energy: { sqrtS: 0.6 }, thetaDeg: [90], unit: "nb/sr" };
    const point = runPrediction(base).values[0];
    const ff = { model: "vmd", mass: 0.775, width: 0.149 };
    const r = runPrediction({ ...base, formFactor: ff });
    const s = 0.36;
    const m2 = 0.775 ** 2;
    const f2 = (m2 * m2) / ((m2 - s) ** 2 + m2 * 0.149 ** 2);
    expect(r.values[0] / (point * f2) - 1).toBeCloseTo(0, 12);
    expect(r.parameters.formFactor).toEqual({ ...ff, q2: "s" });
  });

  it("lists the ten processes of docs/decisions/0003 with their frames", () => {
    expect(PROCESSES.map((p) => [p.id, p.frames.join("+")])).toEqual([
      ["scalar-annihilation", "lab+cm"],
      ["scalar-compton", "lab+cm"],
      ["photon-fusion-scalar", "cm"],
      ["scalar-pair-production", "cm"],
      ["pair-annihilation", "lab+cm"],
      ["compton", "lab+cm"],
      ["breit-wheeler", "cm"],
      ["muon-pair", "cm"],
      ["bhabha", "cm"],
      ["moller", "cm"],
    ]);
  });
});

describe("runPrediction: bad input gets a typed error naming the field", () => {
  it.each([
    ["unknown process", { ...EXAMPLE_REQUEST, process: "higgs" }, "unknown_process", "process"],
    ["frame not offered", { ...EXAMPLE_REQUEST, process: "bhabha", energy: { sqrtS: 1 } }, "frame_not_offered", "frame"],
    ["energy below threshold", { process: "photon-fusion-scalar", frame: "cm", energy: { sqrtS: 0.2 }, thetaDeg: [30] }, "below_threshold", "energy.sqrtS"],
    ["energy at threshold of an annihilation (σ ∝ 1/v diverges)", { ...EXAMPLE_REQUEST, energy: { beam: 0.13957039 } }, "invalid_energy", "energy.beam"],
    ["zero kinetic energy", { ...EXAMPLE_REQUEST, energy: { kinetic: 0 } }, "invalid_energy", "energy.kinetic"],
    ["negative mass", { ...EXAMPLE_REQUEST, mass: -0.1 }, "invalid_mass", "mass"],
    ["zero mass", { ...EXAMPLE_REQUEST, mass: 0 }, "invalid_mass", "mass"],
    ["zero final mass", { process: "muon-pair", frame: "cm", energy: { sqrtS: 1 }, finalMass: 0, thetaDeg: [10] }, "invalid_mass", "finalMass"],
    ["finalMass where none applies", { ...EXAMPLE_REQUEST, finalMass: 0.1 }, "not_applicable", "finalMass"],
    ["angle above 180°", { ...EXAMPLE_REQUEST, thetaDeg: [30, 60, 181] }, "angle_out_of_range", "thetaDeg[2]"],
    ["negative angle", { ...EXAMPLE_REQUEST, thetaDeg: [-1] }, "angle_out_of_range", "thetaDeg[0]"],
    ["cos θ outside [−1, 1]", { ...EXAMPLE_REQUEST, thetaDeg: undefined, cosTheta: [1.5] }, "angle_out_of_range", "cosTheta[0]"],
    ["Bhabha at 0°", { process: "bhabha", frame: "cm", energy: { sqrtS: 1 }, thetaDeg: [10, 0] }, "divergent_angle", "thetaDeg[1]"],
    ["Møller at 0°", { process: "moller", frame: "cm", energy: { sqrtS: 1 }, thetaDeg: [0] }, "divergent_angle", "thetaDeg[0]"],
    ["Møller at 180°", { process: "moller", frame: "cm", energy: { sqrtS: 1 }, thetaDeg: [90, 180] }, "divergent_angle", "thetaDeg[1]"],
    ["Møller at cos θ = −1", { process: "moller", frame: "cm", energy: { sqrtS: 1 }, cosTheta: [-1] }, "divergent_angle", "cosTheta[0]"],
    ["Bhabha bin touching 0°", { process: "bhabha", frame: "cm", energy: { sqrtS: 1 }, thetaDegBins: [[0, 10]] }, "divergent_angle", "thetaDegBins[0][0]"],
    ["Bhabha total over 4π", { process: "bhabha", frame: "cm", energy: { sqrtS: 1 }, observable: "sigma", unit: "nb" }, "divergent_total", "acceptance"],
    ["NaN angle", { ...EXAMPLE_REQUEST, thetaDeg: [Number.NaN] }, "not_a_number", "thetaDeg[0]"],
    ["NaN energy", { ...EXAMPLE_REQUEST, energy: { kinetic: Number.NaN } }, "not_a_number", "energy.kinetic"],
    ["string angle", { ...EXAMPLE_REQUEST, thetaDeg: ["30"] }, "not_a_number", "thetaDeg[0]"],
    ["unit that does not fit dσ/dΩ", { ...EXAMPLE_REQUEST, unit: "ub" }, "unit_mismatch", "unit"],
    ["unit that does not fit σ", { process: "compton", frame: "lab", energy: { beam: 0.001 }, observable: "sigma", unit: "nb/sr" }, "unit_mismatch", "unit"],
    ["unknown unit", { ...EXAMPLE_REQUEST, unit: "barns" }, "unknown_unit", "unit"],
    ["unknown energy unit", { ...EXAMPLE_REQUEST, energy: { kinetic: 1, unit: "eV" } }, "unknown_unit", "energy.unit"],
    ["two energies", { ...EXAMPLE_REQUEST, energy: { kinetic: 1, sqrtS: 2 } }, "invalid_energy", "energy"],
    ["kinetic energy for γγ", { process: "breit-wheeler", frame: "cm", energy: { kinetic: 1 }, thetaDeg: [10] }, "energy_kind_unavailable", "energy.kinetic"],
    ["t outside its range", { process: "muon-pair", frame: "cm", energy: { sqrtS: 1 }, observable: "dsigma/dt", t: [0.5], unit: "nb/GeV^2" }, "t_out_of_range", "t[0]"],
    ["no angles", { ...EXAMPLE_REQUEST, thetaDeg: undefined }, "missing_field", "thetaDeg"],
    ["misspelt field", { ...EXAMPLE_REQUEST, thetadeg: [1] }, "unknown_field", "thetadeg"],
    ["form factor on a lepton process", { process: "muon-pair", frame: "cm", energy: { sqrtS: 1 }, thetaDeg: [10], formFactor: { model: "vmd", mass: 0.77, width: 0.15 } }, "not_applicable", "formFactor"],
    ["monopole pole reached", { process: "scalar-pair-production", frame: "cm", energy: { sqrtS: 0.7 }, thetaDeg: [10], formFactor: { model: "monopole", lambda: 0.7 } }, "form_factor_pole", "formFactor"],
    ["scan below threshold", { process: "muon-pair", frame: "cm", observable: "sigma", scan: { sqrtS: [1, 0.2] }, unit: "nb" }, "below_threshold", "scan.sqrtS[1]"],
    ["not an object", [1, 2], "invalid_request", ""],
    ["α out of range", { ...EXAMPLE_REQUEST, alpha: 0 }, "invalid_alpha", "alpha"],
    ["a 10³⁰⁰ GeV beam blamed on the energy, not on an angle", { process: "compton", frame: "lab", energy: { kinetic: 1e300 }, thetaDeg: [30, 60] }, "energy_too_high", "energy.kinetic"],
    ["a scan point above the Planck energy", { process: "bhabha", frame: "cm", scan: { sqrtS: [1, 2e19] }, thetaDeg: [90] }, "energy_too_high", "scan.sqrtS[1]"],
  ])("%s", (_label, request, code, field) => {
    const e = errorOf(JSON.parse(JSON.stringify(request, (_k, v) => (typeof v === "number" && Number.isNaN(v) ? "__NaN__" : v)), (_k, v) => (v === "__NaN__" ? Number.NaN : v)));
    expect({ code: e.code, field: e.field }).toEqual({ code, field });
    expect(e.message.length).toBeGreaterThan(10);
  });

  it("says what to change in words a physicist understands", () => {
    expect(errorOf({ process: "photon-fusion-scalar", frame: "cm", energy: { sqrtS: 0.2 }, thetaDeg: [30] }).message).toBe(
      "√s = 0.2 GeV is at or below the φ⁺φ⁻ threshold 0.2791 GeV",
    );
  });
});

describe("runPrediction: edge cases", () => {
  it("is finite at θ = 0 and 180° for every process without a forward/backward divergence, in every frame", () => {
    for (const p of PROCESSES) {
      for (const frame of p.frames) {
        const angles = [0, 180].filter((a) => !(a === 0 && p.divergesForward) && !(a === 180 && p.divergesBackward));
        if (angles.length === 0) continue; // Møller diverges at both ends
        const energy = { sqrtS: 6 * Math.max(p.defaultMass, p.defaultFinalMass ?? 0) };
        const r = runPrediction({ process: p.id, frame, energy, thetaDeg: angles, unit: "GeV^-2/sr" });
        r.values.forEach((v, i) => expect(Number.isFinite(v) && v >= 0, `${p.id} ${frame} θ=${angles[i]}: ${v}`).toBe(true));
      }
    }
  });
  it("Bhabha at 180° is finite (only the t-channel diverges, at 0°)", () => {
    const r = runPrediction({ process: "bhabha", frame: "cm", energy: { sqrtS: 1 }, thetaDeg: [180] });
    expect(Number.isFinite(r.values[0])).toBe(true);
  });
  it("production just above threshold goes to zero like β (dσ/dΩ) and annihilation grows like 1/β", () => {
    const m = 0.13957039;
    const at = (id: string, eps: number) =>
      runPrediction({ process: id, frame: "cm", energy: { sqrtS: 2 * m * (1 + eps) }, thetaDeg: [90] }).values[0];
    // β ≈ √(2ε): the ratio of two ε's a factor 100 apart is 10 (to O(ε))
    expect(at("photon-fusion-scalar", 1e-6) / at("photon-fusion-scalar", 1e-8)).toBeCloseTo(10, 3);
    expect(at("scalar-annihilation", 1e-8) / at("scalar-annihilation", 1e-6)).toBeCloseTo(10, 3);
  });
  it("stays finite near the massless limit (electron mass 1e-9 GeV at √s = 10 GeV, Compton and pair annihilation at 0°)", () => {
    for (const process of ["pair-annihilation", "compton", "breit-wheeler"]) {
      const r = runPrediction({ process, frame: "cm", energy: { sqrtS: 10 }, mass: 1e-9, thetaDeg: [0, 1e-6, 90, 180] });
      r.values.forEach((v) => expect(Number.isFinite(v) && v > 0, `${process}: ${v}`).toBe(true));
    }
  });
});
