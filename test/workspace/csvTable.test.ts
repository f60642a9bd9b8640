import { describe, expect, it } from "vitest";
import { readCsvTable } from "../../src/workspace/csvTable.js";
import { ProblemList } from "../../src/workspace/InputError.js";

const read = (text: string | Uint8Array, required: string[] = ["year"]) => {
  const problems = new ProblemList("f.csv");
  const table = readCsvTable(typeof text === "string" ? Buffer.from(text, "utf8") : text, required, problems);
  return { table, rows: [...(table?.rows ?? [])], problems: problems.toArray() };
};

describe("readCsvTable(bytes, required, problems)", () => {
  it("gives each record the physical line where it starts, across quoted line breaks and blank lines", () => {
    const { rows, problems } = read('year,note\n1700,"two\nlines"\n\n1701,plain\r\n1702,"a ""quoted"", word"\n');
    expect(problems).toEqual([]);
    expect(rows.map((r) => [r.line, r.field("year"), r.field("note")])).toEqual([
      [2, "1700", "two\nlines"],
      [5, "1701", "plain"],
      [6, "1702", 'a "quoted", word'],
    ]);
  });

  it("strips a BOM and trims column names and fields", () => {
    const { table, rows } = read("\uFEFF year , ENSO \n 1700 , 0.5 \n");
    expect(table?.columns).toEqual(["year", "ENSO"]);
    expect(rows[0]?.field("ENSO")).toBe("0.5");
  });

  it("reports a row with the wrong number of fields and keeps the others", () => {
    const { rows, problems } = read("year,a\n1700,1\n1701\n1702,3,4\n1703,5\n");
    expect(problems).toEqual([
      { file: "f.csv", line: 3, message: "expected 2 fields as in the header, found 1" },
      { file: "f.csv", line: 4, message: "expected 2 fields as in the header, found 3" },
    ]);
    expect(rows.map((r) => r.line)).toEqual([2, 5]);
  });

  it("reports the first quoting error with its line (later ones are echoes of it)", () => {
    expect(read('year,a\n1700,"bad"x\n1701,2\n1702,"open\n').problems).toEqual([
      { file: "f.csv", line: 2, message: "a closing quote must be followed by a comma or the end of the line" },
    ]);
    // Reported where the record starts and the quote opened (line 3), not at the end of the file.
    expect(read('year,a\n1700,1\n1701,"open\n1702,3\n').problems).toEqual([
      { file: "f.csv", line: 3, message: "a quoted field opened on this line is not closed before the end of the file" },
    ]);
    expect(read('year,a,b\r\n1700,"two\r\nlines",1\r\n1701,"x","open\r\n').problems).toEqual([
      { file: "f.csv", line: 4, message: "a quoted field opened on this line is not closed before the end of the file" },
    ]);
    expect(read('year,a,b\n1700,"two\nlines","open\n1702,3\n').problems).toEqual([
      {
        file: "f.csv",
        line: 2,
        message: "the record starting on this line has a quoted field opened on line 3 that is not closed before the end of the file",
      },
    ]);
  });

  it("reports a comment line, a header without data, a repeated or unnamed column", () => {
    expect(read("year\n# note\n1700\n").problems).toEqual([{ file: "f.csv", line: 2, message: 'comment lines are not allowed (found "# note")' }]);
    expect(read("year,a\n").problems).toEqual([{ file: "f.csv", line: null, message: "the file has a header but no data rows" }]);
    expect(read("year,a,a\n1,2,3\n").problems).toEqual([{ file: "f.csv", line: 1, message: 'column "a" appears twice in the header' }]);
    expect(read("year,,b\n1,2,3\n").problems).toEqual([{ file: "f.csv", line: 1, message: "column 2 of the header has no name" }]);
  });

  it("reports an empty file, a BOM-only file, NUL bytes and invalid UTF-8 with the line", () => {
    expect(read("").problems).toEqual([{ file: "f.csv", line: null, message: "the file is empty" }]);
    expect(read("\uFEFF\n\n").problems).toEqual([{ file: "f.csv", line: null, message: "the file is empty" }]);
    expect(read(Buffer.from([0x79, 0x0a, 0x31, 0x0a, 0x00])).problems).toEqual([{ file: "f.csv", line: 3, message: "the file is not text (found a NUL byte)" }]);
    expect(read(Buffer.from([0x79, 0x0a, 0x31, 0xc3, 0x28, 0x0a])).problems).toEqual([
      { file: "f.csv", line: 2, message: "the file is not UTF-8 text (found an invalid byte sequence)" },
    ]);
  });
});

describe("ProblemList(file)", () => {
  it("keeps only the problems it can show, the smallest lines first, and counts the rest", async () => {
    const { ProblemList: List } = await import("../../src/workspace/InputError.js");
    const problems = new List("f.csv");
    for (let line = 1_000_000; line >= 1; line--) problems.add(line, `problem ${line}`);
    problems.add(null, "whole file");
    expect(problems.size).toBe(1_000_001);
    const shown = problems.toArray();
    expect(shown).toHaveLength(21);
    expect(shown[0]).toEqual({ file: "f.csv", line: null, message: "whole file" });
    expect(shown.slice(1, 20).map((p) => p.line)).toEqual(Array.from({ length: 19 }, (_, i) => i + 1));
    expect(shown[20]).toEqual({ file: "f.csv", line: null, message: "and 999981 more problems" });
  });
});
