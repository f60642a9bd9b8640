import path from "node:path";
import { describe, expect, it } from "vitest";
import { runCalibration } from "../../src/calibrate/runCalibration.js";
import { toCalibrationJson } from "../../src/calibrate/toCalibrationJson.js";
import { readIndexCsv } from "../../src/workspace/indexCsv.js";
import { InputError, ProblemList } from "../../src/workspace/InputError.js";
import { loadWorkspace } from "../../src/workspace/loadWorkspace.js";
import type { IndexSettings } from "../../src/workspace/types.js";

// Invented regions (test/fixtures/regions/layout-*): the same monthly numbers written as a long
// CSV with empty cells, a wide CRLF CSV with lower-case month names and an annual column, and a
// whitespace text table with '#' title lines, numbered month columns, U+2212 minus signs and a
// declared -99.99 code. The layouts are those of climate centres' index tables (common practice,
// not a standard).
const fixture = (name: string): string => path.join("test", "fixtures", "regions", name);
const calibrationJson = async (name: string): Promise<string> => JSON.stringify(toCalibrationJson(runCalibration(await loadWorkspace(fixture(name)))));

const NAO: IndexSettings = { name: "NAO", file: "n.csv", column: "NAO", months: "Dec-Mar", phases: { kind: "terciles", labels: ["a", "b", "c"] }, missing: [], units: null };
const YEARLY: IndexSettings = { ...NAO, months: null };
const read = (text: string, indices: readonly IndexSettings[] = [NAO]) => {
  const problems = new ProblemList("n.csv");
  const result = readIndexCsv(Buffer.from(text, "utf8"), indices, problems, "n.csv");
  return { ...result, problems: problems.toArray() };
};
const header = "year,Jan,Feb,Mar,Apr,May,Jun,Jul,Aug,Sep,Oct,Nov,Dec";
const twelve = (first: number): string => Array.from({ length: 12 }, (_, m) => String(first + m)).join(",");

describe("index file layouts give the same calibration", () => {
  it("long, wide and whitespace tables of the same numbers give byte-identical calibration JSON", async () => {
    const long = await calibrationJson("layout-long");
    expect(await calibrationJson("layout-wide")).toBe(long);
    expect(await calibrationJson("layout-text-codes")).toBe(long);
  });

  it("a declared code reads as an empty cell: same seasonal series and raw months", async () => {
    const empty = await loadWorkspace(fixture("layout-wide"));
    const coded = await loadWorkspace(fixture("layout-text-codes"));
    expect(coded.indices).toEqual(empty.indices);
    const nao = coded.indices.find((series) => series.name === "NAO");
    expect(nao?.monthly?.find((m) => m.year === 1905 && m.month === 2)?.value).toBeNull();
    expect(nao?.values[nao.years.indexOf(1905)]).toBeNull();
  });

  it("an undeclared -99.99 is an error naming the file, line and the missing key", async () => {
    const root = fixture("layout-text-undeclared");
    const error = await loadWorkspace(root).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(InputError);
    const problems = (error as InputError).problems;
    // Feb 1905 is on line 3 (header) + 1905 − 1899 + 1 = line 10 of nao.txt
    expect(problems[0]).toEqual({
      file: path.join(root, "nao.txt"),
      line: 10,
      message:
        'NAO Feb 1905: the value -99.99 looks like a missing-value code (a common missing-value code); if it marks a missing value, declare it in region.json as "indices": { "NAO": { "missing": [-99.99] } }, or leave the cell empty',
    });
  });
});

