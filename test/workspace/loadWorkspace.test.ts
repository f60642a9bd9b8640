import path from "node:path";
import { describe, expect, it } from "vitest";
import { DEFAULT_METHODS, loadWorkspace } from "../../src/workspace/loadWorkspace.js";
import { InputError, type InputProblem } from "../../src/workspace/InputError.js";

const fixtures = "test/fixtures/regions";
const region = (name: string): string => path.join(fixtures, name);

/** The problems thrown by loadWorkspace for a fixture (fails the test if it loads). */
async function problemsOf(name: string): Promise<readonly InputProblem[]> {
  try {
    await loadWorkspace(region(name));
  } catch (error) {
    expect(error).toBeInstanceOf(InputError);
    return (error as InputError).problems;
  }
  throw new Error(`${name} loaded without problems`);
}

describe("loadWorkspace(root) on a valid region", () => {
  it("loadWorkspace('valid') reads 4 sites, 10 events, a yearly and a monthly index, with defaults filled in", async () => {
    const workspace = await loadWorkspace(region("valid"));
    expect(workspace.root).toBe(path.resolve(region("valid")));
    expect(workspace.settings.name).toBe("Test Ridge");
    expect(workspace.settings.methods).toEqual(DEFAULT_METHODS);
    expect(workspace.settings.fireYears).toEqual({ top: 0.1, measure: "fraction", minSitesRecording: 3 });
    expect(workspace.settings.seed).toBe(1);
    expect(workspace.settings.calibration).toBeNull();
    expect(workspace.settings.indices.map((i) => [i.name, i.column, i.months])).toEqual([
      ["ENSO", "ENSO", null],
      ["NAO", "NAO", "Dec-Mar"],
    ]);
    expect(workspace.settings.indices[1]?.phases).toEqual({ kind: "terciles", labels: ["low", "middle", "high"] });
    if (workspace.fireRecord.kind !== "sites") throw new Error("expected sites");
    expect(workspace.fireRecord.sites.map((s) => s.id)).toEqual(["A", "B", "C", "D"]);
    expect(workspace.fireRecord.sites[0]).toEqual({ id: "A", name: "Upper Bench", latitude: 45, longitude: -140, firstYear: 1700, lastYear: 1710 });
    expect(workspace.fireRecord.events).toHaveLength(10);
    expect(workspace.modern).toBeNull();
  });

  it("reads the yearly ENSO column with an empty cell as null", async () => {
    const workspace = await loadWorkspace(region("valid"));
    const enso = workspace.indices[0];
    expect(enso?.years[0]).toBe(1698);
    expect(enso?.years).toHaveLength(15);
    expect(enso?.values.slice(0, 6)).toEqual([0.2, -0.8, 1.1, 0.4, -0.3, null]);
  });

  it("averages the monthly NAO over Dec-Mar into the year of March, and warns for the season missing Feb 1706", async () => {
    const workspace = await loadWorkspace(region("valid"));
    const nao = workspace.indices[1];
    // Season 1701 = Dec 1700, Jan, Feb, Mar 1701: lines 2–5 of nao-monthly.csv hold 0.6, 0.1, -0.4, -0.9
    expect(nao?.years[0]).toBe(1701);
    expect(nao?.values[0]).toBeCloseTo((0.6 + 0.1 - 0.4 - 0.9) / 4, 12);
    expect(nao?.years).toEqual([1701, 1702, 1703, 1704, 1705, 1706, 1707, 1708, 1709, 1710]);
    expect(nao?.values[5]).toBeNull();
    expect(workspace.warnings).toEqual([
      expect.objectContaining({ code: "season-missing-month", message: expect.stringContaining("1706 (Feb 1706)") }),
    ]);
  });

  it("records role, relative path, byte size and SHA-256 of every input file", async () => {
    const workspace = await loadWorkspace(region("valid"));
    expect(workspace.files.map((f) => [f.role, f.path])).toEqual([
      ["region", "region.json"],
      ["sites", "fire-sites.csv"],
      ["events", "fire-events.csv"],
      ["index:ENSO", "indices.csv"],
      ["index:NAO", "nao-monthly.csv"],
    ]);
    for (const file of workspace.files) expect(file.sha256).toMatch(/^[0-9a-f]{64}$/);
    const { createHash } = await import("node:crypto");
    const { readFileSync, statSync } = await import("node:fs");
    const sites = path.join(region("valid"), "fire-sites.csv");
    expect(workspace.files[1]?.sha256).toBe(createHash("sha256").update(readFileSync(sites)).digest("hex"));
    expect(workspace.files[1]?.bytes).toBe(statSync(sites).size);
  });

  it("accepts a BOM, CRLF line ends and quoted fields with commas and doubled quotes", async () => {
    const workspace = await loadWorkspace(region("bom-crlf-quoted"));
    if (workspace.fireRecord.kind !== "sites") throw new Error("expected sites");
    expect(workspace.fireRecord.sites.map((s) => s.name)).toEqual(["Upper Bench", "Upper Bench, Col", 'Long "Old" Terrace', "Lower Flat"]);
    expect(workspace.fireRecord.events).toHaveLength(10);
  });

  it("reads an already composited record (fire-activity.csv)", async () => {
    const workspace = await loadWorkspace(region("activity-valid"));
    expect(workspace.fireRecord).toEqual({
      kind: "activity",
      rows: expect.arrayContaining([{ year: 1704, sitesRecording: 4, sitesBurned: 3 }]),
    });
    expect(workspace.files.map((f) => f.role)).toEqual(["region", "activity", "index:ENSO", "index:NAO"]);
  });

  it("counts a repeated (site, year) event once and warns", async () => {
    const workspace = await loadWorkspace(region("duplicate-event"));
    if (workspace.fireRecord.kind !== "sites") throw new Error("expected sites");
    expect(workspace.fireRecord.events).toHaveLength(10);
    expect(workspace.warnings.map((w) => w.code)).toContain("duplicate-event");
    expect(workspace.warnings.find((w) => w.code === "duplicate-event")?.message).toContain("A 1704 (lines 3 and 12)");
  });
});

