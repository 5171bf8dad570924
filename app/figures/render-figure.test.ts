import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { renderFigure } from "./render-figure";
import { FIXTURE_METADATA, fixtureInputs, fixtureModel } from "./testing/fixture-figure";

describe("renderFigure", () => {
  it("draws the small fixture figure exactly as reviewed (app/figures/fixtures/small-figure.svg)", async () => {
    const out = await renderFigure(fixtureModel(), fixtureInputs(), FIXTURE_METADATA);
    expect(out.problems).toEqual([]);
    expect(out.texErrors).toEqual([]);
    const fixture = readFileSync(new URL("./fixtures/small-figure.svg", import.meta.url), "utf8");
    // On a change of the renderer: `npm run fixtures:figures`, look at the picture, commit.
    expect(out.svg === fixture, "the rendered SVG differs from the reviewed fixture").toBe(true);
  });

  it("is self-contained: no text elements, scripts, external references or fonts", async () => {
    const { svg } = await renderFigure(fixtureModel(), fixtureInputs(), FIXTURE_METADATA);
    expect(svg).not.toMatch(/<text|<script|<image|<foreignObject|href="http|@font-face|@import/);
    expect(svg).toMatch(/^<svg xmlns="http:\/\/www.w3.org\/2000\/svg" version="1.1" width="[\d.]+pt" height="[\d.]+pt"/);
  });

  it("gives the same bytes in any order of rendering (vega's id counter is renamed away)", async () => {
    const a = (await renderFigure(fixtureModel(), fixtureInputs(), FIXTURE_METADATA)).svg;
    const { referenceInputs, referenceModel } = await import("./testing/reference-figure");
    await renderFigure(referenceModel(), referenceInputs(), FIXTURE_METADATA);
    const b = (await renderFigure(fixtureModel(), fixtureInputs(), FIXTURE_METADATA)).svg;
    expect(b === a).toBe(true);
  });
});
