/**
 * The engine's version (semver). Every prediction carries it; bump the minor version when a
 * result can change numerically, the patch version for fixes that leave results bit-identical.
 */
export const ENGINE_VERSION = "0.1.0";
