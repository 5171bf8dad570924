import type { XKind } from "./quantity";

/**
 * Why an x value (in canonical units) lies outside the physical domain of its kind, or null.
 * `shown` is the value as the file writes it, with its unit, so the message points at the text.
 *
 * Domains: θ in [0°, 180°]; cosθ in [−1, 1]; t ≤ 0, since every process the engine knows has
 * equal masses within the initial and within the final pair (or is Compton-like), for which
 * t = (p1 − p3)² ≤ 0 holds everywhere; √s, beam energy and beam kinetic energy > 0. Thresholds
 * depend on the process and are checked when a prediction is made, not here.
 */
export function xDomainViolation(kind: XKind, value: number, shown: string): string | null {
  switch (kind) {
    case "theta_lab_deg":
    case "theta_cm_deg":
      return value >= 0 && value <= 180
        ? null
        : `θ = ${shown} is outside [0°, 180°]; angles are polar angles in degrees`;
    case "cos_theta":
      return value >= -1 && value <= 1 ? null : `cosθ = ${shown} is outside [−1, 1]`;
    case "t":
      return value <= 0
        ? null
        : `t = ${shown} is positive, but t ≤ 0 in this scattering; if the column holds −t, negate it`;
    case "sqrt_s":
      return value > 0 ? null : `√s = ${shown} must be positive`;
    case "beam_energy":
      return value > 0 ? null : `the beam energy ${shown} must be positive`;
    case "beam_kinetic":
      return value > 0 ? null : `the beam kinetic energy ${shown} must be positive`;
  }
}

/** `xDomainViolation(kind, value, …) === null`, without building a message per row. */
export function isInXDomain(kind: XKind, value: number): boolean {
  switch (kind) {
    case "theta_lab_deg":
    case "theta_cm_deg":
      return value >= 0 && value <= 180;
    case "cos_theta":
      return value >= -1 && value <= 1;
    case "t":
      return value <= 0;
    case "sqrt_s":
    case "beam_energy":
    case "beam_kinetic":
      return value > 0;
  }
}
