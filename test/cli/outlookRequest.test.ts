import { resolve } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { UsageError } from "../../src/cli/errors.js";
import {
  parseIssueDate,
  parseValuesOption,
  resolveOutlookDates,
  resolveOutlookRequest,
  monthRangeText,
  seasonOfIssueDate,
} from "../../src/cli/outlookRequest.js";
import { InputError } from "../../src/workspace/InputError.js";
import { loadWorkspace } from "../../src/workspace/loadWorkspace.js";
import type { Workspace } from "../../src/workspace/types.js";

// The fixture's index records run 1698–1712; dates are checked against a fixed "today".
let base: Workspace;
beforeAll(async () => {
  base = await loadWorkspace(resolve("test/fixtures/regions/valid"));
});

function withOutlook(outlook: { season?: number | null; issued?: string | null; values?: Record<string, number> }): Workspace {
  const values = Object.assign(Object.create(null) as Record<string, number>, outlook.values ?? {});
  return {
    ...base,
    settings: {
      ...base.settings,
      outlook: { season: outlook.season ?? null, issued: outlook.issued ?? null, values },
    },
  };
}

const day = (year: number, month: number, date: number): Date => new Date(year, month - 1, date);

describe("seasonOfIssueDate(date)", () => {
  it.each([
    [day(2027, 1, 1), 2027],
    [day(2027, 9, 30), 2027],
    [day(2027, 10, 1), 2028],
    [day(2026, 12, 3), 2027],
  ])("%s → season %i (next year from October)", (date, season) => {
    expect(seasonOfIssueDate(date)).toBe(season);
  });
});

describe("parseIssueDate(text, what)", () => {
  it("reads 2027-03-10 as the local calendar date", () => {
    const date = parseIssueDate("2027-03-10", "--issued");
    expect([date.getFullYear(), date.getMonth(), date.getDate()]).toEqual([2027, 2, 10]);
  });
  it("says 2027-02-30 does not exist, with the month's length", () => {
    expect(() => parseIssueDate("2027-02-30", "--issued")).toThrow(new UsageError("--issued: 2027-02-30 does not exist (February 2027 has 28 days)"));
  });
  it("knows 2028 is a leap year and 2100 is not", () => {
    expect(parseIssueDate("2028-02-29", "--issued").getDate()).toBe(29);
    expect(() => parseIssueDate("2100-02-29", "--issued")).toThrow(/February 2100 has 28 days/);
  });
  it("says month 13 does not exist and a non-date is not YYYY-MM-DD", () => {
    expect(() => parseIssueDate("2027-13-01", "--issued")).toThrow(/2027-13-01 does not exist \(there is no month 13\)/);
    expect(() => parseIssueDate("10/03/2027", "--issued")).toThrow(/expected a date as YYYY-MM-DD, found "10\/03\/2027"/);
  });
});

