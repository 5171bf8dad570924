// `npm run bench:engine`: closed-form dσ/dΩ evaluations per second for every process (one core),
// the time of a 200-bin bin-averaged curve through runPrediction, and the time against the same
// closed form vectorised in numpy on the same 10⁶ points, alternating in one run. Prints a table,
// then one JSON line of figures (units in the key names) as the very last line.
import { execFileSync, spawn } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { createInterface } from "node:readline";
import { PHYSICAL_CONSTANTS } from "../app/engine/physical-constants";
import { createProcessKernel } from "../app/engine/process-kernel";
import { PROCESS_DEFINITIONS } from "../app/engine/process-registry";
import { runPrediction } from "../app/engine/index";

const N = 1_000_000;
const REPEATS = 15;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const now = () => performance.now();

function ensureNumpy(): void {
  try {
    execFileSync("/usr/bin/python3", ["-c", "import numpy"], { stdio: "ignore" });
  } catch {
    console.log("installing python3-numpy (Debian) for the peer benchmark …");
    execFileSync("apt-get", ["install", "-y", "python3-numpy"], { stdio: "inherit" });
  }
}

// cos θ points: a fixed, reproducible grid avoiding the divergent endpoints of Bhabha/Møller
const cos = new Float64Array(N);
for (let i = 0; i < N; i++) cos[i] = -0.999 + (1.998 * (i + 0.5)) / N;
const out = new Float64Array(N);

const rows: { id: string; sqrtS: number; evalsPerS: number }[] = [];
const figures: Record<string, number> = {};
for (const def of PROCESS_DEFINITIONS) {
  const info = def.info;
  const sqrtS = 6 * Math.max(info.defaultMass, info.defaultFinalMass ?? 0);
  const kernel = createProcessKernel(def, sqrtS * sqrtS, info.defaultMass, info.defaultFinalMass ?? info.defaultMass, PHYSICAL_CONSTANTS.alpha);
  for (let w = 0; w < 5; w++) def.fillCm(kernel.kinematics, kernel.e2, cos, out);
  const times: number[] = [];
  for (let r = 0; r < REPEATS; r++) {
    const t0 = now();
    def.fillCm(kernel.kinematics, kernel.e2, cos, out);
    times.push(now() - t0);
  }
  const evalsPerS = N / (median(times) / 1e3);
  rows.push({ id: info.id, sqrtS, evalsPerS });
  figures[`${info.id.replaceAll("-", "_")}_evals_per_s`] = Math.round(evalsPerS);
}

// 200-bin bin-averaged curve through the public contract
const binRequest = {
  process: "pair-annihilation",
  frame: "lab",
  energy: { kinetic: 0.01 },
  thetaDegBins: Array.from({ length: 200 }, (_, i) => [0.9 * i, 0.9 * (i + 1)]),
  unit: "nb/sr",
};
for (let w = 0; w < 5; w++) runPrediction(binRequest);
const binTimes: number[] = [];
for (let r = 0; r < 30; r++) {
  const t0 = now();
  runPrediction(binRequest);
  binTimes.push(now() - t0);
}
figures.bin_avg_200_ms = Number(median(binTimes).toFixed(3));

// the peer: scalar annihilation, same points, alternating runs
ensureNumpy();
const def = PROCESS_DEFINITIONS.find((d) => d.info.id === "scalar-annihilation")!;
const m = def.info.defaultMass;
const sqrtS = 6 * m;
const kernel = createProcessKernel(def, sqrtS * sqrtS, m, m, PHYSICAL_CONSTANTS.alpha);
const kin = kernel.kinematics;
const dir = mkdtempSync(join(tmpdir(), "bench-engine-"));
const pointsPath = join(dir, "points.f64");
writeFileSync(pointsPath, Buffer.from(cos.buffer));
const pref = kin.pOut / (64 * Math.PI * Math.PI * kin.s * kin.pIn);
const args = [kin.s, m * m, pref, 2 * kin.pIn * kin.pOut, kin.tForward, kin.uBackward, kernel.e2].map((x) => x.toString());
const python = spawn("/usr/bin/python3", [join(import.meta.dirname, "bench-engine.py"), pointsPath, ...args], { stdio: ["pipe", "pipe", "inherit"] });
const lines = createInterface({ input: python.stdout })[Symbol.asyncIterator]();
const ask = async (command: string) => {
  python.stdin.write(`${command}\n`);
  return (await lines.next()).value as string;
};
await lines.next(); // "ready"
await ask("dump");
const numpyValues = new Float64Array(readFileSync(`${pointsPath}.out`).buffer.slice(0));
def.fillCm(kin, kernel.e2, cos, out);
let maxDiff = 0;
for (let i = 0; i < N; i++) maxDiff = Math.max(maxDiff, Math.abs(out[i] - numpyValues[i]) / Math.abs(numpyValues[i]));
const ours: number[] = [];
const theirs: number[] = [];
for (let w = 0; w < 3; w++) await ask("run");
for (let r = 0; r < REPEATS; r++) {
  const t0 = now();
  def.fillCm(kin, kernel.e2, cos, out);
  ours.push(now() - t0);
  theirs.push(Number((await ask("run")).split(" ")[0]));
}
python.stdin.write("quit\n");
rmSync(dir, { recursive: true, force: true });
figures.scalar_annihilation_ts_1e6_ms = Number(median(ours).toFixed(3));
figures.scalar_annihilation_numpy_1e6_ms = Number(median(theirs).toFixed(3));
figures.ratio_vs_numpy = Number((median(ours) / median(theirs)).toFixed(4));
figures.numpy_max_relative_difference = maxDiff;

console.log("closed-form dσ/dΩ (CM), 10⁶ points, one core, median of", REPEATS);
console.log("process                     √s (GeV)     evaluations/s");
for (const r of rows) console.log(`${r.id.padEnd(26)}  ${r.sqrtS.toPrecision(4).padStart(8)}   ${r.evalsPerS.toExponential(3).padStart(12)}`);
console.log("");
console.log(`200-bin bin-averaged curve (pair-annihilation, lab, runPrediction): ${figures.bin_avg_200_ms} ms (median of 30)`);
console.log(
  `scalar-annihilation on 10⁶ points: TypeScript ${figures.scalar_annihilation_ts_1e6_ms} ms, numpy ${figures.scalar_annihilation_numpy_1e6_ms} ms, ` +
    `ratio ${figures.ratio_vs_numpy} (alternating, median of ${REPEATS}); max relative difference of the values ${maxDiff.toExponential(2)}`,
);
console.log(JSON.stringify(figures));
