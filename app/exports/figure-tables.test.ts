import { createHash } from "node:crypto";
import { parse } from "csv-parse/sync";
import { beforeAll, describe, expect, it } from "vitest";
import { canonicalJson } from "~/engine";
import { computeFigureData, type FigureData } from "~/figures/compute-figure-data";
import { datasetInputKey } from "~/figures/figure-inputs";
import { figureModelSchema, type FigureModel } from "~/figures/figure-model";
import { REFERENCE_DATASET_IDS, referenceInputs, referenceModel, referenceModelInput } from "~/figures/testing/reference-figure";
import { plottedDataCsv, predictionTableCsv } from "./data-tables";
import { figureCsvFiles, type FigureCsvFile } from "./figure-tables";

const inputs = referenceInputs();
let model: FigureModel;
let data: FigureData;
let files: FigureCsvFile[];
beforeAll(() => {
  model = referenceModel();
  data = computeFigureData(model, inputs);
  files = figureCsvFiles(model, data);
});

type NumberLists = { points: number[] | null; bins: [number, number][] | null } | null;
type HashedParameters = { angle: NumberLists; scan: NumberLists; [key: string]: unknown };

/**
 * parametersHash as docs/decisions/0007 defines it: SHA-256 of the canonical JSON (0003) of the
 * parameters with each number list replaced by {"float64leSha256": SHA-256 of its numbers as
 * IEEE 754 binary64 little-endian, −0 as +0, bins flattened low, high, …}.
 */
function parametersHashPerDecision0007(p: HashedParameters): string {
  const sha = (bytes: Buffer | string) => createHash("sha256").update(bytes).digest("hex");
  const digest = (list: number[] | [number, number][] | null) => {
    if (list === null) return null;
    const flat = (list as (number | [number, number])[]).flatMap((v) => (typeof v === "number" ? [v] : v));
    const bytes = Buffer.alloc(8 * flat.length);
    flat.forEach((v, i) => bytes.writeDoubleLE(v + 0, 8 * i));
    return { float64leSha256: sha(bytes) };
  };
  const lists = (l: NumberLists) => (l === null ? null : { ...l, points: digest(l.points), bins: digest(l.bins) });
  return sha(Buffer.from(canonicalJson({ ...p, angle: lists(p.angle), scan: lists(p.scan) }), "utf8"));
}

/** Header comments as key → parsed JSON value, and the table read by csv-parse (an independent reader). */
function read(text: string) {
  const comments = new Map<string, unknown>();
  for (const line of text.split("\r\n")) {
    const m = /^# ([a-z0-9_ ]+): (.*)$/.exec(line);
    if (m) comments.set(m[1], JSON.parse(m[2]));
  }
  const [header, ...rows] = parse(text, { comment: "#", comment_no_infix: true }) as string[][];
  return { comments, header, rows };
}

