// Figures through the API: creation from a dataset, the draft's validation (422 with the bad
// field's path), optimistic concurrency (409, and one winner of two simultaneous saves), the
// server-rendered draft SVG, and the audit log.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client } from "../support/http";
import { connect } from "../support/db";
import { testEnv } from "../support/env";
import { TEST_PASSWORD, createAccount, createManuscriptWith } from "../support/accounts";
import { angularCsv, createDatasetViaApi } from "../support/datasets";

const db = connect(testEnv.appDatabaseUrl);
const author = new Client();
const observer = new Client();
let manuscriptId = "";
let datasetId = "";

const put = (c: Client, figureId: string, body: unknown) =>
  c.request(`/api/v1/figures/${figureId}/draft`, { method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });

beforeAll(async () => {
  const a = await createAccount(db, "figures-author");
  const o = await createAccount(db, "figures-observer");
  manuscriptId = await createManuscriptWith(db, [{ id: a.id, role: "contributor" }, { id: o.id, role: "observer" }]);
  await author.signIn(a.email, TEST_PASSWORD);
  await observer.signIn(o.email, TEST_PASSWORD);
  // θ in the CM frame, dσ/dΩ in µb/sr; the metadata names Bhabha scattering with a 1 GeV positron beam on electrons at rest.
  datasetId = await createDatasetViaApi(author, manuscriptId, "figure test data", { metadata: { process: "bhabha", beamEnergyGeV: 1 } });
  const up = await author.upload(`/api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}/revisions`, angularCsv());
  expect(up.status).toBe(201);
});
afterAll(() => db.destroy());

async function newFigure(title: string, from?: unknown) {
  const res = await author.postJson(`/api/v1/manuscripts/${manuscriptId}/figures`, { title, ...(from ? { from } : {}) });
  expect(res.status).toBe(201);
  return (await res.json()) as { figure: { id: string; draftRevision: number }; model: Record<string, unknown> };
}

describe("figures API", () => {
  it("a figure started from a dataset holds its revision and the prediction its metadata names", async () => {
    const { figure, model } = await newFigure("from data", { datasetId });
    expect(figure.draftRevision).toBe(1);
    const m = model as { x: { variable: string; frame: string }; y: { observable: string; unit: string }; panels: { strip: string; layers: Record<string, unknown>[] }[] };
    expect(m.x).toMatchObject({ variable: "thetaDeg", frame: "cm" });
    expect(m.y).toMatchObject({ observable: "dsigma/dOmega", unit: "ub/sr" });
    expect(m.panels[0].strip).toBe("ratio");
    const kinds = m.panels[0].layers.map((l) => [l.kind, l.kind === "dataset" ? l.revisionNumber : l.process]);
    expect(kinds).toEqual([["prediction", "bhabha"], ["dataset", 1]]);
    expect(m.panels[0].layers[0].energy).toEqual({ kind: "beam", value: 1, unit: "GeV" });
    const list = (await (await observer.get(`/api/v1/manuscripts/${manuscriptId}/figures`)).json()) as { figures: { id: string; panels: number }[] };
    expect(list.figures.find((f) => f.id === figure.id)?.panels).toBe(1);
  });

  it("an invalid model is a 422 naming the bad field's path; nothing is saved", async () => {
    const { figure, model } = await newFigure("validation");
    const bad = structuredClone(model) as { fontSizePt: unknown; x: { scale: string } };
    bad.x.scale = "logarithmic";
    const res = await put(author, figure.id, { baseRevision: 1, model: bad });
    expect(res.status).toBe(422);
    const body = (await res.json()) as { error: { code: string; field: string; message: string } };
    expect(body.error.field).toBe("model.x.scale");
    expect(body.error.message).toContain("model.x.scale");
    const again = (await (await author.get(`/api/v1/figures/${figure.id}/draft`)).json()) as { draftRevision: number; model: { x: { scale: string } } };
    expect(again.draftRevision).toBe(1);
    expect(again.model.x.scale).toBe("linear");
  });

  it("a save on a stale draft revision is a 409 and changes nothing", async () => {
    const { figure, model } = await newFigure("stale");
    const first = await put(author, figure.id, { baseRevision: 1, model: { ...model, fontSizePt: 9 } });
    expect(first.status).toBe(200);
    expect(((await first.json()) as { draftRevision: number }).draftRevision).toBe(2);
    const stale = await put(author, figure.id, { baseRevision: 1, model: { ...model, fontSizePt: 7 } });
    expect(stale.status).toBe(409);
    expect(((await stale.json()) as { error: { code: string; currentRevision: number } }).error).toMatchObject({ code: "stale-draft", currentRevision: 2 });
    const now = (await (await author.get(`/api/v1/figures/${figure.id}/draft`)).json()) as { model: { fontSizePt: number } };
    expect(now.model.fontSizePt).toBe(9);
  });

  it("of two saves sent at the same moment on the same revision, exactly one wins", async () => {
    const { figure, model } = await newFigure("race");
    const results = await Promise.all([8.5, 9.5, 10.5, 11].map((size) => put(author, figure.id, { baseRevision: 1, model: { ...model, fontSizePt: size } })));
    const statuses = results.map((r) => r.status).sort();
    expect(statuses).toEqual([200, 409, 409, 409]);
    const row = await db.selectFrom("figure").select("draft_revision").where("id", "=", figure.id).executeTakeFirstOrThrow();
    expect(row.draft_revision).toBe(2);
  });

  it("observers read but cannot save; the draft SVG is self-contained, deterministic and marked unsealed", async () => {
    const { figure, model } = await newFigure("svg", { datasetId });
    expect((await put(observer, figure.id, { baseRevision: 1, model })).status).toBe(403);
    const a = await observer.get(`/api/v1/figures/${figure.id}/draft.svg`);
    expect(a.status).toBe(200);
    expect(a.headers.get("content-type")).toMatch(/^image\/svg\+xml/);
    const svg = await a.text();
    const b = await (await observer.get(`/api/v1/figures/${figure.id}/draft.svg`)).text();
    expect(b).toBe(svg);
    expect(svg).toContain("Unsealed draft, revision 1");
    expect(svg).not.toMatch(/<text|<script|<image|xlink:href="http|href="http|@import|<foreignObject/);
    expect(svg).toMatch(/^<svg [^>]*width="[\d.]+pt" height="[\d.]+pt"/);
    // The data are drawn: one marker path per row of the revision (five) in the layer's shape.
    expect((svg.match(/<path/g) ?? []).length).toBeGreaterThan(20);
  });

  it("creation and every save are in the manuscript's audit log", async () => {
    const { figure, model } = await newFigure("audited");
    expect((await put(author, figure.id, { baseRevision: 1, model: { ...model, lineWidthPt: 0.8 } })).status).toBe(200);
    const rows = await db.selectFrom("audit_event").select(["action", "detail"]).where("manuscript_id", "=", manuscriptId).where("detail", "@>", JSON.stringify({ figureId: figure.id }) as never).orderBy("id").execute();
    expect(rows.map((r) => r.action)).toEqual(["figure-created", "figure-draft-saved"]);
    expect((rows[1].detail as { draftRevision: number }).draftRevision).toBe(2);
  });

  it("a title used twice in a manuscript is refused with the field named", async () => {
    await newFigure("twice");
    const res = await author.postJson(`/api/v1/manuscripts/${manuscriptId}/figures`, { title: "twice" });
    expect(res.status).toBe(422);
    expect(((await res.json()) as { error: { field: string } }).error.field).toBe("title");
  });
});
