import { describe, expect, it } from "vitest";
import { fixedEvent } from "../../src/hindcast/fixedEvent.js";

describe("fixedEvent(years, activity, top, measure)", () => {
  it("threshold and terciles from every year: 10 years, top 0.2 → threshold 0.5 (ties all in), outcomes and shares", () => {
    const years = Array.from({ length: 10 }, (_, i) => 2001 + i);
    const values = [0, 0.5, 0.1, 0.5, 0, 0.2, 0.5, 0.1, 0, 0.3];
    const event = fixedEvent(years, new Map(years.map((year, i) => [year, values[i] as number])), 0.2, "fraction");
    // ceil(0.2 × 10) = 2nd highest is 0.5; the three years at 0.5 are all in.
    expect(event.threshold).toBe(0.5);
    expect(Array.from(event.fire)).toEqual([0, 1, 0, 1, 0, 0, 1, 0, 0, 0]);
    expect(event.baseRate).toBe(0.3);
    // Type-7 terciles of the sorted values [0,0,0,0.1,0.1,0.2,0.3,0.5,0.5,0.5]: h = 3 → 0.1; h = 6 → 0.3.
    expect(event.lowerCut).toBeCloseTo(0.1, 12);
    expect(event.upperCut).toBeCloseTo(0.3, 12);
    expect(Array.from(event.category)).toEqual([0, 2, 0, 2, 0, 1, 2, 0, 0, 1]);
    expect(event.shares).toEqual([0.5, 0.2, 0.3]);
  });

  it("a shuffle of the activity across years leaves the definition unchanged (outcomes move with their years)", () => {
    const years = Array.from({ length: 30 }, (_, i) => 1901 + i);
    const values = years.map((_, i) => [0, 0.1, 0.4, 0.4, 0.8][(i * 7) % 5] as number);
    const original = fixedEvent(years, new Map(years.map((year, i) => [year, values[i] as number])), 0.1, "fraction");
    const order = years.map((_, i) => (i * 11) % 30);
    const moved = fixedEvent(years, new Map(years.map((year, i) => [year, values[order[i] as number] as number])), 0.1, "fraction");
    expect([moved.threshold, moved.lowerCut, moved.upperCut, moved.baseRate]).toEqual([original.threshold, original.lowerCut, original.upperCut, original.baseRate]);
    years.forEach((_, i) => expect(moved.fire[i]).toBe(original.fire[order[i] as number]));
  });
});
