import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { readCsvTable } from "../../src/workspace/csvTable.js";
import { parseDecimal, readInteger } from "../../src/workspace/fields.js";
import { readEventsCsv } from "../../src/workspace/fireRecordCsv.js";
import { readIndexCsv } from "../../src/workspace/indexCsv.js";
import { ProblemList } from "../../src/workspace/InputError.js";
import type { IndexSettings } from "../../src/workspace/types.js";

// The readers take fast paths for plainly written files (a CSV text without double quotes is
// split with indexOf; a table whose rows all have the header's fields is checked by one regular
// expression; plainly written numbers are read by JSON.parse). Quoting one header name makes the
// same table take the general path, character by character and cell by cell: both must give
// exactly the same result, problems and lines included.

/** A result as text, with −0 and non-finite numbers kept apart. */
const show = (value: unknown): string =>
  JSON.stringify(value, (_, x: unknown) => (typeof x === "number" && (Object.is(x, -0) || !Number.isFinite(x)) ? `number ${Object.is(x, -0) ? "-0" : String(x)}` : x));

function outcome(read: (problems: ProblemList) => unknown): string {
  const problems = new ProblemList("f.csv");
  const result = read(problems);
  return show({ result, problems: problems.toArray(), count: problems.size });
}

/** The same table with its first header name in double quotes: no fast path applies. */
const quoteFirstName = (text: string): string => text.replace(/^([^,\r\n]+)/, '"$1"');

const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];
const index = (name: string, months: string | null, missing?: number[]): IndexSettings => ({
  name,
  file: "f.csv",
  column: name,
  months,
  phases: { kind: "terciles", labels: ["a", "b", "c"] },
  ...(missing === undefined ? {} : { missing }),
});

const value = fc.oneof(
  { weight: 20, arbitrary: fc.integer({ min: -300, max: 300 }).map((n) => (n / 100).toFixed(2)) },
  { weight: 1, arbitrary: fc.constantFrom("", "-0", "0", "-99.99", "-999", "150", "12345678901234567", "1e3", "+1", ".5", "5.", " 0.5", "x", "\u22120.5") },
);
const yearsOf = fc
  .tuple(fc.integer({ min: -5, max: 2020 }), fc.integer({ min: 1, max: 12 }), fc.constantFrom("ascending", "descending", "repeat", "out of range"))
  .map(([first, count, order]) => {
    const years = Array.from({ length: count }, (_, i) => String(first + i));
    if (order === "descending") years.reverse();
    if (order === "repeat" && count > 1) years[count - 1] = years[0] as string;
    if (order === "out of range") years[count - 1] = "10000";
    return years;
  });
const eol = fc.constantFrom("\n", "\r\n");

const longFile = fc.tuple(yearsOf, fc.array(value, { minLength: 300, maxLength: 300 }), eol, fc.boolean()).map(([years, values, end, lastNewline]) => {
  let k = 0;
  const rows = years.flatMap((year) => MONTHS.map((_, m) => `${year},${m + 1},${values[k++ % 300]},${values[(k * 7) % 300]}`));
  return { text: ["year,month,ENSO,WSI", ...rows].join(end) + (lastNewline ? end : ""), indices: [index("ENSO", "Dec-Feb", [-99.99]), index("WSI", "Jul")] };
});
const wideFile = fc.tuple(yearsOf, fc.array(value, { minLength: 150, maxLength: 150 }), eol).map(([years, values, end]) => {
  let k = 0;
  const rows = years.map((year) => [year, ...MONTHS.map(() => values[k++ % 150])].join(","));
  return { text: [["year", ...MONTHS].join(","), ...rows].join(end) + end, indices: [index("PMI", "Dec-Mar", [-99.99]), index("P2", "Jun")] };
});
const yearlyFile = fc.tuple(yearsOf, fc.array(value, { minLength: 30, maxLength: 30 }), eol).map(([years, values, end]) => ({
  text: ["year,ENSO,NAO", ...years.map((year, i) => `${year},${values[i % 30]},${values[(i * 3 + 1) % 30]}`)].join(end) + end,
  indices: [index("ENSO", null), index("NAO", null, [150])],
}));

