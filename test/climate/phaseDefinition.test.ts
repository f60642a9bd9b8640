import { describe, expect, it } from "vitest";
import { classifyPhase, isNearBoundary, phaseDefinition } from "../../src/climate/phaseDefinition.js";

describe("classifyPhase(value, cuts)", () => {
  // ENSO threshold convention, inclusive form: warm when ≥ +0.5, cold when ≤ −0.5 (NOAA Climate Prediction Center, Oceanic Niño Index episode threshold ±0.5 °C)
  it("is inclusive at the outer phases", () => {
    expect(classifyPhase(-0.5, [-0.5, 0.5])).toBe(0);
    expect(classifyPhase(0.5, [-0.5, 0.5])).toBe(2);
    expect(classifyPhase(0.49, [-0.5, 0.5])).toBe(1);
    expect(classifyPhase(-0.49, [-0.5, 0.5])).toBe(1);
  });
  it("puts a value on an interior cut of a four-phase rule in the lower phase", () => {
    expect(classifyPhase(0, [-1, 0, 1])).toBe(1);
    expect(classifyPhase(0.01, [-1, 0, 1])).toBe(2);
    expect(classifyPhase(1, [-1, 0, 1])).toBe(3);
  });
  it("flags a value within the margin of a cut", () => {
    expect(isNearBoundary(0.45, [-0.5, 0.5], 0.1)).toBe(true);
    expect(isNearBoundary(0.2, [-0.5, 0.5], 0.1)).toBe(false);
  });
});

describe("phaseDefinition(settings, values)", () => {
  it("uses type-7 terciles of the calibration values (1..30 → 10.667 / 20.333)", () => {
    const definition = phaseDefinition(
      { name: "X", file: "f", column: "X", phases: { kind: "terciles", labels: ["a", "b", "c"] }, months: null },
      Array.from({ length: 30 }, (_, i) => 30 - i),
    );
    expect(definition.cuts[0]).toBeCloseTo(10.6667, 4);
    expect(definition.cuts[1]).toBeCloseTo(20.3333, 4);
  });
});
