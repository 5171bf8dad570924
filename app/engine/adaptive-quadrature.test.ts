import integrateSimpson from "integrate-adaptive-simpson";
import { describe, expect, it } from "vitest";
import { integrateAdaptive } from "./adaptive-quadrature";

describe("integrateAdaptive (Gauss–Kronrod)", () => {
  it.each([
    ["sin on [0, π] (exact 2)", (x: number) => Math.sin(x), 0, Math.PI, 2],
    ["exp on [−1, 2] (exact e² − e⁻¹)", (x: number) => Math.exp(x), -1, 2, Math.exp(2) - Math.exp(-1)],
    ["1/(1+25x²) on [−1, 1] (exact (2/5)·atan 5)", (x: number) => 1 / (1 + 25 * x * x), -1, 1, 0.4 * Math.atan(5)],
    ["sharp peak 1/((x−0.3)²+1e-6) on [0, 1]", (x: number) => 1 / ((x - 0.3) ** 2 + 1e-6), 0, 1, 1e3 * (Math.atan(0.7e3) + Math.atan(0.3e3))],
  ])("%s to relative 1e-10 (closed-form antiderivative)", (_label, f, a, b, exact) => {
    const r = integrateAdaptive(f, a, b, { relativeTolerance: 1e-10, maxIntervals: 2000 });
    expect(r.converged).toBe(true);
    expect(Math.abs(r.value - exact) / Math.abs(exact), `got ${r.value} expected ${exact}`).toBeLessThan(1e-10);
  });

  it("agrees with the general-purpose package integrate-adaptive-simpson on a Klein–Nishina-like curve", () => {
    const f = (c: number) => {
      const r = 1 / (1 + 3 * (1 - c));
      return r * r * (r + 1 / r - (1 - c * c));
    };
    const ours = integrateAdaptive(f, -1, 1).value;
    const theirs = integrateSimpson(f, -1, 1, 1e-13, 30);
    expect(Math.abs(ours - theirs) / theirs, `ours ${ours} theirs ${theirs}`).toBeLessThan(1e-10);
  });

  it("reports non-convergence instead of pretending", () => {
    const r = integrateAdaptive((x) => 1 / Math.sqrt(x), 0, 1, { relativeTolerance: 1e-14, maxIntervals: 5 });
    expect(r.converged).toBe(false);
    expect(r.intervals).toBe(5);
  });
});