describe("readIndexCsv(bytes, indices, problems, file): layouts", () => {
  it("reads a wide table by month names in any case, or by numbers 1-12, with extra columns ignored", () => {
    const rows = `${header},ANN\n1900,${twelve(1)},99\n1901,${twelve(13)},99\n`;
    const byName = read(rows);
    expect(byName.problems).toEqual([]);
    expect(byName.layout).toBe("wide");
    // Dec-Mar seasons 1900 (no Dec 1899), 1901 (Dec 1900 = 12, Jan-Mar 1901 = 13, 14, 15) and 1902 (Dec 1901 only)
    expect(byName.series[0]?.years).toEqual([1900, 1901, 1902]);
    expect(byName.series[0]?.values).toEqual([null, (12 + 13 + 14 + 15) / 4, null]);
    const byNumber = read(rows.replace(header, `YEAR,${twelve(1)}`));
    expect(byNumber.series).toEqual(byName.series);
  });

  it("refuses a wide table with a column, without months, or with month names missing", () => {
    expect(read(`${header}\n1900,${twelve(1)}\n`, [{ ...NAO, column: "X" }]).problems[0]?.message).toMatch(/"column" is not used with a wide monthly table/);
    expect(read(`${header}\n1900,${twelve(1)}\n`, [YEARLY]).problems[0]?.message).toMatch(/give "months" for index NAO/);
    expect(read("year,Jan,Feb,Mar,NAO\n1900,1,2,3,4\n").problems[0]?.message).toBe(
      "the header has month columns but not all twelve (missing: Apr, May, Jun, Jul, Aug, Sep, Oct, Nov, Dec); a wide table needs year and Jan…Dec",
    );
  });

  it("reports a repeated year of a wide table with both lines", () => {
    expect(read(`${header}\n1900,${twelve(1)}\n1900,${twelve(1)}\n`).problems).toEqual([{ file: "n.csv", line: 3, message: "year 1900 appears twice (lines 2 and 3)" }]);
  });

  it("reads a whitespace table: '#' lines skipped, runs of spaces and tabs, a short last row is missing months", () => {
    const text = `# title\n  Year\tJan Feb Mar Apr May Jun Jul Aug Sep Oct Nov Dec\n# note\n1900  ${twelve(1).replaceAll(",", "  ")}\n1901\t1 2 3\n`;
    const result = read(text);
    expect(result.problems).toEqual([]);
    expect(result.series[0]?.monthly?.filter((m) => m.year === 1901).map((m) => m.value)).toEqual([1, 2, 3, null, null, null, null, null, null, null, null, null]);
    // Dec 1900 = 12, Jan-Mar 1901 = 1, 2, 3; the empty Dec 1901 (not yet observed) adds no 1902 season.
    expect(result.series[0]?.values).toEqual([null, (12 + 1 + 2 + 3) / 4]);
  });

  it("reads U+2212 as a minus sign in every layout", () => {
    expect(read("year,NAO\n1900,\u22120.5\n1901,1.5e\u22121\n", [YEARLY]).series[0]?.values).toEqual([-0.5, 0.15]);
    expect(read("year,month,NAO\n1900,12,\u22121\n1901,1,1\n1901,2,\u22122\n1901,3,2\n").series[0]?.values).toEqual([0]);
  });

  it("a declared code is missing; other codes and far outliers are errors with file:line and the missing key", () => {
    const declared = read("year,NAO\n1900,-999\n1901,0.5\n", [{ ...YEARLY, missing: [-999] }]);
    expect(declared.problems).toEqual([]);
    expect(declared.series[0]?.values).toEqual([null, 0.5]);
    const undeclared = read("year,NAO\n1900,0.1\n1901,-9999\n1902,0.3\n1903,-999.0\n", [YEARLY]);
    expect(undeclared.problems.map((p) => p.line)).toEqual([3, 5]);
    expect(undeclared.problems[1]?.message).toContain('"indices": { "NAO": { "missing": [-999] } }');
    // 99 or more in size and at least 20 times the median size: refused; a real large-range index is not
    expect(read("year,NAO\n1900,0.5\n1901,-1.2\n1902,-99\n1903,0.8\n", [YEARLY]).problems[0]).toMatchObject({ line: 4 });
    expect(read("year,NAO\n1900,0.5\n1901,-1.2\n1902,-99\n1903,0.8\n", [YEARLY]).problems[0]?.message).toContain("far outside the rest of the series, whose median size is 1"); // median of 0.5, 0.8, 1.2, 99
    expect(read("year,P\n1900,150\n1901,210\n1902,99\n1903,400\n", [{ ...YEARLY, name: "P", column: "P" }]).problems).toEqual([]);
  });

  it("reads the example table of the README's 'Bring your own region' as published", () => {
    const table = [
      "# Invented monthly index, standardized; missing = -99.99",
      "YEAR   JAN    FEB    MAR    APR    MAY    JUN    JUL    AUG    SEP    OCT    NOV    DEC",
      "2025   0.41  \u22120.12   0.88   0.10  -0.35   0.22   0.05  -0.61   0.33   0.90   1.02   0.64",
      "2026   0.73   0.15 -99.99 -99.99 -99.99 -99.99 -99.99 -99.99 -99.99 -99.99 -99.99 -99.99",
    ].join("\n");
    const result = read(table, [{ ...NAO, missing: [-99.99] }]);
    expect(result.problems).toEqual([]);
    expect(result.layout).toBe("wide");
    expect(result.series[0]?.monthly?.slice(0, 3).map((m) => m.value)).toEqual([0.41, -0.12, 0.88]);
    expect(result.series[0]?.monthly?.filter((m) => m.value === null)).toHaveLength(10);
  });
});