describe("resolveOutlookDates(workspace, options, today) with a fixed clock", () => {
  const today = day(1712, 2, 20); // a "today" just after the fixture's index records

  it("defaults to today and the issue year's season when region.json has no outlook block", () => {
    expect(resolveOutlookDates(withOutlook({}), {}, today)).toMatchObject({ issued: "1712-02-20", season: 1712, notes: [] });
  });

  it("takes next year's season for a today in October–December", () => {
    expect(resolveOutlookDates(withOutlook({}), {}, day(1711, 11, 5))).toMatchObject({ issued: "1711-11-05", season: 1712 });
  });

  it("uses region.json's issue date and season when they are for today's season or later (a later date is noted as dated ahead)", () => {
    const dates = resolveOutlookDates(withOutlook({ issued: "1712-03-01", season: 1712, values: { ENSO: 1 } }), {}, today);
    expect(dates).toMatchObject({ issued: "1712-03-01", season: 1712, useFileValues: true });
    expect(dates.notes.map((note) => note.code)).toEqual(["issued-ahead"]);
    expect(resolveOutlookDates(withOutlook({ issued: "1712-02-20", season: 1712, values: { ENSO: 1 } }), {}, today).notes).toEqual([]);
  });

  it("notes an issue date after today as dated ahead, with the days and what the files are read as, and does not refuse it", () => {
    const dates = resolveOutlookDates(withOutlook({}), { issued: "1712-03-10" }, today);
    expect(dates).toMatchObject({ issued: "1712-03-10", season: 1712 });
    expect(dates.notes).toEqual([
      {
        code: "issued-ahead",
        message:
          "dated ahead: issued 1712-03-10, 19 days after it was made on 1712-02-20; the index values are the files' as of 1712-02-20, with every month that ends before the issue date counted as complete",
      },
    ]);
    expect(resolveOutlookDates(withOutlook({}), { issued: "1712-02-21" }, today).notes[0]?.message).toMatch(/^dated ahead: issued 1712-02-21, 1 day after it was made on 1712-02-20;/);
    // Today and earlier are not ahead; a year ahead is still allowed (and noted), a day more refused.
    expect(resolveOutlookDates(withOutlook({}), { issued: "1712-02-20" }, today).notes).toEqual([]);
    expect(resolveOutlookDates(withOutlook({}), { issued: "1711-12-01" }, today).notes).toEqual([]);
    expect(resolveOutlookDates(withOutlook({}), { issued: "1713-02-20" }, today).notes.map((note) => note.code)).toEqual(["issued-ahead"]);
    expect(() => resolveOutlookDates(withOutlook({}), { issued: "1713-02-21" }, today)).toThrow(UsageError);
  });

  it("passes the dated-ahead note on to the outlook request (so outlook, brief and the JSON warnings carry it)", () => {
    const request = resolveOutlookRequest(withOutlook({}), { issued: "1712-03-10", values: "ENSO=1,NAO=0" }, today);
    expect(request.notes?.map((note) => note.code)).toEqual(["issued-ahead"]);
  });

  it("ignores last season's region.json date, season and values with notes naming them", () => {
    const dates = resolveOutlookDates(withOutlook({ issued: "1711-03-01", season: 1711, values: { ENSO: 1, NAO: 0.2 } }), {}, today);
    expect(dates.issued).toBe("1712-02-20");
    expect(dates.season).toBe(1712);
    expect(dates.useFileValues).toBe(false);
    expect(dates.notes.map((note) => note.code)).toEqual(["region-json-issued-ignored", "region-json-season-ignored", "values-for-another-season"]);
    expect(dates.notes[2]?.message).toBe(
      "region.json's values of ENSO, NAO were written for the 1711 season, not 1712: not used (this season's values come from the index files or --values)",
    );
  });

  it("takes --issued over region.json and --season over both", () => {
    const workspace = withOutlook({ issued: "1712-03-01", season: 1712, values: { ENSO: 1 } });
    expect(resolveOutlookDates(workspace, { issued: "1711-12-01" }, today)).toMatchObject({ issued: "1711-12-01", season: 1712, useFileValues: true, notes: [] });
    const early = resolveOutlookDates(workspace, { issued: "1711-03-01" }, today);
    expect(early).toMatchObject({ issued: "1711-03-01", season: 1712, useFileValues: true });
    expect(early.notes.map((note) => note.message)).toEqual([
      "the season 1712 comes from region.json; an outlook issued 1711-03-01 would otherwise be for 1711 (give --season to choose)",
    ]);
    const other = resolveOutlookDates(workspace, { season: "1711" }, today);
    expect(other).toMatchObject({ issued: "1712-03-01", season: 1711, useFileValues: false });
    expect(other.notes.map((note) => note.code)).toContain("values-for-another-season");
  });

  it("dates region.json's values by outlook.issued when outlook.season is absent, and notes values without either", () => {
    expect(resolveOutlookDates(withOutlook({ issued: "1711-10-15", values: { ENSO: 1 } }), {}, today)).toMatchObject({
      issued: "1711-10-15",
      season: 1712,
      valuesSeason: 1712,
      useFileValues: true,
    });
    const undated = resolveOutlookDates(withOutlook({ values: { ENSO: 1 } }), {}, today);
    expect(undated.useFileValues).toBe(true);
    expect(undated.notes.map((note) => note.code)).toEqual(["values-without-season"]);
  });

  it.each([
    [{ issued: "1713-02-21" }, "--issued: 1713-02-21 is more than a year after today (1712-02-20); an outlook cannot be issued that far ahead"],
    [{ issued: "1697-06-01" }, "--issued: 1697-06-01 is before the index records begin (1698); no outlook can be issued then"],
    [{ season: "1714" }, "--season: 1714 is more than a year after today's 1712 season (today is 1712-02-20)"],
    [{ season: "1690" }, "--season: 1690 is before the index records begin (1698)"],
    [{ issued: "1712-02-30" }, "--issued: 1712-02-30 does not exist (February 1712 has 29 days)"],
  ])("refuses %j as bad usage: %s", (options, message) => {
    expect(() => resolveOutlookDates(withOutlook({}), options, today)).toThrow(new UsageError(message));
  });

  it("accepts the edges of the range: a year after today and the first index year", () => {
    expect(resolveOutlookDates(withOutlook({}), { issued: "1713-02-20" }, today).season).toBe(1713);
    expect(resolveOutlookDates(withOutlook({}), { season: "1713" }, today).season).toBe(1713);
    expect(resolveOutlookDates(withOutlook({}), { season: "1698" }, today).season).toBe(1698);
  });

  it("reports an issue date in region.json more than a year ahead as bad input naming region.json", () => {
    const error: unknown = (() => {
      try {
        return resolveOutlookDates(withOutlook({ issued: "1714-01-01" }), {}, today);
      } catch (caught) {
        return caught;
      }
    })();
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).problems[0]?.file).toMatch(/region\.json$/);
    expect((error as InputError).problems[0]?.message).toMatch(/outlook\.issued 1714-01-01 is more than a year after today \(1712-02-20\)/);
  });
});

