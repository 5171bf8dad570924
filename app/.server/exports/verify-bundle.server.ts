// Checks a submission bundle against its own manifest: every file listed is there with the
// listed SHA-256 and size, and nothing is there that the manifest does not list. Used by
// `npm run verify-bundle` (scripts/verify-bundle.ts); needs no account and no database.
import { unzipSync } from "fflate";
import { MANIFEST_NAME, parseManifest, type Manifest } from "~/exports/manifest";
import { sha256Hex } from "./bundle.server";

export type FileStatus = "ok" | "differs" | "missing" | "not listed";

export interface FileCheck {
  name: string;
  status: FileStatus;
  /** SHA-256 in the manifest and of the file in the zip, when there is one. */
  expected: string | null;
  actual: string | null;
}

export interface BundleVerification {
  ok: boolean;
  files: FileCheck[];
  /** What makes the bundle unreadable or suspicious as a whole (no manifest, a name twice…). */
  problems: string[];
  manifest: Manifest | null;
}

/** Unpacked size above which a bundle is refused rather than read: 1 GB, far above any figure's. */
export const MAX_UNPACKED_BYTES = 1_000_000_000;

export function verifyBundle(zip: Uint8Array): BundleVerification {
  const seen = new Map<string, number>();
  let declared = 0;
  let entries: Record<string, Uint8Array>;
  try {
    entries = unzipSync(zip, {
      filter: (file) => {
        seen.set(file.name, (seen.get(file.name) ?? 0) + 1);
        declared += file.originalSize;
        if (declared > MAX_UNPACKED_BYTES) throw new Error(`it unpacks to more than ${MAX_UNPACKED_BYTES} bytes`);
        return true;
      },
    });
  } catch (error) {
    return { ok: false, files: [], problems: [`not a readable zip file: ${error instanceof Error ? error.message : String(error)}`], manifest: null };
  }
  const problems = [...seen].filter(([, n]) => n > 1).map(([name, n]) => `"${name}" is in the zip ${n} times`);
  const manifestBytes = entries[MANIFEST_NAME];
  if (manifestBytes === undefined) return { ok: false, files: [], problems: [...problems, `no ${MANIFEST_NAME} in the zip`], manifest: null };
  let manifest: Manifest;
  try {
    manifest = parseManifest(new TextDecoder("utf-8", { fatal: true }).decode(manifestBytes));
  } catch (error) {
    return { ok: false, files: [], problems: [...problems, error instanceof Error ? error.message : String(error)], manifest: null };
  }

  const files: FileCheck[] = [];
  const listed = new Set<string>();
  for (const entry of manifest.files) {
    if (listed.has(entry.name)) problems.push(`${MANIFEST_NAME} lists "${entry.name}" twice`);
    listed.add(entry.name);
    const bytes = Object.hasOwn(entries, entry.name) ? entries[entry.name] : undefined;
    if (bytes === undefined) {
      files.push({ name: entry.name, status: "missing", expected: entry.sha256, actual: null });
      continue;
    }
    const actual = sha256Hex(bytes);
    const same = actual === entry.sha256 && bytes.length === entry.bytes;
    files.push({ name: entry.name, status: same ? "ok" : "differs", expected: entry.sha256, actual });
  }
  for (const name of Object.keys(entries)) {
    if (name === MANIFEST_NAME || listed.has(name)) continue;
    files.push({ name, status: "not listed", expected: null, actual: sha256Hex(entries[name]) });
  }
  const ok = problems.length === 0 && files.length > 0 && files.every((f) => f.status === "ok");
  return { ok, files, problems, manifest };
}
