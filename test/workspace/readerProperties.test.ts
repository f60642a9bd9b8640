import { mkdtempSync, rmSync, writeFileSync, copyFileSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import fc from "fast-check";
import { afterAll, describe, expect, it } from "vitest";
import { readActivityCsv, readEventsCsv, readModernCsv, readSitesCsv } from "../../src/workspace/fireRecordCsv.js";
import { readIndexCsv } from "../../src/workspace/indexCsv.js";
import { InputError, ProblemList } from "../../src/workspace/InputError.js";
import { loadWorkspace } from "../../src/workspace/loadWorkspace.js";
import type { IndexSettings } from "../../src/workspace/types.js";

const valid = path.resolve("test/fixtures/regions/valid");
const SITES = readFileSync(path.join(valid, "fire-sites.csv"), "utf8");
const INDICES = readFileSync(path.join(valid, "indices.csv"), "utf8");
const WIDE = readFileSync(path.resolve("test/fixtures/regions/layout-wide/nao-wide.csv"), "utf8");
const TEXT_TABLE = readFileSync(path.resolve("test/fixtures/regions/layout-text-codes/nao.txt"), "utf8");
const NAO_CODED: IndexSettings = { name: "NAO", file: "n.txt", column: "NAO", months: "Dec-Mar", phases: { kind: "terciles", labels: ["a", "b", "c"] }, missing: [-99.99] };
const NAO: IndexSettings = { name: "NAO", file: "n.csv", column: "NAO", months: "Dec-Mar", phases: { kind: "terciles", labels: ["a", "b", "c"] } };
const ENSO: IndexSettings = { name: "ENSO", file: "i.csv", column: "ENSO", months: null, phases: { kind: "terciles", labels: ["a", "b", "c"] } };

const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];

/** A text mutation: delete, duplicate or alter one character, or swap two lines. */
const mutation = fc.oneof(
  fc.record({ kind: fc.constant("delete" as const), at: fc.nat() }),
  fc.record({ kind: fc.constant("duplicate" as const), at: fc.nat() }),
  fc.record({ kind: fc.constant("alter" as const), at: fc.nat(), to: fc.constantFrom(",", '"', "\n", "\r", "#", "-", "x", "", "9", ".", " ", "\u0000", "é") }),
  fc.record({ kind: fc.constant("swap" as const), at: fc.nat(), with: fc.nat() }),
);

type Mutation = { kind: string; at: number; to?: string; with?: number };

function mutate(text: string, mutations: readonly Mutation[]): string {
  let out = text;
  for (const m of mutations) {
    if (out.length === 0) break;
    const at = m.at % out.length;
    if (m.kind === "delete") out = out.slice(0, at) + out.slice(at + 1);
    else if (m.kind === "duplicate") out = out.slice(0, at + 1) + out.slice(at);
    else if (m.kind === "alter") out = out.slice(0, at) + (m.to ?? "") + out.slice(at + 1);
    else {
      const lines = out.split("\n");
      const i = at % lines.length;
      const j = (m.with ?? 0) % lines.length;
      [lines[i], lines[j]] = [lines[j] as string, lines[i] as string];
      out = lines.join("\n");
    }
  }
  return out;
}

/** Runs every file reader on the bytes; fails when anything but problems comes out. */
function readAll(bytes: Uint8Array): void {
  const readers: ((problems: ProblemList) => unknown)[] = [
    (p) => readSitesCsv(bytes, p),
    (p) => readEventsCsv(bytes, p, "f.csv"),
    (p) => readActivityCsv(bytes, p),
    (p) => readModernCsv(bytes, p),
    (p) => readIndexCsv(bytes, [ENSO], p, "f.csv"),
    (p) => readIndexCsv(bytes, [NAO], p, "f.csv"),
    (p) => readIndexCsv(bytes, [NAO_CODED], p, "f.csv"),
  ];
  for (const reader of readers) {
    const problems = new ProblemList("f.csv");
    reader(problems);
    for (const problem of problems.toArray()) {
      expect(problem.file).toBe("f.csv");
      expect(problem.line === null || (Number.isInteger(problem.line) && problem.line >= 1)).toBe(true);
      expect(problem.message.length).toBeGreaterThan(0);
    }
  }
}

describe("CSV readers never crash (fast-check)", () => {
  it("random bytes give problems with a file and a line (or null), never another exception", () => {
    fc.assert(fc.property(fc.uint8Array({ maxLength: 300 }), (bytes) => readAll(bytes)), { numRuns: 300, seed: 20270310 });
  });

  it("random mutations of a valid fire-sites.csv and indices.csv give problems, never another exception", () => {
    fc.assert(
      fc.property(fc.constantFrom(SITES, INDICES, WIDE, TEXT_TABLE), fc.array(mutation, { minLength: 1, maxLength: 4 }), (text, mutations) =>
        readAll(Buffer.from(mutate(text, mutations), "utf8")),
      ),
      { numRuns: 400, seed: 42 },
    );
  });
});

