// `npm run bench:engine`: runPrediction — the function behind the API, the command line and the
// Predictions page — timed end to end on 10³ and 10⁶ angles (θ in degrees, dσ/dΩ in µb/sr) for
// every process and frame, with its stages (validation, evaluation, parameters hash), against the
// same work in numpy on the same points (scripts/bench-engine.py), alternating in one run; then
// a 200-bin bin-averaged curve and bin/predict's wall time for a three-angle request. Prints a
// table, then one JSON line of figures (units in the key names) as the very last line.
import { execFileSync, spawn, spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { loadavg, tmpdir } from "node:os";
import { join } from "node:path";
import { createInterface } from "node:readline";
import { evaluateAngles } from "../app/engine/evaluate-angles";
import { parseUnit, runPrediction } from "../app/engine/index";
import { parametersHash } from "../app/engine/parameters-hash";
import { validatePredictionRequest } from "../app/engine/prediction-request";
import { createProcessKernel } from "../app/engine/process-kernel";
import { PROCESS_DEFINITIONS } from "../app/engine/process-registry";

const ROOT = join(import.meta.dirname, "..");
const SMALL = 1000;
const LARGE = 1_000_000;
const REPEATS = 7;
const SMALL_BATCH = 200;
const UNIT = "ub/sr";
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

// θ from 0.5° to 179.5° (away from the divergent ends of Bhabha and Møller), passed through JSON
// as a request arriving at the API or the command line would be
const grid = (n: number): number[] => JSON.parse(JSON.stringify(Array.from({ length: n }, (_, i) => 0.5 + (179 * (i + 0.5)) / n)));
const points: Record<number, number[]> = { [SMALL]: grid(SMALL), [LARGE]: grid(LARGE) };
// the machine's load when the run starts and ends: figures taken under other work are slower
const loadAtStart = loadavg()[0];

ensureNumpy();
const dir = mkdtempSync(join(tmpdir(), "bench-engine-"));
const file = (n: number) => join(dir, `theta-${n}.f64`);
for (const n of [SMALL, LARGE]) writeFileSync(file(n), Buffer.from(new Float64Array(points[n]).buffer));
const python = spawn("/usr/bin/python3", [join(import.meta.dirname, "bench-engine.py"), file(SMALL), file(LARGE)], { stdio: ["pipe", "pipe", "inherit"] });
const lines = createInterface({ input: python.stdout })[Symbol.asyncIterator]();
const ask = async (command: Record<string, unknown>) => {
  python.stdin.write(`${JSON.stringify(command)}\n`);
  return (await lines.next()).value as string;
};
await lines.next(); // "ready"

interface Row {
  id: string;
  frame: string;
  smallUs: number;
  numpySmallUs: number;
  largeMs: number;
  validateMs: number;
  evaluateMs: number;
  hashMs: number;
  numpyEvalMs: number;
  numpyEndToEndMs: number;
  maxRelativeDifference: number;
}
const rows: Row[] = [];
const toUnit = 1 / parseUnit(UNIT).toNatural;

for (const def of PROCESS_DEFINITIONS) {
  const info = def.info;
  for (const frame of info.frames) {
    const sqrtS = 6 * Math.max(info.defaultMass, info.defaultFinalMass ?? 0);
    const request = (n: number) => ({ process: info.id, frame, energy: { sqrtS }, thetaDeg: points[n], unit: UNIT });
    const finalMass = info.defaultFinalMass ?? info.defaultMass;
    const kernel = createProcessKernel(def, sqrtS * sqrtS, info.defaultMass, finalMass, 1 / 137.035999084);
    const kin = kernel.kinematics;
    const masses = kin.masses;
    await ask({
      cmd: "case",
      process: info.id,
      frame,
      s: kin.s,
      pref: kin.pOut / (64 * Math.PI * Math.PI * kin.s * kin.pIn),
      prefSpp: (kin.pOut / (64 * Math.PI * Math.PI * kin.s * kin.pIn)) * ((8 * kernel.e2 * kernel.e2 * kin.pOut * kin.pOut) / (kin.s * kin.s)),
      pIn2: kin.pIn * kin.pIn,
      pp2: 2 * kin.pIn * kin.pOut,
      t1: kin.tForward,
      u1: kin.uBackward,
      e2: kernel.e2,
      // the mass each closed form takes (as in each process's fillCm)
      m: ["compton", "scalar-compton"].includes(info.id) ? masses.partner : ["photon-fusion-scalar", "breit-wheeler"].includes(info.id) ? masses.reference : masses.axis,
      M: masses.reference,
      beta: kernel.lab?.beta ?? 0,
      gamma: kernel.lab?.gamma ?? 1,
      toUnit,
      divergesForward: info.divergesForward,
      divergesBackward: info.divergesBackward,
    });

    // the values of both on the 10⁶ points
    const ours = runPrediction(request(LARGE)).values;
    const dumped = join(dir, "numpy.f64");
    await ask({ cmd: "dump", n: LARGE, path: dumped });
    const theirs = new Float64Array(readFileSync(dumped).buffer.slice(0));
    let maxRelativeDifference = 0;
    for (let i = 0; i < LARGE; i++) maxRelativeDifference = Math.max(maxRelativeDifference, Math.abs(ours[i] - theirs[i]) / Math.abs(theirs[i]));

    // 10³ angles: batches of calls, alternating
    const small: number[] = [];
    const numpySmall: number[] = [];
    for (let r = 0; r < REPEATS + 1; r++) {
      const req = request(SMALL);
      const t0 = now();
      for (let k = 0; k < SMALL_BATCH; k++) runPrediction(req);
      const ms = (now() - t0) / SMALL_BATCH;
      const [, numpyEndToEnd] = (await ask({ cmd: "run", n: SMALL, repeat: SMALL_BATCH })).split(" ").map(Number);
      if (r === 0) continue; // warm-up
      small.push(ms * 1e3);
      numpySmall.push(numpyEndToEnd * 1e3);
    }

    // 10⁶ angles: runPrediction, then the stages it consists of, then numpy, alternating
    const large: number[] = [];
    const validate: number[] = [];
    const evaluate: number[] = [];
    const hash: number[] = [];
    const numpyEval: number[] = [];
    const numpyEndToEnd: number[] = [];
    for (let r = 0; r < REPEATS + 1; r++) {
      const req = request(LARGE);
      let t0 = now();
      runPrediction(req);
      const total = now() - t0;
      t0 = now();
      const { parameters } = validatePredictionRequest(req);
      const tValidate = now() - t0;
      t0 = now();
      const k = createProcessKernel(def, sqrtS * sqrtS, info.defaultMass, finalMass, parameters.alpha);
      evaluateAngles(k, frame, "dsigma/dOmega", "thetaDeg", parameters.angle!.points!, toUnit, () => undefined, String);
      const tEvaluate = now() - t0;
      t0 = now();
      parametersHash(parameters);
      const tHash = now() - t0;
      const [e, e2e] = (await ask({ cmd: "run", n: LARGE, repeat: 1 })).split(" ").map(Number);
      if (r === 0) continue; // warm-up
      large.push(total);
      validate.push(tValidate);
      evaluate.push(tEvaluate);
      hash.push(tHash);
      numpyEval.push(e);
      numpyEndToEnd.push(e2e);
    }
    rows.push({
      id: info.id,
      frame,
      smallUs: median(small),
      numpySmallUs: median(numpySmall),
      largeMs: median(large),
      validateMs: median(validate),
      evaluateMs: median(evaluate),
      hashMs: median(hash),
      numpyEvalMs: median(numpyEval),
      numpyEndToEndMs: median(numpyEndToEnd),
      maxRelativeDifference,
    });
  }
}
await ask({ cmd: "quit" }).catch(() => undefined);
python.stdin.end();
rmSync(dir, { recursive: true, force: true });

// 200-bin bin-averaged curve through the same contract
const binRequest = {
  process: "pair-annihilation",
  frame: "lab",
  energy: { kinetic: 0.01 },
  thetaDegBins: Array.from({ length: 200 }, (_, i) => [0.9 * i, 0.9 * (i + 1)]),
  unit: "nb/sr",
};
for (let w = 0; w < 3; w++) runPrediction(binRequest);
const binTimes: number[] = [];
for (let r = 0; r < 15; r++) {
  const t0 = now();
  runPrediction(binRequest);
  binTimes.push(now() - t0);
}

// what a fresh array of 10⁶ numbers costs here (the result array that every 10⁶-angle request
// allocates; mostly the first touch of its memory): a copy of the points
const freshArray: number[] = [];
for (let r = 0; r < REPEATS; r++) {
  const t0 = now();
  points[LARGE].slice();
  freshArray.push(now() - t0);
}

// bin/predict, a three-angle request, wall time of the whole process
const cliRequest = JSON.stringify({ process: "compton", frame: "lab", energy: { beam: 1, unit: "MeV" }, thetaDeg: [30, 60, 90], unit: "mb/sr" });
const cliRun = () => {
  const t0 = now();
  const r = spawnSync(process.execPath, [join(ROOT, "bin/predict")], { input: cliRequest, encoding: "utf8" });
  if (r.status !== 0) throw new Error(`bin/predict failed: ${r.stderr}`);
  return now() - t0;
};
cliRun(); // builds the bundle if needed
const cliTimes = Array.from({ length: 5 }, cliRun);

const fmt = (x: number, digits = 3) => x.toPrecision(digits);
const loadAtEnd = loadavg()[0];
console.log(`runPrediction (θ in degrees → dσ/dΩ in ${UNIT}), one core; 10³: mean of ${SMALL_BATCH} calls, 10⁶: one call; medians of ${REPEATS}, alternating with numpy`);
console.log("process                 frame   10³ µs  numpy µs │ 10⁶ ms  validate  evaluate  hash │ numpy eval  numpy all │ angles/s  evaluations/s  ratio  eval ratio");
for (const r of rows) {
  console.log(
    `${r.id.padEnd(23)} ${r.frame.padEnd(5)} ${fmt(r.smallUs).padStart(8)} ${fmt(r.numpySmallUs).padStart(9)} │ ${fmt(r.largeMs).padStart(6)} ${fmt(r.validateMs).padStart(9)} ${fmt(r.evaluateMs).padStart(9)} ${fmt(r.hashMs).padStart(5)} │ ` +
      `${fmt(r.numpyEvalMs).padStart(10)} ${fmt(r.numpyEndToEndMs).padStart(10)} │ ${(LARGE / (r.largeMs / 1e3)).toExponential(2).padStart(8)} ${(LARGE / (r.evaluateMs / 1e3)).toExponential(2).padStart(14)} ` +
      `${fmt(r.largeMs / r.numpyEndToEndMs).padStart(6)} ${fmt(r.evaluateMs / r.numpyEvalMs).padStart(11)}`,
  );
}
const worst = {
  runPrediction1e6Ms: Math.max(...rows.map((r) => r.largeMs)),
  evaluationPerS: Math.min(...rows.map((r) => LARGE / (r.evaluateMs / 1e3))),
  ratio: Math.max(...rows.map((r) => r.largeMs / r.numpyEndToEndMs)),
  evalRatio: Math.max(...rows.map((r) => r.evaluateMs / r.numpyEvalMs)),
  difference: Math.max(...rows.map((r) => r.maxRelativeDifference)),
};
console.log("");
console.log(
  `worst case over processes and frames, 10⁶ angles: runPrediction ${fmt(worst.runPrediction1e6Ms)} ms (${(LARGE / (worst.runPrediction1e6Ms / 1e3)).toExponential(2)} angles/s end to end), ` +
    `evaluation ${worst.evaluationPerS.toExponential(2)}/s, ratio to numpy ${fmt(worst.ratio)} end to end and ${fmt(worst.evalRatio)} for the evaluation; ` +
    `largest relative difference of the values ${worst.difference.toExponential(2)}`,
);
console.log(`a fresh array of 10⁶ numbers (part of every evaluation above): ${fmt(median(freshArray))} ms (median of ${REPEATS})`);
console.log(`200-bin bin-averaged curve (pair-annihilation, lab): ${fmt(median(binTimes))} ms (median of 15)`);
console.log(`bin/predict, three angles: ${fmt(median(cliTimes))} ms wall (median of 5)`);
console.log(`load average (1 min) at the start and the end of the run: ${loadAtStart.toFixed(2)}, ${loadAtEnd.toFixed(2)}`);

const figures: Record<string, number> = {};
for (const r of rows) {
  const key = `${r.id.replaceAll("-", "_")}_${r.frame}`;
  figures[`${key}_1e3_us`] = Number(fmt(r.smallUs));
  figures[`${key}_1e6_ms`] = Number(fmt(r.largeMs));
  figures[`${key}_numpy_1e6_ms`] = Number(fmt(r.numpyEndToEndMs));
  figures[`${key}_ratio_vs_numpy`] = Number(fmt(r.largeMs / r.numpyEndToEndMs));
}
Object.assign(figures, {
  max_run_prediction_1e6_ms: Number(fmt(worst.runPrediction1e6Ms)),
  min_end_to_end_angles_per_s: Math.round(LARGE / (worst.runPrediction1e6Ms / 1e3)),
  min_evaluations_per_s: Math.round(worst.evaluationPerS),
  max_ratio_vs_numpy: Number(fmt(worst.ratio)),
  max_evaluation_ratio_vs_numpy: Number(fmt(worst.evalRatio)),
  numpy_max_relative_difference: worst.difference,
  fresh_array_1e6_ms: Number(fmt(median(freshArray))),
  bin_avg_200_ms: Number(fmt(median(binTimes))),
  predict_cli_3_angles_ms: Number(fmt(median(cliTimes))),
  load_average_start: Number(loadAtStart.toFixed(2)),
  load_average_end: Number(loadAtEnd.toFixed(2)),
});
console.log(JSON.stringify(figures));
