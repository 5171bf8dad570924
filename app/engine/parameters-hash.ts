import { utf8ToBytes } from "@noble/hashes/utils.js";
import { canonicalJson } from "./canonical-json";
import type { PredictionParameters } from "./prediction-request";
import { SCRATCH_HASH, scratchFloat64 } from "./scratch-buffers";
import { sha256Hex } from "./sha256-hex";

const LITTLE_ENDIAN = new Uint8Array(new Float64Array([1]).buffer)[7] === 0x3f;

/**
 * SHA-256 (FIPS 180-4), lowercase hex, of a list of numbers (a bin list flattened as low, high,
 * low, high, …) written as IEEE 754 binary64 little-endian, 8 bytes each, −0 written as +0
 * (x + 0 turns −0 into +0 and leaves every other number as it is).
 */
export function float64ListSha256(list: readonly number[] | readonly (readonly [number, number])[]): string {
  const flat = typeof list[0] === "number";
  const count = flat ? list.length : 2 * list.length;
  const numbers = scratchFloat64(SCRATCH_HASH, count);
  if (flat) {
    const xs = list as readonly number[];
    for (let i = 0; i < count; i++) numbers[i] = xs[i] + 0;
  } else {
    const bins = list as readonly (readonly [number, number])[];
    for (let i = 0; i < bins.length; i++) {
      numbers[2 * i] = bins[i][0] + 0;
      numbers[2 * i + 1] = bins[i][1] + 0;
    }
  }
  return sha256Hex(float64LittleEndianBytes(numbers, LITTLE_ENDIAN));
}

/** The bytes of `numbers` as binary64 little-endian: the array's own memory on a little-endian platform, otherwise swapped. */
export function float64LittleEndianBytes(numbers: Float64Array, platformIsLittleEndian: boolean): Uint8Array {
  if (platformIsLittleEndian) return new Uint8Array(numbers.buffer, numbers.byteOffset, numbers.byteLength);
  const bytes = new Uint8Array(numbers.byteLength);
  const view = new DataView(bytes.buffer);
  for (let i = 0; i < numbers.length; i++) view.setFloat64(8 * i, numbers[i], true);
  return bytes;
}

const digest = (list: readonly number[] | readonly (readonly [number, number])[] | null) =>
  list === null ? null : { float64leSha256: float64ListSha256(list) };

/**
 * The parameters' fingerprint (docs/decisions/0007-parameters-hash-number-lists.md): the SHA-256,
 * lowercase hex, of the UTF-8 canonical JSON (docs/decisions/0003-engine-conventions.md) of the
 * validated parameters in which each number list — `angle.points`, `angle.bins`, `scan.points`,
 * `scan.bins` — is replaced by `{ "float64leSha256": <float64ListSha256 of the list> }`. Equal
 * requests (any key order, any spelling of the same numbers) give equal hashes on every machine;
 * hashing 10⁶ angles reads 8 MB once instead of writing and hashing their decimal text.
 */
export function parametersHash(p: PredictionParameters): string {
  const hashed = {
    ...p,
    angle: p.angle === null ? null : { ...p.angle, points: digest(p.angle.points), bins: digest(p.angle.bins) },
    scan: p.scan === null ? null : { ...p.scan, points: digest(p.scan.points), bins: digest(p.scan.bins) },
  };
  return sha256Hex(utf8ToBytes(canonicalJson(hashed)));
}