describe("figureCsvFiles on the reference figure", () => {
  it("writes one table per dataset revision and one per prediction, named after the revision and the layer", () => {
    expect(files.map((f) => f.name)).toEqual(["data-synthetic-a-r1.csv", "data-synthetic-b-r1.csv", "prediction-qed.csv", "prediction-qed-alpha.csv", "prediction-qed-450.csv"]);
    for (const f of files) expect(f.description.length).toBeGreaterThan(10);
  });

  it("gives each plotted point with its bin, stat error and total error (stat and syst in quadrature) in the figure's unit", () => {
    const { comments, header, rows } = read(files[0].text);
    expect(header).toEqual(["x [deg]", "x_low [deg]", "x_high [deg]", "y [ub/sr]", "stat_down [ub/sr]", "stat_up [ub/sr]", "total_down [ub/sr]", "total_up [ub/sr]"]);
    const input = inputs[datasetInputKey(REFERENCE_DATASET_IDS[0], 1)];
    expect(comments.get("dataset")).toBe("synthetic A");
    expect(comments.get("dataset id")).toBe(REFERENCE_DATASET_IDS[0]);
    expect(comments.get("revision")).toBe(1);
    expect(comments.get("content sha256")).toBe(input.contentHash);
    expect(comments.get("x")).toBe("theta (lab)");
    expect(rows).toHaveLength(500);
    // Rows are stored in natural units (GeV^-2/sr); the figure draws ub/sr. The factor is
    // (hbar c)^2 = 0.3893793721 GeV^2 mb (CODATA 2018, as quoted by the PDG), i.e. 389.3793721 ub
    // per GeV^-2. x is θ lab in degrees in both. The total error is √(stat² + syst²) by definition.
    const UB_PER_INVERSE_GEV2 = 389.3793721;
    const close = (got: number, want: number) => Math.abs(got - want) <= 1e-9 * Math.abs(want);
    input.rows.forEach((r, i) => {
      const got = rows[i].map(Number);
      expect(got.slice(0, 3)).toEqual([r.x, r.xLow, r.xHigh]);
      const want = [r.y, r.statMinus!, r.statPlus!, Math.hypot(r.statMinus!, r.systMinus!), Math.hypot(r.statPlus!, r.systPlus!)].map((v) => v * UB_PER_INVERSE_GEV2);
      want.forEach((w, k) => expect(close(got[3 + k], w), `row ${i} column ${header[3 + k]}: got ${got[3 + k]}, expected ${w}, tolerance 1e-9 relative`).toBe(true));
    });
    // And the file holds the plotted numbers exactly, to the last bit.
    expect(rows.map((r) => r.map((c) => (c === "" ? null : Number(c))))).toEqual(
      data.panels[0].datasets[0].points.map((p) => [p.x, p.bin![0], p.bin![1], p.y, p.stat[0], p.stat[1], p.total[0], p.total[1]]),
    );
  });

  it("gives each prediction's curve with the engine version, its parameters and their SHA-256, which match", () => {
    const series = data.panels[0].predictions[1];
    const { comments, header, rows } = read(files[3].text);
    expect(header).toEqual(["x [deg]", "y [ub/sr]"]);
    expect(comments.get("prediction")).toBe("qed-alpha");
    expect(comments.get("label")).toBe("\\alpha = 1/130");
    expect(comments.get("engine version")).toBe(series.engineVersion);
    const parameters = comments.get("parameters") as HashedParameters & { alpha: number; unit: string };
    expect(parameters.alpha).toBe(1 / 130);
    expect(parameters.unit).toBe("ub/sr");
    // The hash recomputed from the parameters as read back from the file, by the layout of
    // docs/decisions/0007 written out here with node:crypto and Buffer.writeDoubleLE (the engine
    // uses its own code for both).
    const hash = parametersHashPerDecision0007(parameters);
    expect(comments.get("parameters sha256")).toBe(hash);
    expect(hash).toBe(series.parametersHash);
    expect(rows.map((r) => r.map(Number))).toEqual(series.curve.map((p) => [p.x, p.y]));
  });
});

describe("figureCsvFiles on two panels", () => {
  it("writes a revision plotted in both panels once, and each panel's predictions apart", () => {
    const input = referenceModelInput();
    const second = {
      ...input.panels[0],
      id: "second",
      layers: input.panels[0].layers.map((l) => (l.kind === "dataset" ? { ...l, id: `${l.id}-2`, compareWith: "qed-2" } : { ...l, id: `${l.id}-2` })),
    };
    const twoPanels = figureModelSchema.parse({ ...input, panels: [input.panels[0], second] });
    const names = figureCsvFiles(twoPanels, computeFigureData(twoPanels, inputs)).map((f) => f.name);
    expect(names.filter((n) => n.startsWith("data-"))).toEqual(["data-synthetic-a-r1.csv", "data-synthetic-b-r1.csv"]);
    expect(names.filter((n) => n.startsWith("prediction-"))).toHaveLength(6);
    expect(new Set(names).size).toBe(names.length);
  });
});

describe("the table writers", () => {
  it("leave the x bin empty for a point measurement and write a band's edges beside the curve", () => {
    const axis = { x: { name: "theta (CM)", unit: "deg" }, y: { name: "dsigma/dOmega (CM)", unit: "nb/sr" } };
    const plotted = plottedDataCsv({
      datasetName: "=cmd", datasetId: "d", revisionNumber: 2, revisionId: "r", contentHash: "f".repeat(64), ...axis,
      rows: [{ x: 90, bin: null, y: 1.5, stat: [0.1, 0.2], total: [0.3, 0.4] }],
    });
    expect(read(plotted).rows).toEqual([["90", "", "", "1.5", "0.1", "0.2", "0.3", "0.4"]]);
    expect(read(plotted).comments.get("dataset")).toBe("=cmd");
    expect(plotted).toContain('# dataset: "\\u003dcmd"');

    const table = { layerId: "p", label: "p", engineVersion: "0.1.0", parameters: { a: 1 }, parametersHash: "0".repeat(64), ...axis, curve: [{ x: 1, y: 2 }, { x: 3, y: 4 }] };
    const banded = read(predictionTableCsv({ ...table, band: [{ low: 1.5, high: 2.5 }, { low: 3.5, high: 4.5 }] }));
    expect(banded.header).toEqual(["x [deg]", "y [nb/sr]", "y_low [nb/sr]", "y_high [nb/sr]"]);
    expect(banded.rows).toEqual([["1", "2", "1.5", "2.5"], ["3", "4", "3.5", "4.5"]]);
    expect(() => predictionTableCsv({ ...table, band: [{ low: 1, high: 2 }] })).toThrow(/1 band points for 2 curve points/);
  });
});
