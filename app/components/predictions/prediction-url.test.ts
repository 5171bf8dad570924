import { describe, expect, it } from "vitest";
import { PROCESSES } from "~/engine";
import { initialFormState, withEnergyUnit, withProcess, withVariable } from "./prediction-form-state";
import { formFromSearch, searchOfForm } from "./prediction-url";

const compton = PROCESSES.find((p) => p.id === "compton")!;
const bhabha = PROCESSES.find((p) => p.id === "bhabha")!;

describe("the Predictions form in the address", () => {
  it("reads back exactly the state it wrote, and nothing more than what differs", () => {
    const form = { ...withVariable({ ...initialFormState(compton), energy: "0.002", binned: true, yScale: "linear" as const, yMin: "0" }, "cosTheta"), count: "200" };
    const search = searchOfForm(form, PROCESSES);
    expect(search.get("process")).toBe("compton");
    expect(search.has("frame")).toBe(false);
    expect(formFromSearch(new URLSearchParams(search.toString()), PROCESSES)).toEqual(form);
  });

  it("falls back to the starting state for values that do not fit, and to a frame the process has", () => {
    const form = formFromSearch(new URLSearchParams("process=bhabha&frame=lab&energyKind=kinetic&variable=nonsense&binned=yes"), PROCESSES);
    expect(form).toEqual(initialFormState(bhabha));
  });
});

describe("changes of the form", () => {
  it("converts the energy on a change of unit: 2 GeV is 2000 MeV", () => {
    const f = withEnergyUnit({ ...initialFormState(compton), energy: "2" }, "MeV");
    expect([f.energy, f.energyUnit]).toEqual(["2000", "MeV"]);
  });

  it("keeps the number of points when the variable changes", () => {
    const f = withVariable({ ...initialFormState(compton), count: "2000" }, "cosTheta");
    expect(f.count).toBe("2000");
  });

  it("turns a beam kinetic energy into the same √s when the new process takes √s only, and says so", () => {
    // Photon of 0.5 GeV on an electron at rest: √s = √(m² + 2km) = 0.0226 GeV (m_e from CODATA 2018).
    const { state, note } = withProcess({ ...initialFormState(compton), energy: "0.5" }, bhabha, compton);
    expect(state.energyKind).toBe("sqrtS");
    expect(Number(state.energy)).toBeCloseTo(Math.sqrt(0.51099895e-3 ** 2 + 2 * 0.5 * 0.51099895e-3), 6);
    expect(note).toMatch(/same √s/);
  });
});
