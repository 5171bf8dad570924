import { describe, expect, it } from "vitest";
import { type RevisionRow, rowDelta } from "./diff-revisions";

const r = (y: number, e: { statMinus?: number | null; statPlus?: number | null; systMinus?: number | null; systPlus?: number | null } = {}): RevisionRow => ({
  x: 30, xLow: null, xHigh: null, y,
  statMinus: e.statMinus ?? null, statPlus: e.statPlus ?? null, systMinus: e.systMinus ?? null, systPlus: e.systPlus ?? null,
});

// Δ/σ = (y₂ − y₁) / √(σ₁² + σ₂²), σᵢ² = statᵢ² + systᵢ²: the difference of two independent
// measurements in units of its standard deviation (PDG, Review of Particle Physics, "Statistics").
describe("rowDelta: Δ/σ = (y₂ − y₁)/√(σ₁² + σ₂²)", () => {
  it("matches a hand computation with symmetric errors", () => {
    // By hand: Δ = 1.8 − 1.5 = 0.3; σ₁² = 0.1² + 0.2² = 0.05; σ₂² = 0.1² + 0.1² = 0.02;
    // σ = √0.07 = 0.264575131…; Δ/σ = 0.3 / 0.264575131 = 1.133893419…; Δ/|y₁| = 0.2.
    const d = rowDelta(r(1.5, { statMinus: 0.1, statPlus: 0.1, systMinus: 0.2, systPlus: 0.2 }), r(1.8, { statMinus: 0.1, statPlus: 0.1, systMinus: 0.1, systPlus: 0.1 }));
    expect(d.delta).toBeCloseTo(0.3, 14);
    expect(d.relative).toBeCloseTo(0.2, 14);
    expect(d.sigma).toBeCloseTo(0.264575131, 9);
    expect(d.pull).toBeCloseTo(1.133893419, 9);
  });

  it("takes the errors that point toward the other value when they are asymmetric", () => {
    // y falls from 2.0 to 1.0, Δ = −1. From's − error (0.3) and to's
    // + error (0.4) face each other: σ = √(0.09 + 0.16) = 0.5, Δ/σ = −2 (by hand).
    const d = rowDelta(r(2.0, { statMinus: 0.3, statPlus: 9 }), r(1.0, { statMinus: 9, statPlus: 0.4 }));
    expect(d.delta).toBe(-1);
    expect(d.sigma).toBeCloseTo(0.5, 14);
    expect(d.pull).toBeCloseTo(-2, 14);
    expect(d.relative).toBeCloseTo(-0.5, 14);
  });

  it("gives no Δ/σ without errors and no relative Δ from zero", () => {
    const d = rowDelta(r(0), r(1));
    expect(d.sigma).toBe(0);
    expect(d.pull).toBeNull();
    expect(d.relative).toBeNull();
  });
});