describe("parseValuesOption(lists, known)", () => {
  it("reads the Unicode minus sign U+2212 as a minus", () => {
    expect({ ...parseValuesOption(["ENSO=\u22121.25,NAO=0.4"], ["ENSO", "NAO"]) }).toEqual({ ENSO: -1.25, NAO: 0.4 });
  });
  it("refuses 1e200 with the reason, and keeps 1e6 and 1e-300", () => {
    expect(() => parseValuesOption(["ENSO=1e200"], ["ENSO"])).toThrow(
      new UsageError("--values: ENSO = 1e200 is beyond ±1,000,000, which no climate index reaches: check the value and its scale"),
    );
    expect(parseValuesOption(["ENSO=-1e6"], ["ENSO"]).ENSO).toBe(-1e6);
    expect(parseValuesOption(["ENSO=1e-300"], ["ENSO"]).ENSO).toBe(1e-300);
  });
  it("returns a record without a prototype, so constructor is only a name", () => {
    const values = parseValuesOption(["constructor=1.5"], ["constructor", "toString"]);
    expect(values.constructor).toBe(1.5);
    expect(values.toString).toBeUndefined();
    expect(() => parseValuesOption(["valueOf=1"], ["constructor"])).toThrow(/unknown index "valueOf"/);
  });
});

describe("resolveOutlookRequest(workspace, options, today)", () => {
  it("uses region.json's values for their season and --values over them", () => {
    const request = resolveOutlookRequest(withOutlook({ season: 1712, values: { ENSO: 1, NAO: 0.2 } }), { values: "ENSO=-0.7" }, day(1712, 2, 20));
    expect(request.values.ENSO).toBe(-0.7);
    expect(request.sources?.ENSO).toBe("--values");
    expect(request.sources?.NAO).toBe("region.json");
  });
});