describe("loadWorkspace(root) reports every rule as file:line: message (found)", () => {
  const file = (name: string, csv: string): string => path.join(fixtures, name, csv);
  const cases: [string, InputProblem][] = [
    ["bad-latitude", { file: file("bad-latitude", "fire-sites.csv"), line: 4, message: 'latitude must be between -90 and 90 (found "95")' }],
    ["span-reversed", { file: file("span-reversed", "fire-sites.csv"), line: 5, message: "first_year must not be after last_year (found 1711 > 1710)" }],
    [
      "event-outside-span",
      { file: file("event-outside-span", "fire-events.csv"), line: 12, message: 'fire year 1709 is outside the recording span of site "C" (found 1700–1705 in fire-sites.csv)' },
    ],
    ["unknown-site", { file: file("unknown-site", "fire-events.csv"), line: 12, message: 'unknown site "E" (not in fire-sites.csv)' }],
    ["duplicate-site", { file: file("duplicate-site", "fire-sites.csv"), line: 6, message: 'site "B" appears twice (lines 3 and 6)' }],
    ["duplicate-index-year", { file: file("duplicate-index-year", "indices.csv"), line: 17, message: "year 1700 appears twice (lines 4 and 17)" }],
    ["not-a-number", { file: file("not-a-number", "fire-events.csv"), line: 4, message: 'year must be an integer (found "17x8")' }],
    ["empty-file", { file: file("empty-file", "fire-events.csv"), line: null, message: "the file is empty" }],
    ["binary-file", { file: file("binary-file", "fire-sites.csv"), line: 2, message: "the file is not text (found a NUL byte)" }],
    ["invalid-utf8", { file: file("invalid-utf8", "fire-sites.csv"), line: 6, message: "the file is not UTF-8 text (found an invalid byte sequence)" }],
    ["missing-column", { file: file("missing-column", "fire-events.csv"), line: 1, message: 'missing column "year" (found columns: site, yr)' }],
    ["missing-file", { file: file("missing-file", "fire-events.csv"), line: null, message: "the file does not exist" }],
    ["comment-line", { file: file("comment-line", "indices.csv"), line: 1, message: 'comment lines are not allowed (found "# ENSO index, seasonal")' }],
    [
      "missing-index-column",
      { file: file("missing-index-column", "indices.csv"), line: 1, message: 'missing column "PDO" named in region.json (found columns: year, ENSO, OTHER)' },
    ],
    ["unknown-key", { file: file("unknown-key", "region.json"), line: 31, message: 'unknown key "seaDraw" in "methods" (did you mean "seaDraws"?)' }],
    ["bad-json", { file: file("bad-json", "region.json"), line: 3, message: 'invalid JSON: expected "," or "}" (found "\\"")' }],
    ["month-out-of-range", { file: file("month-out-of-range", "nao-monthly.csv"), line: 42, message: 'month must be between 1 and 12 (found "13")' }],
    [
      "yearly-monthly-mismatch",
      {
        file: file("yearly-monthly-mismatch", "nao-monthly.csv"),
        line: 1,
        message: 'this is a monthly file (it has a "month" column): give "months" for index NAO in region.json, e.g. "Dec-Mar"',
      },
    ],
  ];
  it.each(cases)("loadWorkspace('%s') throws InputError with exactly that problem", async (name, expected) => {
    expect(await problemsOf(name)).toEqual([expected]);
  });

  it("reports all problems of a composited record at once (sites_burned > sites_recording, a negative count)", async () => {
    const activity = file("activity-bad-counts", "fire-activity.csv");
    expect(await problemsOf("activity-bad-counts")).toEqual([
      { file: activity, line: 7, message: "sites_burned must not exceed sites_recording (found 5 > 4)" },
      { file: activity, line: 9, message: 'sites_recording must be at least 0 (found "-1")' },
    ]);
  });

  it("lists 20 problems of a file, then 'and 5 more problems'", async () => {
    const problems = await problemsOf("many-problems");
    expect(problems).toHaveLength(21);
    expect(problems[0]).toEqual({ file: file("many-problems", "fire-events.csv"), line: 2, message: 'year must be an integer (found "bad0")' });
    expect(problems[20]).toEqual({ file: file("many-problems", "fire-events.csv"), line: null, message: "and 5 more problems" });
  });

  it("names region.json in a folder that does not exist", async () => {
    const root = path.join(fixtures, "no-such-region");
    await expect(loadWorkspace(root)).rejects.toMatchObject({
      problems: [{ file: path.join(root, "region.json"), line: null, message: `the file does not exist (is ${root} a region folder?)` }],
    });
  });
});
