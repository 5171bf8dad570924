// Synthetic demo data for the invented collaboration: generated from the engine's own
// predictions with seeded Gaussian noise, then taken in through the same ingest path as any
// upload. Never a measurement; marked synthetic wherever it appears.
import { createReadStream } from "node:fs";
import { mkdir, unlink, writeFile } from "node:fs/promises";
import path from "node:path";
import { runPrediction } from "~/engine";
import { seededRandom } from "~/engine/testing/seeded-random";
import { columnMappingSchema } from "~/datasets/column-mapping";
import { quantitySchema } from "~/datasets/quantity";
import { createDataset } from "./dataset-repository.server";
import type { Db } from "../platform/db.server";
import { env } from "../platform/env.server";
import { blobStore, ingestUpload } from "./revision-upload.server";

/** Seeded Gaussian noise (Box–Muller), so that the demo is the same on every machine. */
function seeded(seed: number) {
  const next = seededRandom(seed);
  return { gauss: () => Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next()) };
}

const sig = (v: number) => Number(v.toPrecision(4));

interface DemoSpec {
  name: string;
  description: string;
  process: string;
  beamEnergyGeV: number | null;
  target: string | null;
  quantity: unknown;
  header: string[];
  request: Record<string, unknown>;
  bins: [number, number][];
  statFraction: number;
  systFraction: number;
  seed: number;
}

const DEMOS: DemoSpec[] = [
  {
    name: "e⁺e⁻ → γγ photon angular distribution, T = 0.5 GeV (synthetic)",
    description: "SYNTHETIC demo data: the engine's Born prediction averaged over each bin, with 4 % seeded Gaussian noise. Invented fixed-target set-up (positron beam on a thin beryllium foil).",
    process: "pair-annihilation",
    beamEnergyGeV: 0.5 + 0.00051099895,
    target: "Be foil (invented)",
    quantity: { x: { kind: "theta_lab_deg" }, y: { kind: "dsigma_domega", unit: "ub/sr" } },
    header: ["theta_lab", "theta_lo", "theta_hi", "dsigma_dOmega", "stat", "syst"],
    request: { process: "pair-annihilation", frame: "lab", energy: { kinetic: 0.5, unit: "GeV" }, unit: "ub/sr" },
    bins: Array.from({ length: 12 }, (_, i) => [2 + 2 * i, 4 + 2 * i] as [number, number]),
    statFraction: 0.04,
    systFraction: 0.025,
    seed: 2026_12_01,
  },
  {
    name: "γγ → π⁺π⁻ cross section near threshold (synthetic)",
    description: "SYNTHETIC demo data: the point-like (scalar QED Born) total cross section averaged over each √s bin, with 6 % seeded Gaussian noise. Invented two-photon analysis.",
    process: "photon-fusion-scalar",
    beamEnergyGeV: null,
    target: null,
    quantity: { x: { kind: "sqrt_s", unit: "GeV" }, y: { kind: "sigma", unit: "nb" } },
    header: ["sqrt_s", "sqrt_s_lo", "sqrt_s_hi", "sigma", "stat", "syst"],
    request: { process: "photon-fusion-scalar", frame: "cm", observable: "sigma", unit: "nb" },
    bins: Array.from({ length: 10 }, (_, i) => [0.3 + 0.05 * i, 0.35 + 0.05 * i] as [number, number]),
    statFraction: 0.06,
    systFraction: 0.05,
    seed: 1_229_2026,
  },
];

function demoCsv(d: DemoSpec): string {
  const angular = d.process === "pair-annihilation";
  const req = angular ? { ...d.request, thetaDegBins: d.bins } : { ...d.request, scan: { sqrtSBins: d.bins, unit: "GeV" } };
  const { values } = runPrediction(req);
  const rng = seeded(d.seed);
  const lines = [d.header.join(",")];
  d.bins.forEach(([lo, hi], i) => {
    const truth = values[i];
    const stat = d.statFraction * truth;
    const measured = truth + stat * rng.gauss();
    lines.push([sig((lo + hi) / 2), lo, hi, sig(measured), sig(stat), sig(d.systFraction * truth)].join(","));
  });
  return `${lines.join("\n")}\n`;
}

export async function seedDemoDatasets(db: Db, manuscriptId: string, ownerId: string): Promise<number> {
  let created = 0;
  for (const d of DEMOS) {
    const exists = await db.selectFrom("dataset").select("id").where("manuscript_id", "=", manuscriptId).where("name", "=", d.name).executeTakeFirst();
    if (exists) continue;
    const [x, xLow, xHigh, y, stat, syst] = d.header;
    const m = columnMappingSchema.parse({ x, xLow, xHigh, y, stat: { kind: "symmetric", column: stat }, syst: { kind: "symmetric", column: syst } });
    const quantity = quantitySchema.parse(d.quantity);
    const ds = await createDataset(db, {
      manuscriptId, userId: ownerId, name: d.name, quantity, mapping: m, isDemo: true,
      metadata: { process: d.process, beamEnergyGeV: d.beamEnergyGeV, target: d.target, description: d.description },
    });
    const text = demoCsv(d);
    const dir = path.join(path.resolve(env.STORAGE_DIR), "tmp");
    await mkdir(dir, { recursive: true });
    const source = path.join(dir, `demo-${d.seed}.csv`);
    await writeFile(source, text);
    const received = await blobStore().receive(createReadStream(source), { maxBytes: env.UPLOAD_MAX_BYTES });
    await unlink(source);
    const outcome = await ingestUpload({
      manuscriptId, datasetId: ds.id, userId: ownerId, ip: null, tempPath: received.tempPath,
      raw: { sha256: received.sha256, bytes: received.bytes, fileName: `${d.process}-synthetic.csv` }, mapping: m, quantity,
    });
    if (outcome.kind !== "created") throw new Error(`demo dataset “${d.name}” was not stored: ${JSON.stringify(outcome)}`);
    created++;
  }
  return created;
}
