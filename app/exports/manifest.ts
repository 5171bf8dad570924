// The submission bundle's manifest.json and README.txt. Pure: the hashes come in already
// computed (app/.server/exports/bundle.server.ts), so this runs in the browser too.

export const MANIFEST_NAME = "manifest.json";
export const README_NAME = "README.txt";
export const BUNDLE_FORMAT = "steradian-submission-bundle";
export const BUNDLE_FORMAT_VERSION = 1;

export type JsonValue = string | number | boolean | null | JsonValue[] | { [key: string]: JsonValue };

/**
 * What the caller adds to the manifest besides the file hashes: for a sealed version, e.g.
 * `fingerprint`, `sealedAt` (ISO 8601), `sealer`, `signers` with their sign-off times,
 * `engineVersion`, `datasetRevisions` (ids and content hashes), `predictions` (parameters and
 * their hashes). Plain JSON only, so that the manifest reads back as it was written.
 */
export type ManifestExtra = { [key: string]: JsonValue };

export interface ManifestFile {
  name: string;
  bytes: number;
  /** SHA-256 (FIPS 180-4) of the file's bytes, lower-case hex. */
  sha256: string;
}

export interface Manifest {
  format: typeof BUNDLE_FORMAT;
  formatVersion: number;
  hashAlgorithm: "SHA-256";
  files: ManifestFile[];
  [key: string]: unknown;
}

const RESERVED = new Set(["format", "formatVersion", "hashAlgorithm", "files"]);

/**
 * A name inside the bundle: relative, forward slashes, no empty, "." or ".." segment, no
 * backslash or control character, so that unpacking can never write outside its folder.
 */
export function checkBundleName(name: string): void {
  const bad =
    name === "" ||
    name.length > 200 ||
    name.startsWith("/") ||
    /[\\\u0000-\u001f\u007f]/.test(name) ||
    name.split("/").some((segment) => segment === "" || segment === "." || segment === "..");
  if (bad) throw new Error(`"${name}" cannot be a file name in a bundle: use a relative name of plain segments`);
}

function sortedJson(value: JsonValue, path: string): JsonValue {
  if (value === null || typeof value === "string" || typeof value === "boolean") return value;
  if (typeof value === "number") {
    if (!Number.isFinite(value)) throw new TypeError(`manifest: ${path} is ${value}, not a finite number`);
    return value;
  }
  if (Array.isArray(value)) return value.map((v, i) => sortedJson(v, `${path}[${i}]`));
  if (typeof value !== "object" || Object.getPrototypeOf(value) !== Object.prototype) throw new TypeError(`manifest: ${path} is not plain JSON`);
  const out: { [key: string]: JsonValue } = {};
  for (const key of Object.keys(value).sort()) {
    if (value[key] === undefined) throw new TypeError(`manifest: ${path}.${key} is undefined`);
    out[key] = sortedJson(value[key], `${path}.${key}`);
  }
  return out;
}

/**
 * manifest.json as text: the format, every file with its size and SHA-256 (in the given order),
 * and the extra fields, object keys sorted at every level and indented, so that the same
 * content always gives the same bytes.
 */
export function buildManifest(files: ManifestFile[], extra: ManifestExtra): string {
  for (const key of Object.keys(extra)) if (RESERVED.has(key)) throw new Error(`manifest: "${key}" is written by the bundle itself`);
  const names = new Set<string>();
  for (const f of files) {
    checkBundleName(f.name);
    if (f.name === MANIFEST_NAME) throw new Error("manifest: the manifest cannot list itself");
    if (names.has(f.name)) throw new Error(`manifest: "${f.name}" is listed twice`);
    if (!/^[0-9a-f]{64}$/.test(f.sha256)) throw new Error(`manifest: "${f.name}" has no SHA-256 in lower-case hex`);
    names.add(f.name);
  }
  const extraSorted = sortedJson(extra, "$") as { [key: string]: JsonValue };
  const manifest = {
    format: BUNDLE_FORMAT,
    formatVersion: BUNDLE_FORMAT_VERSION,
    hashAlgorithm: "SHA-256",
    files: files.map((f) => ({ name: f.name, bytes: f.bytes, sha256: f.sha256 })),
    ...extraSorted,
  };
  return `${JSON.stringify(manifest, null, 2)}\n`;
}

/** Reads manifest.json back, checking the parts that verification relies on. */
export function parseManifest(text: string): Manifest {
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (error) {
    throw new Error(`manifest.json is not JSON: ${error instanceof Error ? error.message : String(error)}`);
  }
  const m = value as Partial<Manifest> | null;
  if (m === null || typeof m !== "object" || m.format !== BUNDLE_FORMAT) throw new Error(`manifest.json is not a ${BUNDLE_FORMAT} manifest`);
  if (m.formatVersion !== BUNDLE_FORMAT_VERSION) throw new Error(`manifest.json has format version ${String(m.formatVersion)}; this program reads version ${BUNDLE_FORMAT_VERSION}`);
  if (m.hashAlgorithm !== "SHA-256") throw new Error(`manifest.json names hash algorithm ${String(m.hashAlgorithm)}; only SHA-256 is known`);
  if (!Array.isArray(m.files)) throw new Error("manifest.json has no list of files");
  for (const f of m.files as unknown[]) {
    const file = f as Partial<ManifestFile> | null;
    if (file === null || typeof file !== "object" || typeof file.name !== "string" || typeof file.bytes !== "number" || typeof file.sha256 !== "string" || !/^[0-9a-f]{64}$/.test(file.sha256)) {
      throw new Error(`manifest.json lists a file without a name, a size and a SHA-256: ${JSON.stringify(f)}`);
    }
  }
  return m as Manifest;
}

/**
 * README.txt: what the bundle is, what each file is, and how to check it (the manifest's hashes
 * can be checked with any SHA-256 tool, without this program).
 */
export function readmeText(title: string, files: { name: string; description: string }[]): string {
  const width = Math.max(MANIFEST_NAME.length, ...files.map((f) => f.name.length)) + 2;
  const line = (name: string, description: string) => `  ${name.padEnd(width)}${description}`;
  const oneLine = (s: string) => s.replace(/[\r\n\t]+/g, " ").trim();
  return [
    `Submission bundle: ${oneLine(title)}`,
    "",
    "Files:",
    ...files.map((f) => line(f.name, oneLine(f.description))),
    line(README_NAME, "this file"),
    line(MANIFEST_NAME, "SHA-256 of every other file, with the version's provenance (data revisions, engine, sign-offs)"),
    "",
    "To check the files: compare each file's SHA-256 (for example `sha256sum figure.pdf`) with",
    "manifest.json, or run `npm run --silent verify-bundle -- <this zip>` in Steradian.",
    "CSV files: comma-separated, header comments start with '#'; a text cell that could be read as",
    "a spreadsheet formula starts with an apostrophe.",
    "",
  ].join("\r\n");
}
