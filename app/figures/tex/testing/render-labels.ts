// Renders the labels given as a JSON array on the command line, in that order, in this fresh
// process, and prints the results as JSON: the TeX tests compare them with their own process.
import { renderTex } from "../render-tex";

const labels = JSON.parse(process.argv[2] ?? "[]") as string[];
const fontSizePt = Number(process.argv[3] ?? "10");
const out: Record<string, unknown> = {};
for (const tex of labels) out[tex] = await renderTex(tex, { fontSizePt });
process.stdout.write(JSON.stringify(out));
