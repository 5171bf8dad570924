// The submission bundle: one zip with the figure files, the numbers behind them, manifest.json
// and README.txt. Deterministic: the same files and fields give the same bytes
// (docs/decisions/0009-export-rendering.md).
import { createHash } from "node:crypto";
import { zipSync, type Zippable } from "fflate";
import { buildManifest, checkBundleName, MANIFEST_NAME, README_NAME, readmeText, type ManifestExtra } from "~/exports/manifest";

export interface BundleFile {
  name: string;
  bytes: Uint8Array;
  /** One line for README.txt: what the file is. */
  description: string;
}

export interface BundleOptions {
  /** First line of README.txt, e.g. the manuscript, figure and version. */
  title: string;
  /**
   * Modification time written for every entry. Zip stores local date and time without a zone;
   * the UTC fields of this date are written, so the bytes do not depend on the server's zone.
   * Default: 1980-01-01 00:00, the earliest time a zip can hold.
   */
  modifiedAt?: Date;
}

export function sha256Hex(bytes: Uint8Array): string {
  return createHash("sha256").update(bytes).digest("hex");
}

/** A Date whose local fields are the given date's UTC fields (fflate writes local fields). */
function zipTime(date: Date | undefined): Date {
  if (date === undefined) return new Date(1980, 0, 1, 0, 0, 0);
  if (Number.isNaN(date.getTime()) || date.getUTCFullYear() < 1980 || date.getUTCFullYear() > 2099) throw new Error(`a zip cannot hold the time ${String(date)}`);
  return new Date(date.getUTCFullYear(), date.getUTCMonth(), date.getUTCDate(), date.getUTCHours(), date.getUTCMinutes(), date.getUTCSeconds());
}

/**
 * The bundle as zip bytes: README.txt, manifest.json, then the files sorted by name. The
 * manifest lists every file but itself with its size and SHA-256, and the extra fields. Every
 * entry has the same time, no extra field and no comment, and is deflated at level 9 (fflate,
 * deterministic for the same input), so two builds of one version are byte-identical.
 */
export function buildBundle(files: BundleFile[], manifestExtra: ManifestExtra, options: BundleOptions): Uint8Array {
  const names = new Set<string>();
  for (const f of files) {
    checkBundleName(f.name);
    if (f.name === MANIFEST_NAME || f.name === README_NAME) throw new Error(`"${f.name}" is written by the bundle itself`);
    // Every name has an extension: that also keeps the entry order, since a JavaScript object
    // would move an all-digit key to the front.
    if (!/\.[A-Za-z0-9]+$/.test(f.name)) throw new Error(`"${f.name}" needs an extension`);
    if (names.has(f.name)) throw new Error(`"${f.name}" is in the bundle twice`);
    if (f.description.trim() === "") throw new Error(`"${f.name}" needs a description for README.txt`);
    names.add(f.name);
  }
  const sorted = [...files].sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
  const readme = new TextEncoder().encode(readmeText(options.title, sorted));
  const listed = [{ name: README_NAME, bytes: readme }, ...sorted];
  const manifest = new TextEncoder().encode(buildManifest(listed.map((f) => ({ name: f.name, bytes: f.bytes.length, sha256: sha256Hex(f.bytes) })), manifestExtra));

  const mtime = zipTime(options.modifiedAt);
  const entries: Zippable = {};
  for (const f of [{ name: README_NAME, bytes: readme }, { name: MANIFEST_NAME, bytes: manifest }, ...sorted]) {
    entries[f.name] = [f.bytes, { level: 9, mtime }];
  }
  return zipSync(entries);
}
