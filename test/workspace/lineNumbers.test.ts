import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { readCsvTable } from "../../src/workspace/csvTable.js";
import { readSitesCsv } from "../../src/workspace/fireRecordCsv.js";
import { ProblemList } from "../../src/workspace/InputError.js";

// Invented sites; each row's name is quoted and may hold line breaks. Physical lines are counted
// as a text editor counts them: CRLF, LF and a lone CR each end one line.
const row = fc.record({
  breaks: fc.array(fc.constantFrom("\n", "\r\n", "\r"), { maxLength: 3 }),
  blankAfter: fc.nat({ max: 2 }),
});

function build(rows: readonly { breaks: readonly string[]; blankAfter: number }[], eol: string, bad: number, unclosed: boolean) {
  let text = `site,latitude,longitude,first_year,last_year,name${eol}`;
  let line = 2;
  let badLine = 0;
  rows.forEach((r, i) => {
    if (i === bad) badLine = line;
    const name = `Site${r.breaks.map((b, k) => `${b}part ${k}`).join("")}`;
    const latitude = i === bad ? "95" : "45";
    text += `S${i},${latitude},-140,1700,1800,"${name}"${eol}`;
    line += 1 + r.breaks.length;
    for (let k = 0; k < r.blankAfter; k++) {
      text += eol;
      line++;
    }
  });
  const openLine = line;
  if (unclosed) text += `S${rows.length},45,-140,1700,1800,"never closed${eol}and more${eol}`;
  return { text, badLine, openLine };
}

describe("physical line numbers (fast-check)", () => {
  it("a bad value is reported on the physical line where its record starts, across quoted breaks, in LF and CRLF files", () => {
    fc.assert(
      fc.property(fc.array(row, { minLength: 1, maxLength: 12 }), fc.constantFrom("\n", "\r\n"), fc.nat(), (rows, eol, pick) => {
        const bad = pick % rows.length;
        const { text, badLine } = build(rows, eol, bad, false);
        const problems = new ProblemList("s.csv");
        const sites = readSitesCsv(Buffer.from(text, "utf8"), problems);
        expect(problems.toArray()).toEqual([{ file: "s.csv", line: badLine, message: 'latitude must be between -90 and 90 (found "95")' }]);
        expect(sites).toHaveLength(rows.length - 1);
      }),
      { numRuns: 300, seed: 8131 },
    );
  });

  it("an unclosed quote is reported where its record starts, never past the end of the file", () => {
    fc.assert(
      fc.property(fc.array(row, { maxLength: 10 }), fc.constantFrom("\n", "\r\n"), (rows, eol) => {
        const { text, openLine } = build(rows, eol, -1, true);
        const problems = new ProblemList("s.csv");
        readCsvTable(Buffer.from(text, "utf8"), ["site"], problems);
        const lineCount = text.split(/\r\n|\n|\r/).length;
        expect(problems.toArray()).toEqual([{ file: "s.csv", line: openLine, message: "a quoted field opened on this line is not closed before the end of the file" }]);
        expect(openLine).toBeLessThanOrEqual(lineCount);
      }),
      { numRuns: 200, seed: 8132 },
    );
  });

  it("latitude 95 on physical line 8 of a CRLF file with quoted breaks is line 8", () => {
    const text = 'site,latitude,longitude,first_year,last_year,name\r\nA,45,-140,1700,1800,"one\r\ntwo"\r\nB,45,-140,1700,1800,"x\r\ny"\r\n\r\nC,45,-140,1700,1800,c\r\nD,95,-140,1700,1800,d\r\n';
    const problems = new ProblemList("s.csv");
    readSitesCsv(Buffer.from(text, "utf8"), problems);
    expect(problems.toArray().map((p) => p.line)).toEqual([8]);
  });

  it("any fields written as RFC 4180 (quoted when needed, either line end) read back the same (fast-check)", () => {
    const text = fc.string({ unit: fc.constantFrom("a", "b", " ", ",", '"', "\n", "\r", "\r\n", "é", "#", "1"), maxLength: 8 });
    fc.assert(
      fc.property(fc.array(fc.array(text, { minLength: 3, maxLength: 3 }), { minLength: 1, maxLength: 6 }), fc.constantFrom("\n", "\r\n"), (records, eol) => {
        const write = (field: string): string => `"${field.replaceAll('"', '""')}"`;
        const csv = `a,b,c${eol}${records.map((r) => r.map(write).join(",")).join(eol)}${eol}`;
        const problems = new ProblemList("f.csv");
        const table = readCsvTable(Buffer.from(csv, "utf8"), ["a", "b", "c"], problems);
        expect(problems.toArray()).toEqual([]);
        const rows = [...(table?.rows ?? [])];
        expect(rows.map((row) => [row.field("a"), row.field("b"), row.field("c")])).toEqual(records.map((r) => r.map((f) => f.trim())));
        let line = 2;
        rows.forEach((row, i) => {
          expect(row.line).toBe(line);
          line += 1 + (records[i] ?? []).join(",").split(/\r\n|\n|\r/).length - 1;
        });
      }),
      { numRuns: 300, seed: 4180 },
    );
  });
});