describe("loadWorkspace(root) never crashes on a mutated region (fast-check)", () => {
  const folders: string[] = [];
  afterAll(() => {
    for (const folder of folders) rmSync(folder, { recursive: true, force: true });
  });

  it("a mutated fire-events.csv or region.json either loads or throws InputError whose problems all name a file", async () => {
    const names = ["region.json", "fire-sites.csv", "fire-events.csv", "indices.csv", "nao-monthly.csv"];
    await fc.assert(
      fc.asyncProperty(fc.constantFrom("region.json", "fire-events.csv", "fire-sites.csv"), fc.array(mutation, { minLength: 1, maxLength: 3 }), async (target, mutations) => {
        const folder = mkdtempSync(path.join(tmpdir(), "firephase-mutation-"));
        folders.push(folder);
        for (const name of names) copyFileSync(path.join(valid, name), path.join(folder, name));
        writeFileSync(path.join(folder, target), mutate(readFileSync(path.join(valid, target), "utf8"), mutations));
        try {
          await loadWorkspace(folder);
        } catch (error) {
          expect(error).toBeInstanceOf(InputError);
          for (const problem of (error as InputError).problems) {
            expect(problem.file.startsWith(folder)).toBe(true);
            expect(problem.line === null || problem.line >= 1).toBe(true);
          }
        }
      }),
      { numRuns: 60, seed: 7 },
    );
  });
});

describe("wide and whitespace index tables (fast-check)", () => {
  it("a mutated wide or whitespace table gives a series or problems on real lines; a kept series has the table's months", () => {
    fc.assert(
      fc.property(fc.constantFrom(WIDE, TEXT_TABLE), fc.array(mutation, { minLength: 1, maxLength: 3 }), (text, mutations) => {
        const mutated = mutate(text, mutations);
        const problems = new ProblemList("f.txt");
        const result = readIndexCsv(Buffer.from(mutated, "utf8"), [NAO_CODED], problems, "f.txt");
        const lines = mutated.split(/\r\n|\n|\r/).length;
        for (const problem of problems.toArray()) {
          expect(problem.line === null || (problem.line >= 1 && problem.line <= lines)).toBe(true);
          expect(problem.message).not.toMatch(/[\u0000-\u0008\u000b-\u001f\u007f]/);
        }
        if (problems.size === 0) {
          const series = result.series[0];
          expect(series?.monthly?.length).toBeGreaterThan(0);
          for (const month of series?.monthly ?? []) expect(month.value === null || Number.isFinite(month.value)).toBe(true);
        } else {
          expect(result.series).toEqual([]);
        }
      }),
      { numRuns: 400, seed: 20261203 },
    );
  });

  it("writing the same numbers wide, long or as a whitespace table gives the same series (fast-check)", () => {
    const cell = fc.option(fc.integer({ min: -300, max: 300 }).map((n) => n / 100), { nil: null, freq: 6 });
    fc.assert(
      fc.property(fc.integer({ min: 1800, max: 2000 }), fc.array(fc.array(cell, { minLength: 12, maxLength: 12 }), { minLength: 1, maxLength: 6 }), fc.constantFrom("\n", "\r\n"), (first, years, eol) => {
        const text = (v: number | null): string => (v === null ? "" : String(v));
        const long = `year,month,NAO${eol}${years.flatMap((row, y) => row.map((v, m) => `${first + y},${m + 1},${text(v)}`)).join(eol)}${eol}`;
        const wide = `Year,${MONTHS.join(",")}${eol}${years.map((row, y) => `${first + y},${row.map(text).join(",")}`).join(eol)}${eol}`;
        const spaced = `# invented${eol}YEAR ${MONTHS.map((_, m) => m + 1).join(" ")}${eol}${years
          .map((row, y) => `${first + y} ${row.map((v) => (v === null ? "-99.99" : String(v).replace("-", "\u2212"))).join("   ")}`)
          .join(eol)}${eol}`;
        const readWith = (content: string, settings: IndexSettings) => {
          const problems = new ProblemList("f");
          const result = readIndexCsv(Buffer.from(content, "utf8"), [settings], problems, "f");
          expect(problems.toArray()).toEqual([]);
          return result.series;
        };
        const expected = readWith(long, NAO);
        expect(readWith(wide, NAO)).toEqual(expected);
        expect(readWith(spaced, NAO_CODED)).toEqual(expected);
      }),
      { numRuns: 200, seed: 777 },
    );
  });
});
