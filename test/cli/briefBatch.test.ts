import { cpSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { overviewNames, runBriefBatch } from "../../src/cli/briefBatch.js";
import { UsageError } from "../../src/cli/errors.js";
import { jsonLine } from "../../src/cli/outlookBatch.js";
import { flatText, pdfPageTexts } from "../briefing/pdfText.js";
import { buildOnce, runBuilt, runInProcess } from "./helpers.js";

// Three small regions in a temp folder: two valid ones that differ (their own names and ENSO cuts,
// so their odds differ) and one with a bad latitude. One browser for the whole file.
let work: string;
let north: string;
let south: string;
let bad: string;

const ISSUED = "2027-03-10";
const values = ["ENSO=-1.0"]; // cold for north (0.5 of 2 years), neutral for south (1 of 3): the odds differ

function parseCsv(text: string): string[][] {
  // The overview's cells hold no line break; a quoted cell may hold commas and doubled quotes.
  return text
    .trimEnd()
    .split("\n")
    .map((line) => [...line.matchAll(/("(?:[^"]|"")*"|[^,]*)(,|$)/g)].slice(0, -1).map((match) => (match[1] ?? "").replace(/^"|"$/g, "").replace(/""/g, '"')));
}

beforeAll(() => {
  work = mkdtempSync(join(tmpdir(), "firephase-batch-test-"));
  north = join(work, "north");
  south = join(work, "south");
  bad = join(work, "bad");
  cpSync(resolve("test/fixtures/regions/valid"), north, { recursive: true });
  cpSync(resolve("test/fixtures/regions/valid"), south, { recursive: true });
  cpSync(resolve("test/fixtures/regions/bad-latitude"), bad, { recursive: true });
  const region = JSON.parse(readFileSync(join(south, "region.json"), "utf8")) as { name: string; indices: { ENSO: { cuts: number[] } } };
  region.name = "Second Ridge";
  region.indices.ENSO.cuts = [-1.5, 0];
  writeFileSync(join(south, "region.json"), JSON.stringify(region, null, 2));
});

afterAll(() => {
  rmSync(work, { recursive: true, force: true });
});

describe("firephase brief <region> <region> <region> (one browser, an overview)", () => {
  it("briefs the two good regions, reports the bad one with its file:line problem, writes the overview and exits 1", async () => {
    const out = join(work, "out");
    mkdirSync(out);
    const run = await runInProcess(["brief", north, bad, south, "--out-dir", out, "--no-keep", "--issued", ISSUED, "--values", values[0] as string]);
    expect(run.code).toBe(1);
    const names = overviewNames(2027, ISSUED);
    expect(readdirSync(out).sort()).toEqual(["briefing-north-2027-2027-03-10.pdf", names.csv, names.pdf, "briefing-south-2027-2027-03-10.pdf"].sort());
    expect(run.stdout.trim().split("\n")).toEqual([
      join(out, "briefing-north-2027-2027-03-10.pdf"),
      join(out, "briefing-south-2027-2027-03-10.pdf"),
      join(out, names.pdf),
      join(out, names.csv),
    ]);
    // One progress line per region; the bad one with its problem as `brief bad` prints it.
    expect(run.stderr).toMatch(/\[1\/3\] .*north: briefing-north-2027-2027-03-10\.pdf, \d+ pages/);
    expect(run.stderr).toMatch(/\[3\/3\] .*south: briefing-south-2027-2027-03-10\.pdf, \d+ pages/);
    expect(run.stderr).toContain(`[2/3] ${bad}: failed (1 problem):`);
    expect(run.stderr).toContain(`${join(bad, "fire-sites.csv")}:4: latitude must be between -90 and 90`);
    expect(run.stderr).toContain("2 of 3 regions briefed; 1 failed");

    // The overview's numbers are each region's `outlook --json` numbers, to the last digit.
    const outlooks = await runInProcess(["outlook", north, south, "--json", "--issued", ISSUED, "--values", values[0] as string]);
    expect(outlooks.code).toBe(0);
    const lines = outlooks.stdout.trimEnd().split("\n");
    expect(lines).toHaveLength(2);
    const json = lines.map((line) => JSON.parse(line) as { region: { name: string }; fireYear: { estimate: number; lower: number; upper: number; basis: string }; baseRate: { estimate: number; lower: number; upper: number }; hindcast: { verdict: string; hasSkill: boolean } });
    expect(lines[0]).toBe(jsonLine(json[0]).trimEnd()); // one compact object per line
    const [header, ...rows] = parseCsv(readFileSync(join(out, names.csv), "utf8"));
    const column = (name: string): number => (header ?? []).indexOf(name);
    expect(rows).toHaveLength(3);
    const byFolder = new Map(rows.map((row) => [row[column("folder")], row]));
    for (const [folder, outlook] of [[north, json[0]], [south, json[1]]] as const) {
      const row = byFolder.get(folder) ?? [];
      expect(row[column("region")]).toBe(outlook?.region.name);
      expect(Number(row[column("chance")])).toBe(outlook?.fireYear.estimate);
      expect(Number(row[column("chance_lower")])).toBe(outlook?.fireYear.lower);
      expect(Number(row[column("chance_upper")])).toBe(outlook?.fireYear.upper);
      expect(Number(row[column("base_rate")])).toBe(outlook?.baseRate.estimate);
      expect(Number(row[column("base_rate_lower")])).toBe(outlook?.baseRate.lower);
      expect(Number(row[column("base_rate_upper")])).toBe(outlook?.baseRate.upper);
      expect(row[column("skill_verdict")]).toBe(outlook?.hindcast.verdict);
      expect(row[column("basis")]).toBe(outlook?.fireYear.basis);
      expect(row[column("status")]).toBe("briefed");
    }
    // Sorted by odds, highest first; the failed region last, with its problem.
    const chances = rows.slice(0, 2).map((row) => Number(row[column("chance")]));
    expect(chances[0]).toBeGreaterThan(chances[1] as number);
    expect(rows[2]?.[column("status")]).toBe("failed");
    expect(rows[2]?.[column("problem")]).toContain("fire-sites.csv:4: latitude must be between -90 and 90");

    // The overview PDF: one page, the regions in order, the cautions.
    const pages = await pdfPageTexts(new Uint8Array(readFileSync(join(out, names.pdf))));
    expect(pages).toHaveLength(1);
    const text = flatText(pages).replace(/\s+/g, " ");
    expect(text).toContain("not an official forecast");
    expect(text).toContain("Not a substitute for official agency seasonal outlooks");
    expect(text).toContain("Never a basis for tactical decisions on an incident, for evacuation decisions");
    const first = rows[0]?.[column("region")] ?? "";
    const second = rows[1]?.[column("region")] ?? "";
    expect(text.indexOf(first)).toBeGreaterThan(-1);
    expect(text.indexOf(first)).toBeLessThan(text.indexOf(second));
    expect(text).toContain("Not briefed");
  }, 180_000);

  it("gives the same overview when worker threads compute the regions (the built CLI, FIREPHASE_THREADS=2)", async () => {
    buildOnce();
    const inThread = join(work, "out");
    const threaded = join(work, "out-threads");
    mkdirSync(threaded);
    // Without --no-keep: each region keeps its outlook in its own issued/ folder, as `brief <region>` does.
    const run = runBuilt(["brief", north, bad, south, "--out-dir", threaded, "--issued", ISSUED, "--values", values[0] as string], { FIREPHASE_THREADS: "2" });
    expect(run.code).toBe(1);
    for (const folder of [north, south]) {
      const kept = JSON.parse(readFileSync(join(folder, "issued", "2027-2027-03-10.json"), "utf8")) as { schema: string; issued: string };
      expect([kept.schema, kept.issued]).toEqual(["firephase.outlook/1", ISSUED]);
    }
    expect(readdirSync(bad)).not.toContain("issued");
    expect(readdirSync(threaded).sort()).toEqual(readdirSync(inThread).sort());
    const names = overviewNames(2027, ISSUED);
    const withoutPdf = (folder: string): string[][] => parseCsv(readFileSync(join(folder, names.csv), "utf8")).map((row) => row.filter((_, i) => i !== 15));
    expect(withoutPdf(threaded)).toEqual(withoutPdf(inThread));
    expect(run.stderr).toContain(`[2/3] ${bad}: failed (1 problem):`);
  }, 240_000);

  it("refuses --out and --html with several regions, a region given twice and two folders of one name (exit 2, no browser)", async () => {
    const context = { cwd: work, today: new Date(2027, 2, 10), env: { PATH: process.env.PATH } };
    await expect(runBriefBatch([north, south], { out: "x.pdf" }, context)).rejects.toThrow(/--out names one PDF: with several regions give --out-dir/);
    await expect(runBriefBatch([north, south], { html: "x.html" }, context)).rejects.toThrow(UsageError);
    await expect(runBriefBatch([north, join(work, ".", "north")], {}, context)).rejects.toThrow(/given twice/);
    mkdirSync(join(work, "other", "north"), { recursive: true });
    await expect(runBriefBatch([north, join(work, "other", "north")], {}, context)).rejects.toThrow(/the same folder name north/);
    const run = await runInProcess(["brief", north, south, "--out", "x.pdf"]);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain("firephase: --out names one PDF");
  });

  it("stops with exit 2 and one clear message when the browser cannot start (--browser /bin/false)", async () => {
    const out = join(work, "out-false");
    mkdirSync(out);
    const run = await runInProcess(["brief", north, south, "--out-dir", out, "--no-keep", "--issued", ISSUED, "--browser", "/bin/false"]);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain("firephase: could not start the browser /bin/false (it exited with code 1 before it was ready): choose another with --browser PATH or FIREPHASE_BROWSER");
    expect(run.stderr).not.toMatch(/https?:\/\//);
    expect(run.stderr).not.toContain("internal error");
    expect(readdirSync(out)).toEqual([]);
  }, 60_000);
});

describe("firephase outlook <region> <region> (JSON Lines)", () => {
  it("prints one JSON object per good region and reports the bad one, exit 1", async () => {
    const run = await runInProcess(["outlook", north, bad, south, "--json", "--issued", ISSUED]);
    expect(run.code).toBe(1);
    const lines = run.stdout.trimEnd().split("\n");
    expect(lines.map((line) => (JSON.parse(line) as { region: { name: string } }).region.name)).toEqual(["Test Ridge", "Second Ridge"]);
    expect(run.stderr).toContain(`${join(bad, "fire-sites.csv")}:4: latitude must be between -90 and 90`);
    expect(run.stderr).toContain("2 of 3 regions have an outlook; 1 failed");
  });
});

describe("firephase brief <region> --browser <not a browser>", () => {
  it("exits 2 naming the browser tried and how to choose another, with no third-party link and no file written", async () => {
    const script = join(work, "not-a-browser.sh");
    writeFileSync(script, '#!/bin/sh\necho "usage: thing [options]" >&2\nexit 3\n', { mode: 0o755 });
    for (const [browser, reason] of [
      ["/bin/false", "it exited with code 1 before it was ready"],
      [script, 'it exited with code 3 before it was ready, saying "usage: thing [options]"'],
      [join(work, "no-such-browser"), "no such file"],
    ] as const) {
      const out = join(work, "single-false.pdf");
      const run = await runInProcess(["brief", north, "--browser", browser, "--no-keep", "--issued", ISSUED, "--out", out]);
      expect(run.code, browser).toBe(2);
      expect(run.stderr).toContain(`firephase: could not start the browser ${browser} (${reason}): choose another with --browser PATH or FIREPHASE_BROWSER`);
      expect(run.stderr).not.toMatch(/https?:\/\/|internal error/);
      expect(readdirSync(work)).not.toContain("single-false.pdf");
    }
    const fromEnv = await runInProcess(["brief", north, "--no-keep", "--issued", ISSUED, "--out", join(work, "env.pdf")], { FIREPHASE_BROWSER: "/bin/false" });
    expect(fromEnv.code).toBe(2);
    expect(fromEnv.stderr).toContain(
      "firephase: could not start the browser /bin/false (named by FIREPHASE_BROWSER; it exited with code 1 before it was ready): choose another with --browser PATH or FIREPHASE_BROWSER",
    );
  }, 60_000);
});
