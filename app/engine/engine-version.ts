/**
 * The engine's version (semver). Every prediction carries it; bump the minor version when a
 * result can change numerically, the patch version for fixes that leave results bit-identical.
 * 0.2.0: bin means are σ(bin)/ΔX (docs/decisions/0006-bin-means.md); number lists enter the
 * parameters hash as float64 bytes (docs/decisions/0007-parameters-hash-number-lists.md);
 * e⁺e⁻ → φ⁺φ⁻ is evaluated in its CM form everywhere (last digits, up to 4·10⁻⁸ relative).
 */
export const ENGINE_VERSION = "0.2.0";
