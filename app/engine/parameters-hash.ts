import { sha256 } from "@noble/hashes/sha2.js";
import { bytesToHex, utf8ToBytes } from "@noble/hashes/utils.js";
import { canonicalJson } from "./canonical-json";

/** SHA-256 (FIPS 180-4), lowercase hex, of the UTF-8 canonical JSON of `value`. */
export function parametersHash(value: unknown): string {
  return bytesToHex(sha256(utf8ToBytes(canonicalJson(value))));
}