describe("fast paths and general path give the same result (fast-check)", () => {
  it("readIndexCsv: long, wide and yearly files, LF and CRLF, with odd cells, repeated and out-of-range years", () => {
    fc.assert(
      fc.property(fc.oneof(longFile, wideFile, yearlyFile), ({ text, indices }) => {
        const fast = outcome((problems) => readIndexCsv(Buffer.from(text, "utf8"), indices, problems, "f.csv"));
        const general = outcome((problems) => readIndexCsv(Buffer.from(quoteFirstName(text), "utf8"), indices, problems, "f.csv"));
        expect(fast).toBe(general);
      }),
      { numRuns: 1500, seed: 1401 },
    );
  });

  it("readEventsCsv: plain rows, blank and comment lines, rows of the wrong length", () => {
    const line = fc.oneof(
      { weight: 10, arbitrary: fc.tuple(fc.constantFrom("T01", "T02", "", " T03 "), fc.constantFrom("1750", "1751", "x", "")).map(([site, year]) => `${site},${year}`) },
      { weight: 1, arbitrary: fc.constantFrom("", "  ", "# note", "T01", "T01,1750,extra") },
    );
    fc.assert(
      fc.property(fc.array(line, { maxLength: 30 }), eol, (lines, end) => {
        const text = ["site,year", ...lines].join(end) + end;
        const fast = outcome((problems) => readEventsCsv(Buffer.from(text, "utf8"), problems, "f.csv"));
        const general = outcome((problems) => readEventsCsv(Buffer.from(quoteFirstName(text), "utf8"), problems, "f.csv"));
        expect(fast).toBe(general);
      }),
      { numRuns: 1000, seed: 1402 },
    );
  });

  it("a table's rows and its column reader give the same texts", () => {
    const table = readCsvTable(Buffer.from("year,a,b\n1700, x ,\n1701,\u00a0y\u00a0,2\n"), ["year"], new ProblemList("f.csv"));
    if (table === null) throw new Error("no table");
    const read = table.columnReader(["b", "a", "missing", "a"]);
    const fields: string[] = [];
    const rows = [...table.rows];
    for (let row = 0; row < table.rowCount; row++) {
      read(row, fields);
      expect([...fields]).toEqual([rows[row]?.field("b"), rows[row]?.field("a"), "", rows[row]?.field("a")]);
      expect(table.lineOf(row)).toBe(rows[row]?.line);
    }
    expect(table.plainNumbers([{ name: "year", integer: true }])).toEqual(new Float64Array([1700, 1701]));
    expect(table.plainNumbers([{ name: "a", integer: false }])).toBeNull();
  });
});

describe("number fields: the quick check gives what the full rule gives", () => {
  // The rule as documented: U+2212 read as "-", a decimal with optional exponent, finite.
  const DECIMAL = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
  const byRule = (text: string): number | null => {
    const ascii = text.replace(/\u2212/g, "-");
    if (!DECIMAL.test(ascii)) return null;
    const parsed = Number(ascii);
    return Number.isFinite(parsed) ? parsed : null;
  };
  const digits = fc.string({ unit: fc.constantFrom("0", "1", "5", "9"), maxLength: 20 });
  const text = fc.oneof(
    fc.tuple(fc.constantFrom("", "-", "+", "\u2212"), digits, fc.constantFrom("", "."), digits, fc.constantFrom("", "e5", "E-3", "e400")).map((parts) => parts.join("")),
    fc.double().map(String),
    fc.string({ maxLength: 5 }),
  );

  it("parseDecimal(text) and readInteger(text) (fast-check)", () => {
    fc.assert(
      fc.property(text, (t) => {
        expect(show(parseDecimal(t))).toBe(show(byRule(t)));
        const problems = new ProblemList("f.csv");
        const integer = readInteger(t, "year", 1, problems);
        const ascii = t.replace(/\u2212/g, "-");
        const expected = /^[+-]?\d+$/.test(ascii) && Number.isSafeInteger(Number(ascii)) ? Number(ascii) : null;
        expect(show(integer)).toBe(show(expected));
        expect(problems.size).toBe(expected === null ? 1 : 0);
      }),
      { numRuns: 20000, seed: 1403 },
    );
  });
});
