import { describe, expect, it } from "vitest";
import { sinceLastBriefing } from "../../src/review/sinceLastBriefing.js";
import type { KeptOutlook } from "../../src/review/types.js";

const kept = (season: number, issued: string, probability: number, extra: Partial<KeptOutlook> = {}): KeptOutlook => ({
  file: `issued/${season}-${issued}.json`,
  schema: "firephase.outlook/1",
  issued,
  season,
  probability,
  lower: null,
  upper: null,
  baseRate: null,
  categories: null,
  phases: [],
  values: [],
  ...extra,
});

describe("sinceLastBriefing(current, kept)", () => {
  const now = kept(2027, "2027-03-10", 0.25, {
    phases: [
      { index: "ENSO", label: "warm" },
      { index: "NAO", label: "neutral" },
    ],
    values: [
      { index: "ENSO", value: 1.3 },
      { index: "NAO", value: 0.2 },
    ],
    categories: { below: 0.2, near: 0.3, above: 0.5 },
  });

  it("compares with the latest earlier outlook of the same season and lists changed phases and values", () => {
    const february = kept(2027, "2027-02-01", 0.12, {
      phases: [
        { index: "ENSO", label: "neutral" },
        { index: "NAO", label: "neutral" },
      ],
      values: [
        { index: "ENSO", value: 0.4 },
        { index: "NAO", value: -0.1 },
      ],
      categories: { below: 0.3, near: 0.4, above: 0.3 },
    });
    const january = kept(2027, "2027-01-05", 0.1);
    const result = sinceLastBriefing(now, [january, february, kept(2026, "2026-03-01", 0.3)]);
    expect(result?.previous).toEqual({ season: 2027, issued: "2027-02-01", file: "issued/2027-2027-02-01.json" });
    expect(result?.relation).toBe("same season");
    expect(result?.phases).toEqual([{ index: "ENSO", before: "neutral", now: "warm" }]);
    expect(result?.values).toEqual([
      { index: "ENSO", before: 0.4, now: 1.3 },
      { index: "NAO", before: -0.1, now: 0.2 },
    ]);
    expect(result?.fireYear).toEqual({ before: 0.12, now: 0.25 });
    expect(result?.categories?.before.near).toBe(0.4);
    expect(result?.sentence).toBe(
      "Since the outlook of 2027-02-01: ENSO moved from neutral to warm; NAO \u22120.10 → 0.20 within the same phase; the chance of a high-fire year rose from 12% to 25%.",
    );
  });

  it("falls back on the previous season's latest outlook, and skips the current one and later ones", () => {
    const result = sinceLastBriefing(now, [now, kept(2027, "2027-04-01", 0.4), kept(2026, "2026-02-01", 0.2), kept(2026, "2026-03-01", 0.25, { phases: [{ index: "ENSO", label: "warm" }], values: [{ index: "ENSO", value: 1.3 }] })]);
    expect(result?.relation).toBe("previous season");
    expect(result?.previous.issued).toBe("2026-03-01");
    expect(result?.sentence).toBe(
      "Since the outlook of 2026-03-01 for the 2026 season: NAO now neutral (no phase then); the chance of a high-fire year is unchanged at 25%.",
    );
  });

  it("is null when no outlook of this or the previous season was kept before", () => {
    expect(sinceLastBriefing(now, [kept(2025, "2025-03-01", 0.2), now])).toBeNull();
  });
});
