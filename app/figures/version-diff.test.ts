import { describe, expect, it } from "vitest";
import { compareVersions, diffJson, requestParameters } from "./version-diff";
import type { VersionSnapshot } from "./version-snapshot";
import { emptyFigureModel } from "./starter-model";

describe("diffJson", () => {
  it("names changed leaves by path, and layers by their ids", () => {
    const a = { x: { frame: "lab", domain: [0, 180] }, panels: [{ id: "main", layers: [{ id: "p-1", energy: { value: 0.5 } }, { id: "d-1", revisionNumber: 1 }] }] };
    const b = { x: { frame: "cm", domain: [0, 90] }, panels: [{ id: "main", layers: [{ id: "d-1", revisionNumber: 2 }, { id: "p-1", energy: { value: 0.9 } }, { id: "n-1", tex: "x" }] }] };
    expect(diffJson(a, b)).toEqual([
      { path: "panels[main].layers[p-1].energy.value", before: 0.5, after: 0.9 },
      { path: "panels[main].layers[d-1].revisionNumber", before: 1, after: 2 },
      { path: "panels[main].layers[n-1]", after: { id: "n-1", tex: "x" } },
      { path: "panels[main].layers (order)", before: ["p-1", "d-1"], after: ["d-1", "p-1"] },
      { path: "x.domain", before: [0, 180], after: [0, 90] },
      { path: "x.frame", before: "lab", after: "cm" },
    ]);
    expect(diffJson(a, structuredClone(a))).toEqual([]);
  });

  it("leaves the sampled grid out of a request's parameters, but keeps a fixed angle of an energy scan", () => {
    expect(requestParameters({ process: "compton", thetaDeg: [1, 2, 3], energy: { beam: 1 } })).toEqual({ process: "compton", energy: { beam: 1 } });
    expect(requestParameters({ process: "compton", scan: { sqrtS: [1, 2], unit: "GeV" }, thetaDeg: [90] })).toEqual({ process: "compton", scan: { unit: "GeV" }, thetaDeg: [90] });
  });
});

describe("compareVersions", () => {
  const snap = (energy: number, y: number[], contentHash: string, engineVersion = "0.1.0"): VersionSnapshot => ({
    format: 1, figure: { id: "f", title: "T", draftRevision: 1 }, number: 1, model: emptyFigureModel(), engineVersion,
    datasets: [{ datasetId: "d", datasetName: "D", revisionNumber: contentHash === "a" ? 1 : 2, revisionId: contentHash, contentHash, rowCount: 3 }],
    predictions: [{ panelId: "main", layerId: "p", label: "QED", process: "compton", engineVersion, parametersHash: `h${energy}`, request: { process: "compton", energy: { beam: energy }, thetaDeg: [10, 20] }, table: { x: [10, 20], y }, band: null }],
    problems: [],
  });

  it("reports a parameter change with the largest relative change of the curve, and a new revision", () => {
    const c = compareVersions({ snapshot: snap(0.5, [2, 1], "a"), svgSha256: "1" }, { snapshot: snap(0.9, [1, 0.5], "b"), svgSha256: "2" });
    expect(c.predictions).toEqual([expect.objectContaining({ status: "changed", parameters: [{ path: "energy.beam", before: 0.5, after: 0.9 }], parametersHash: { before: "h0.5", after: "h0.9" }, largestRelativeChange: 0.5, gridChanged: false, engineVersion: null })]);
    expect(c.datasets).toEqual([expect.objectContaining({ datasetId: "d", status: "changed" })]);
    expect(c.svgChanged).toBe(true);
    expect(c.model).toEqual([]);
  });

  it("reports an engine version change even when the parameters are the same", () => {
    const c = compareVersions({ snapshot: snap(0.5, [2, 1], "a"), svgSha256: "1" }, { snapshot: snap(0.5, [2, 1.01], "a", "0.2.0"), svgSha256: "1" });
    expect(c.engineVersion).toEqual({ before: "0.1.0", after: "0.2.0" });
    expect(c.predictions[0]).toMatchObject({ status: "changed", parameters: [], engineVersion: { before: "0.1.0", after: "0.2.0" } });
    expect(c.predictions[0].largestRelativeChange).toBeCloseTo(0.01 / 1.01, 12);
    expect(c.datasets[0].status).toBe("unchanged");
  });
});
