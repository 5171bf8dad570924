// `npm run fixtures:figures`: rewrites the rendered SVG fixture of the small figure. Look at it
// (e.g. open it in a browser) before committing: the fixture test then holds the renderer to it.
import { writeFileSync } from "node:fs";
import { renderFigure } from "../app/figures/render-figure";
import { FIXTURE_METADATA, fixtureInputs, fixtureModel } from "../app/figures/testing/fixture-figure";

const out = await renderFigure(fixtureModel(), fixtureInputs(), FIXTURE_METADATA);
if (out.problems.length > 0 || out.texErrors.length > 0) throw new Error(`the fixture figure has problems: ${JSON.stringify([out.problems, out.texErrors])}`);
writeFileSync("app/figures/fixtures/small-figure.svg", out.svg);
console.log(`app/figures/fixtures/small-figure.svg: ${out.svg.length} bytes`);
