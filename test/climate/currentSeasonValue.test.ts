import { mean } from "simple-statistics";
import { describe, expect, it } from "vitest";
import { currentSeasonValue } from "../../src/climate/currentSeasonValue.js";
import { parseMonthWindow, seasonalValues, type MonthlyValue } from "../../src/climate/seasonalValues.js";
import type { IndexSeries, IndexSettings } from "../../src/workspace/types.js";

// Invented monthly values; all dates are fixed strings (no wall clock).
const settings = (months: string | null): IndexSettings => ({
  name: "X",
  file: "x.csv",
  column: "X",
  phases: { kind: "terciles", labels: ["low", "middle", "high"] },
  months,
  missing: [],
  units: null,
});

function monthlySeries(rows: readonly MonthlyValue[]): IndexSeries {
  return { name: "X", years: [], values: [], monthly: rows };
}

// Dec 2026 … Apr 2027 present in the file.
const rows: MonthlyValue[] = [
  { year: 2026, month: 11, value: 9 },
  { year: 2026, month: 12, value: 1 },
  { year: 2027, month: 1, value: 2 },
  { year: 2027, month: 2, value: 3 },
  { year: 2027, month: 3, value: 4 },
  { year: 2027, month: 4, value: 5 },
];

describe("currentSeasonValue(series, settings, season, issued)", () => {
  it("gives the complete window's mean once its last month has ended (Mar 2027 counts from 2027-04-01)", () => {
    const result = currentSeasonValue(monthlySeries(rows), settings("Dec-Mar"), 2027, "2027-04-01");
    expect(result).toEqual({ value: 2.5, window: "Dec-Mar", months: ["2026-12", "2027-01", "2027-02", "2027-03"], missingMonths: [], provisional: false });
  });

  it("equals the calibration's seasonal mean for a complete window (same arithmetic)", () => {
    const window = parseMonthWindow("Dec-Mar");
    if (window === null) throw new Error("window");
    const seasonal = seasonalValues(rows, window);
    const calibrated = seasonal.values[seasonal.years.indexOf(2027)];
    expect(currentSeasonValue(monthlySeries(rows), settings("Dec-Mar"), 2027, "2027-06-30").value).toBe(calibrated);
  });

  it("does not count the month of the issue date, even when the file already holds it", () => {
    const result = currentSeasonValue(monthlySeries(rows), settings("Dec-Mar"), 2027, "2027-03-31");
    expect(result.provisional).toBe(true);
    expect(result.value).toBe(2); // (1 + 2 + 3) / 3
    expect(result.months).toEqual(["2026-12", "2027-01", "2027-02"]);
    expect(result.missingMonths).toEqual(["2027-03"]);
    expect(result.reason).toContain("Mar 2027 is not complete on 2027-03-31");
  });

  it("is provisional from ceil(L/2) months: 2 of 4 on 2027-02-01", () => {
    const result = currentSeasonValue(monthlySeries(rows), settings("Dec-Mar"), 2027, "2027-02-01");
    expect(result).toMatchObject({ value: 1.5, provisional: true, months: ["2026-12", "2027-01"], missingMonths: ["2027-02", "2027-03"] });
  });

  it("is null below half the window: only Dec of Dec-Mar on 2027-01-15", () => {
    const result = currentSeasonValue(monthlySeries(rows), settings("Dec-Mar"), 2027, "2027-01-15");
    expect(result.value).toBeNull();
    expect(result.provisional).toBe(false);
    expect(result.months).toEqual(["2026-12"]);
    expect(result.reason).toMatch(/^only Dec 2026 of Dec-Mar 2027 is available on 2027-01-15 \(at least 2 of its 4 months are needed/);
  });

  it("is null with no month at all: Dec-Mar 2027 asked on 2026-12-03", () => {
    const result = currentSeasonValue(monthlySeries(rows), settings("Dec-Mar"), 2027, "2026-12-03");
    expect(result.value).toBeNull();
    expect(result.missingMonths).toEqual(["2026-12", "2027-01", "2027-02", "2027-03"]);
    expect(result.reason).toContain("no month of Dec-Mar 2027 is available on 2026-12-03");
  });

  it("odd windows need ceil(L/2): 2 of 3 months, not 1", () => {
    expect(currentSeasonValue(monthlySeries(rows), settings("Jan-Mar"), 2027, "2027-02-10").value).toBeNull();
    expect(currentSeasonValue(monthlySeries(rows), settings("Jan-Mar"), 2027, "2027-03-01")).toMatchObject({ value: 2.5, provisional: true });
  });

  it("a month the file leaves empty (or a declared code read as empty) is missing, and the reason says so", () => {
    const gap = rows.map((r) => (r.year === 2027 && r.month === 1 ? { ...r, value: null } : r));
    const result = currentSeasonValue(monthlySeries(gap), settings("Dec-Mar"), 2027, "2027-05-01");
    expect(result).toMatchObject({ value: (1 + 3 + 4) / 3, provisional: true, missingMonths: ["2027-01"] });
    expect(result.reason).toContain("Jan 2027 has no value in the index file");
  });

  it("a one-month window is complete or null, never provisional", () => {
    expect(currentSeasonValue(monthlySeries(rows), settings("Feb"), 2027, "2027-02-28").value).toBeNull();
    expect(currentSeasonValue(monthlySeries(rows), settings("Feb"), 2027, "2027-03-01")).toMatchObject({ value: 3, provisional: false });
  });

  it("reads a yearly file's value for the season, or null with a reason", () => {
    const yearly: IndexSeries = { name: "X", years: [2025, 2026, 2027], values: [0.5, null, -1.25] };
    expect(currentSeasonValue(yearly, settings(null), 2027, "2027-03-10")).toEqual({ value: -1.25, window: null, months: [], missingMonths: [], provisional: false });
    expect(currentSeasonValue(yearly, settings(null), 2026, "2027-03-10")).toMatchObject({ value: null, reason: "the index file has no value for 2026" });
    expect(currentSeasonValue(yearly, settings(null), 2028, "2027-03-10").value).toBeNull();
  });

  it("throws on an issue date that does not exist or is not YYYY-MM-DD", () => {
    expect(() => currentSeasonValue(monthlySeries(rows), settings("Dec-Mar"), 2027, "2027-02-30")).toThrow(/does not exist/);
    expect(() => currentSeasonValue(monthlySeries(rows), settings("Dec-Mar"), 2027, "10/03/2027")).toThrow(RangeError);
  });

  it("a provisional value is the arithmetic mean of the months present (checked against simple-statistics)", () => {
    const result = currentSeasonValue(monthlySeries(rows), settings("Nov-Apr"), 2027, "2027-03-15");
    // Nov 2026 … Feb 2027 present (9, 1, 2, 3): 4 of 6 months ≥ ceil(6 / 2) = 3
    expect(result.provisional).toBe(true);
    expect(result.value).toBeCloseTo(mean([9, 1, 2, 3]), 12);
    expect(result.missingMonths).toEqual(["2027-03", "2027-04"]);
  });
});
