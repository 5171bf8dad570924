import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { float64LittleEndianBytes, float64ListSha256, parametersHash } from "./parameters-hash";
import { validatePredictionRequest } from "./prediction-request";
import { sha256Hex, sha256HexPortable, usesNodeSha256 } from "./sha256-hex";
import { seededRandom } from "./testing/seeded-random";

// The reference SHA-256 is Node's (OpenSSL), an implementation independent of the engine's
// @noble/hashes; the float64 little-endian bytes come from Buffer.writeDoubleLE.
const opensslSha256 = (bytes: Uint8Array | string) => createHash("sha256").update(bytes).digest("hex");
function float64le(numbers: number[]): Buffer {
  const b = Buffer.alloc(8 * numbers.length);
  numbers.forEach((x, i) => b.writeDoubleLE(x, 8 * i));
  return b;
}
const hashOf = (request: unknown) => parametersHash(validatePredictionRequest(request).parameters);

const EXAMPLE = { process: "scalar-annihilation", frame: "lab", energy: { kinetic: 0.5 }, thetaDeg: [30, 60, 90], unit: "ub/sr" };

describe("parametersHash (docs/decisions/0007-parameters-hash-number-lists.md)", () => {
  it("is the SHA-256 of the canonical JSON with the number list replaced by the SHA-256 of its float64 little-endian bytes", () => {
    const list = opensslSha256(float64le([30, 60, 90]));
    const alpha = String(1 / 137.035999084); // the default α, written as JSON writes it
    const text =
      `{"acceptance":null,"alpha":${alpha},"angle":{"bins":null,"points":{"float64leSha256":"${list}"},"variable":"thetaDeg"},` +
      `"energy":{"kind":"kinetic","unit":"GeV","value":0.5},"finalMass":null,"formFactor":null,"frame":"lab","mass":0.13957039,` +
      `"observable":"dsigma/dOmega","process":"scalar-annihilation","relativeTolerance":1e-10,"scan":null,"unit":"ub/sr"}`;
    expect(hashOf(EXAMPLE)).toBe(opensslSha256(text));
  });

  it("flattens bins as low, high, low, high and hashes energy scans the same way", () => {
    const bins = [[10, 20], [20, 40]];
    const p = validatePredictionRequest({ process: "compton", frame: "lab", energy: { beam: 1, unit: "MeV" }, thetaDegBins: bins }).parameters;
    expect(float64ListSha256(p.angle!.bins!)).toBe(opensslSha256(float64le([10, 20, 20, 40])));
    const scan = validatePredictionRequest({ process: "muon-pair", frame: "cm", observable: "sigma", scan: { sqrtSBins: [[1, 2]], unit: "GeV" }, unit: "nb" }).parameters;
    expect(float64ListSha256(scan.scan!.bins!)).toBe(opensslSha256(float64le([1, 2])));
  });

  it("is the same for equal requests: key order, number spelling, −0 and 0", () => {
    const respelled = JSON.parse('{"unit":"ub/sr","thetaDeg":[3e1,60.0,90],"energy":{"kinetic":5e-1},"frame":"lab","process":"scalar-annihilation"}');
    expect(hashOf(respelled)).toBe(hashOf(EXAMPLE));
    expect(hashOf({ ...EXAMPLE, thetaDeg: [-0, 60] })).toBe(hashOf({ ...EXAMPLE, thetaDeg: [0, 60] }));
  });

  it("differs when a number, the list's length, its kind (points or bins) or its variable differs", () => {
    const hashes = [
      hashOf(EXAMPLE),
      hashOf({ ...EXAMPLE, thetaDeg: [30, 60, 91] }),
      hashOf({ ...EXAMPLE, thetaDeg: [30, 60] }),
      hashOf({ ...EXAMPLE, thetaDeg: [30, 60, 90, 90] }),
      hashOf({ ...EXAMPLE, thetaDeg: undefined, thetaDegBins: [[30, 60]] }),
      hashOf({ ...EXAMPLE, thetaDeg: [30, 60] }),
      hashOf({ ...EXAMPLE, thetaDeg: undefined, cosTheta: [0.5] }),
      hashOf({ ...EXAMPLE, thetaDeg: [30, 60, 90 + 2 ** -46] }),
    ];
    expect(new Set(hashes).size).toBe(hashes.length - 1); // the repeated [30, 60] hashes equal
  });

  it("keeps its value across runs and machines (value computed independently with Python's hashlib and struct.pack('<3d', …))", () => {
    expect(hashOf(EXAMPLE)).toBe("b835f26245e1bf53305e324671c693caca27b7078ee09ae6c88b896d5561c537");
  });

  it("writes little-endian bytes on either kind of platform", () => {
    const numbers = new Float64Array([0, 1, -2.5, 1e-300, Math.PI, 5e-324]);
    const expected = float64le(Array.from(numbers));
    expect(Buffer.from(float64LittleEndianBytes(numbers, true)).equals(expected)).toBe(true);
    expect(Buffer.from(float64LittleEndianBytes(numbers, false)).equals(expected)).toBe(true);
  });
});

describe("sha256Hex: Node's implementation in Node, @noble/hashes elsewhere, the same digests", () => {
  it("uses Node's implementation here, and both agree with Node's createHash on random inputs of every length up to 300 bytes and on 8 MB", () => {
    expect(usesNodeSha256).toBe(true);
    const rand = seededRandom(99);
    for (let n = 0; n <= 300; n++) {
      const bytes = Uint8Array.from({ length: n }, () => Math.floor(256 * rand()));
      const reference = sha256Hex(bytes);
      expect(sha256HexPortable(bytes), `length ${n}`).toBe(reference);
      expect(reference).toBe(createHash("sha256").update(bytes).digest("hex"));
    }
    const large = new Uint8Array(new Float64Array(1_000_000).map((_, i) => Math.sin(i)).buffer);
    expect(sha256HexPortable(large)).toBe(sha256Hex(large));
  });

  it("gives the FIPS 180-4 example digest of \"abc\"", () => {
    const abc = new TextEncoder().encode("abc");
    const expected = "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"; // FIPS 180-4 / NIST example
    expect(sha256Hex(abc)).toBe(expected);
    expect(sha256HexPortable(abc)).toBe(expected);
  });
});
