import { addMonths } from "date-fns/addMonths";
import fc from "fast-check";
import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { parseMonthWindow, seasonalValues, seasonMonths, seasonYearOf, type MonthWindow } from "../../src/climate/seasonalValues.js";

const window = (text: string): MonthWindow => {
  const parsed = parseMonthWindow(text);
  if (parsed === null) throw new Error(`bad window ${text}`);
  return parsed;
};

describe("parseMonthWindow(text)", () => {
  it('parseMonthWindow("Dec-Mar") → months 12…3, length 4; single months and any letter case', () => {
    expect(parseMonthWindow("Dec-Mar")).toEqual({ text: "Dec-Mar", firstMonth: 12, lastMonth: 3, length: 4 });
    expect(parseMonthWindow("jan-MAR")).toEqual({ text: "Jan-Mar", firstMonth: 1, lastMonth: 3, length: 3 });
    expect(parseMonthWindow("Jul")).toEqual({ text: "Jul", firstMonth: 7, lastMonth: 7, length: 1 });
    expect(parseMonthWindow("Feb-Jan")?.length).toBe(12);
  });
  it("returns null for anything else", () => {
    for (const text of ["", "Winter", "Dec-", "Dez-Mar", "12-3", "Dec–Mar"]) expect(parseMonthWindow(text)).toBeNull();
  });
});

describe("seasonMonths(window, seasonYear) and seasonYearOf(window, year, month)", () => {
  it("a Dec-Mar window crossing the new year belongs to the year of its last month (Dec 1997–Mar 1998 → 1998)", () => {
    expect(seasonMonths(window("Dec-Mar"), 1998)).toEqual([
      { year: 1997, month: 12 },
      { year: 1998, month: 1 },
      { year: 1998, month: 2 },
      { year: 1998, month: 3 },
    ]);
    expect(seasonYearOf(window("Dec-Mar"), 1997, 12)).toBe(1998);
    expect(seasonYearOf(window("Dec-Mar"), 1998, 3)).toBe(1998);
    expect(seasonYearOf(window("Dec-Mar"), 1998, 4)).toBeNull();
  });
  it("works for years 0–99 and before the common era (no 1900 offset)", () => {
    expect(seasonMonths(window("Nov-Feb"), 50)).toEqual([
      { year: 49, month: 11 },
      { year: 49, month: 12 },
      { year: 50, month: 1 },
      { year: 50, month: 2 },
    ]);
    expect(seasonYearOf(window("Dec-Mar"), -1, 12)).toBe(0);
  });

  it("agrees with date-fns calendar arithmetic (addMonths) for every window and years −9999…9999", () => {
    const names = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 11 }), fc.integer({ min: 0, max: 11 }), fc.integer({ min: -9999, max: 9999 }), (first, last, year) => {
        const w = window(first === last ? names[first]! : `${names[first]}-${names[last]}`);
        const end = new Date(2000, 0, 1, 12);
        end.setFullYear(year, w.lastMonth - 1, 1);
        const expected = Array.from({ length: w.length }, (_, i) => {
          const date = addMonths(end, i - (w.length - 1));
          return { year: date.getFullYear(), month: date.getMonth() + 1 };
        });
        expect(seasonMonths(w, year)).toEqual(expected);
        for (const month of expected) expect(seasonYearOf(w, month.year, month.month)).toBe(year);
      }),
      { seed: 20261203, numRuns: 300 },
    );
  });
});

describe("seasonalValues(monthly, window)", () => {
  it("means the window's months: Dec 1997 = 1, Jan–Mar 1998 = 2, 3, 4 → 1998: 2.5", () => {
    const monthly = [
      { year: 1997, month: 12, value: 1 },
      { year: 1998, month: 1, value: 2 },
      { year: 1998, month: 2, value: 3 },
      { year: 1998, month: 3, value: 4 },
      { year: 1998, month: 7, value: 100 },
    ];
    expect(seasonalValues(monthly, window("Dec-Mar"))).toEqual({ years: [1998], values: [2.5], incomplete: [] });
  });
  it("leaves a season with a missing month (empty cell or absent row) null and lists the months", () => {
    const monthly = [
      { year: 1997, month: 12, value: 1 },
      { year: 1998, month: 1, value: null },
      { year: 1998, month: 2, value: 3 },
      { year: 1998, month: 3, value: 4 },
      { year: 1999, month: 1, value: 1 },
      { year: 1999, month: 2, value: 1 },
      { year: 1999, month: 3, value: 1 },
    ];
    const result = seasonalValues(monthly, window("Dec-Mar"));
    expect(result.years).toEqual([1998, 1999]);
    expect(result.values).toEqual([null, null]);
    expect(result.incomplete).toEqual([
      { year: 1998, missing: [{ year: 1998, month: 1 }] },
      { year: 1999, missing: [{ year: 1998, month: 12 }] },
    ]);
  });
  it("is empty when no month falls in the window, and throws RangeError on a repeated or invalid month", () => {
    expect(seasonalValues([{ year: 1998, month: 7, value: 1 }], window("Dec-Mar"))).toEqual({ years: [], values: [], incomplete: [] });
    expect(() => seasonalValues([{ year: 1998, month: 13, value: 1 }], window("Dec-Mar"))).toThrow(RangeError);
    expect(() =>
      seasonalValues(
        [
          { year: 1998, month: 1, value: 1 },
          { year: 1998, month: 1, value: 2 },
        ],
        window("Dec-Mar"),
      ),
    ).toThrow(RangeError);
  });

  it("each complete season's value equals jStat.mean of its months (fast-check, independent library)", () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -5, max: 5, noNaN: true }), { minLength: 24, maxLength: 24 }), fc.constantFrom("Dec-Mar", "Jun-Aug", "Oct-Sep"), (values, text) => {
        const monthly = values.map((value, i) => ({ year: 2000 + Math.floor(i / 12), month: (i % 12) + 1, value }));
        const w = window(text);
        const result = seasonalValues(monthly, w);
        result.years.forEach((year, i) => {
          const value = result.values[i];
          if (value === null || value === undefined) return;
          const months = seasonMonths(w, year).map((m) => values[(m.year - 2000) * 12 + m.month - 1] as number);
          expect(value).toBeCloseTo(jStat.mean(months), 12);
        });
      }),
      { numRuns: 200, seed: 3 },
    );
  });
});