describe("resolveOutlookRequest(workspace, options, today): values from the index files", () => {
  // Fixture files: indices.csv (yearly ENSO to 1712) and nao-monthly.csv (NAO, Dec-Mar window,
  // Dec 1709 −0.6, Jan 1710 1.0, Feb 1710 0.5, Mar 1710 0.0, nothing after).
  it("computes a provisional Dec–Mar mean in mid-March from Dec–Feb, and marks it in its details", () => {
    const request = resolveOutlookRequest(withOutlook({}), {}, day(1710, 3, 15));
    expect(request.season).toBe(1710);
    expect(request.values.ENSO).toBe(0.1);
    expect(request.sources?.ENSO).toBe("indices.csv, 1710");
    expect(request.values.NAO).toBeCloseTo((-0.6 + 1.0 + 0.5) / 3, 12);
    expect(request.sources?.NAO).toBe("nao-monthly.csv, Dec 1709–Feb 1710 (provisional)");
    expect(request.details?.NAO).toEqual({
      source: "nao-monthly.csv, Dec 1709–Feb 1710 (provisional)",
      window: "Dec-Mar",
      months: ["1709-12", "1710-01", "1710-02"],
      provisional: true,
    });
    expect(request.details?.ENSO).toEqual({ source: "indices.csv, 1710", window: null, months: [], provisional: false });
    // The outlook itself warns about a provisional value (from details); the request adds no note.
    expect(request.notes).toEqual([]);
  });

  it("uses the whole window once March is complete", () => {
    const request = resolveOutlookRequest(withOutlook({}), {}, day(1710, 4, 1));
    expect(request.values.NAO).toBeCloseTo((-0.6 + 1.0 + 0.5 + 0.0) / 4, 12);
    expect(request.sources?.NAO).toBe("nao-monthly.csv, Dec 1709–Mar 1710");
    expect(request.details?.NAO?.provisional).toBe(false);
    expect(request.notes).toEqual([]);
  });

  it("leaves out an index the file has no months for, with a note giving the reason and --values", () => {
    const request = resolveOutlookRequest(withOutlook({}), {}, day(1711, 2, 1));
    expect(Object.hasOwn(request.values, "NAO")).toBe(false);
    expect(request.values.ENSO).toBe(-0.1);
    const note = request.notes?.find((entry) => entry.code === "no-value-from-file");
    expect(note?.message).toMatch(/^NAO: no value for the 1711 season from nao-monthly\.csv: .*; give it with --values$/);
  });

  it("takes --values, then region.json of the same season, before the files", () => {
    const request = resolveOutlookRequest(withOutlook({ season: 1710, values: { NAO: 2 } }), { values: "ENSO=\u22120.9" }, day(1710, 4, 1));
    expect({ ...request.values }).toEqual({ ENSO: -0.9, NAO: 2 });
    expect({ ...request.sources }).toEqual({ ENSO: "--values", NAO: "region.json" });
  });

  it("computes from the files when region.json's values are from last season", () => {
    const request = resolveOutlookRequest(withOutlook({ season: 1709, values: { NAO: 2, ENSO: 3 } }), {}, day(1710, 4, 1));
    expect(request.values.ENSO).toBe(0.1);
    expect(request.sources?.NAO).toBe("nao-monthly.csv, Dec 1709–Mar 1710");
    expect(request.notes?.map((note) => note.code)).toEqual(["region-json-season-ignored", "values-for-another-season"]);
  });
});

describe("monthRangeText(months)", () => {
  it("joins consecutive months and starts a new range after a gap", () => {
    expect(monthRangeText(["2026-12", "2027-01", "2027-02"])).toBe("Dec 2026–Feb 2027");
    expect(monthRangeText(["2027-01"])).toBe("Jan 2027");
    expect(monthRangeText(["2026-12", "2027-02", "2027-03"])).toBe("Dec 2026, Feb 2027–Mar 2027");
    expect(monthRangeText([])).toBe("");
  });
});
