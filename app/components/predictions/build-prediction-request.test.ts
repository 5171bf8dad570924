import { describe, expect, it } from "vitest";
import { EngineInputError, PROCESSES, runPrediction } from "~/engine";
import { buildPredictionRequest, RANGE_FIELDS } from "./build-prediction-request";
import { inputForError } from "./input-for-error";
import { initialFormState, withObservable, withProcess, withVariable, type CurveVariable } from "./prediction-form-state";
import { unitChoices } from "./unit-choices";

const start = initialFormState(PROCESSES[0]);

describe("the page's requests are ones the engine accepts", () => {
  // Every process, every observable and every variable the page offers for it, from the
  // page's own starting values: none of them may greet the user with an error.
  for (const info of PROCESSES) {
    for (const observable of ["dsigma/dOmega", "dsigma/dcos", "dsigma/dt", "sigma"] as const) {
      const variables: CurveVariable[] = observable === "sigma" ? ["none", "energy"] : ["thetaDeg", "cosTheta", "energy"];
      for (const variable of variables) {
        it(`${info.id}, ${observable} against ${variable}`, () => {
          let f = withVariable(withObservable(withProcess(start, info, PROCESSES[0]).state, observable), variable);
          if (info.divergesForward || info.divergesBackward) f = { ...f, acceptance: true };
          const built = buildPredictionRequest(f, info);
          expect(built.problem).toBeNull();
          const r = runPrediction(built.body);
          expect(r.process).toBe(info.id);
          expect(r.values.every(Number.isFinite)).toBe(true);
        });
      }
    }
  }

  it("offers only units that fit each observable", () => {
    const info = PROCESSES.find((p) => p.id === "muon-pair")!;
    for (const observable of ["dsigma/dOmega", "dsigma/dcos", "dsigma/dt", "sigma"] as const) {
      const f = withObservable(withProcess(start, info, PROCESSES[0]).state, observable);
      const variable = observable === "sigma" ? "none" : "thetaDeg";
      for (const unit of unitChoices(observable)) {
        const built = buildPredictionRequest({ ...withVariable(f, variable), energyKind: "sqrtS", energy: "1", unit }, info);
        expect(() => runPrediction(built.body), `${observable} in ${unit}`).not.toThrow();
      }
    }
  });

  it("builds bins that tile the range and points that end exactly at both ends", () => {
    const info = PROCESSES[0];
    const points = buildPredictionRequest({ ...start, from: "5", to: "175", count: "7" }, info).body!;
    expect(points.thetaDeg).toEqual([5, 33.3333333333, 61.6666666667, 90, 118.333333333, 146.666666667, 175]);
    const bins = buildPredictionRequest({ ...start, from: "0", to: "90", count: "3", binned: true }, info).body!;
    expect(bins.thetaDegBins).toEqual([[0, 30], [30, 60], [60, 90]]);
  });

  it("leaves a number it cannot read to the engine, which names the field", () => {
    const info = PROCESSES[0];
    const built = buildPredictionRequest({ ...start, energy: "half a GeV" }, info);
    expect(() => runPrediction(built.body)).toThrow(EngineInputError);
    try {
      runPrediction(built.body);
    } catch (e) {
      expect((e as EngineInputError).field).toBe("energy.kinetic");
      expect(inputForError((e as EngineInputError).field, start)).toBe("energy");
    }
  });

  it("reports its own range inputs before sending anything", () => {
    const info = PROCESSES[0];
    expect(buildPredictionRequest({ ...start, count: "0" }, info).problem?.field).toBe(RANGE_FIELDS.count);
    expect(buildPredictionRequest({ ...start, to: "" }, info).problem?.field).toBe(RANGE_FIELDS.to);
    expect(buildPredictionRequest({ ...start, from: "90", to: "10", binned: true }, info).problem?.field).toBe(RANGE_FIELDS.to);
  });
});

describe("an error's field finds its input", () => {
  const f = { ...start, count: "69" };
  it.each([
    ["energy.kinetic", "energy"],
    ["energy", "energy"],
    ["mass", "mass"],
    ["unit", "unit"],
    ["frame", "frame"],
    ["thetaDeg[0]", RANGE_FIELDS.from],
    ["thetaDeg[68]", RANGE_FIELDS.to],
    ["thetaDeg[30]", "range"],
    ["thetaDegBins[0][0]", RANGE_FIELDS.from],
    ["thetaDegBins[68][1]", RANGE_FIELDS.to],
    ["thetaDegBins[68][0]", "range"],
    ["acceptance.thetaDeg", "acceptance"],
    ["formFactor.lambda", "formFactor.lambda"],
    ["relativeTolerance", "general"],
    ["", "general"],
  ])("%s → %s", (field, slot) => {
    expect(inputForError(field, f)).toBe(slot);
  });

  it("puts the fixed angle's error on it during an energy scan", () => {
    const scan = { ...withVariable(start, "energy"), count: "40" };
    expect(inputForError("thetaDeg[0]", scan)).toBe("fixedAngle");
    expect(inputForError("scan.kinetic[0]", scan)).toBe(RANGE_FIELDS.from);
    expect(inputForError("scan.kineticBins[39][1]", scan)).toBe(RANGE_FIELDS.to);
  });
});
