import { cpSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { overviewSkill } from "../../src/briefing/overview.js";
import { outDirProblem, overviewNames, runBriefBatch } from "../../src/cli/briefBatch.js";
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
    const out = join(work, "out"); // not there yet: --out-dir makes it
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
    const skills = json.map((outlook) => overviewSkill(outlook));
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
      expect(row[column("skill")]).toBe(overviewSkill(outlook));
      expect(row[column("season")]).toBe("2027");
      expect(row[column("issued")]).toBe(ISSUED);
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
    // The hindcast column is the short verdict, never the verdict sentence cut off.
    for (const skill of skills) expect(["Some skill", "No skill", "Not tested", "Too little data", "Does not apply"]).toContain(skill);
    for (const skill of skills) expect(text).toContain(`${skill}`);
    expect(text).not.toContain("…");
    expect(text).not.toContain(json[0]?.hindcast.verdict.slice(0, 60));
    // Dated as the single briefings are: long issue date, the moment made in UTC, the footer.
    expect(text).toContain("Issued 10 March 2027 for the 2027 fire season");
    expect(text).toMatch(/2 regions briefed, 1 not briefed · Made \d{1,2} [A-Z][a-z]+ \d{4}, \d{2}:\d{2} UTC with firephase /);
    expect(text).not.toMatch(/\d{4}-\d{2}-\d{2}T\d{2}:/);
    expect(text).toContain("Overview of 3 regions · fire-season outlook 2027 · Issued 10 March 2027");
    expect(text).not.toContain("Regions were issued on different dates");
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
    const withoutPdf = (folder: string): string[][] => {
      const [header, ...rows] = parseCsv(readFileSync(join(folder, names.csv), "utf8"));
      const pdf = (header ?? []).indexOf("pdf");
      expect(pdf).toBeGreaterThan(-1);
      return [header ?? [], ...rows].map((row) => row.filter((_, i) => i !== pdf));
    };
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

  it("makes a missing --out-dir with its parents before any work (one region too), and says what is in the way when it cannot (exit 2)", async () => {
    const nested = join(work, "made", "2027", "march");
    const run = await runInProcess(["brief", north, south, "--out-dir", nested, "--no-keep", "--issued", ISSUED, "--browser", "/bin/false"]);
    expect(run.code).toBe(2); // the browser fails, after the folder was made
    expect(readdirSync(nested)).toEqual([]);
    const single = join(work, "made-single", "a", "b");
    const one = await runInProcess(["brief", north, "--out-dir", single, "--no-keep", "--issued", ISSUED, "--browser", "/bin/false"]);
    expect(one.code).toBe(2);
    expect(readdirSync(single)).toEqual([]);

    const file = join(work, "a-file");
    writeFileSync(file, "not a folder\n");
    for (const [outDir, blocking] of [
      [file, file],
      [join(file, "sub", "deeper"), file],
    ] as const) {
      for (const regionsGiven of [[north, south], [north]]) {
        const refused = await runInProcess(["brief", ...regionsGiven, "--out-dir", outDir, "--no-keep", "--issued", ISSUED]);
        expect(refused.code, outDir).toBe(2);
        expect(refused.stderr).toBe(`firephase: --out-dir: cannot make the folder ${outDir}: ${blocking} is not a folder (a file is in the way)\n(run firephase brief --help for usage)\n`);
      }
    }
    // Written as typed: a relative folder is named relative.
    await expect(runBriefBatch([north, south], { outDir: join("a-file", "x") }, { cwd: work, today: new Date(2027, 2, 10), env: { PATH: process.env.PATH } })).rejects.toThrow(
      new UsageError(`--out-dir: cannot make the folder ${join("a-file", "x")}: a-file is not a folder (a file is in the way)`),
    );
    // No permission cannot be staged for a test run as root; the words for it:
    expect(outDirProblem(Object.assign(new Error("EACCES: permission denied"), { code: "EACCES" }), { shown: "/srv/fire", isFolder: true })).toBe("no permission to make folders in /srv/fire");
    expect(outDirProblem(Object.assign(new Error("EROFS"), { code: "EROFS" }), { shown: "/mnt", isFolder: true })).toBe("the file system is read-only");
  }, 60_000);

  it("says so plainly when the regions were issued on different dates and for different seasons (CSV: each row's season and issue date)", async () => {
    // Dates from each region's own region.json: east keeps 2027-03-10 and names the 2028 season; west is issued today, 2027-03-15.
    const east = join(work, "dates", "east");
    const west = join(work, "dates", "west");
    cpSync(north, east, { recursive: true });
    cpSync(north, west, { recursive: true });
    rmSync(join(east, "issued"), { recursive: true, force: true });
    rmSync(join(west, "issued"), { recursive: true, force: true });
    const region = JSON.parse(readFileSync(join(east, "region.json"), "utf8")) as Record<string, unknown>;
    writeFileSync(join(east, "region.json"), JSON.stringify({ ...region, name: "East Bench", outlook: { issued: "2027-03-10", season: 2028 } }));
    writeFileSync(join(west, "region.json"), JSON.stringify({ ...region, name: "West Bench" }));
    const out = join(work, "dates", "out");
    const result = await runBriefBatch([east, west], { outDir: out, keep: false, values: values[0] as string }, { cwd: work, today: new Date(2027, 2, 15), env: { PATH: process.env.PATH } });
    expect(result.failed).toBe(0);
    // The overview is named after the first region briefed.
    expect(result.overviewPdf).toBe(join(out, overviewNames(2028, "2027-03-10").pdf));
    const [header, ...rows] = parseCsv(readFileSync(result.overviewCsv ?? "", "utf8"));
    const column = (name: string): number => (header ?? []).indexOf(name);
    const byName = new Map(rows.map((row) => [row[column("region")], row]));
    expect([byName.get("East Bench")?.[column("season")], byName.get("East Bench")?.[column("issued")]]).toEqual(["2028", "2027-03-10"]);
    expect([byName.get("West Bench")?.[column("season")], byName.get("West Bench")?.[column("issued")]]).toEqual(["2027", "2027-03-15"]);
    const text = flatText(await pdfPageTexts(new Uint8Array(readFileSync(result.overviewPdf ?? "")))).replace(/\s+/g, " ");
    expect(text).toContain("Regions were issued on different dates: 10 March 2027 (East Bench); 15 March 2027 (West Bench).");
    expect(text).toContain("The regions' fire seasons differ: 2027 (West Bench); 2028 (East Bench).");
    expect(text).toContain("Issued on 2 different dates, 10 March 2027 to 15 March 2027 for the 2027 and 2028 fire seasons");
    expect(text).toContain("Issued 15 March 2027 2027 season"); // each row's own, under its name
    expect(text).toContain("Issued 10 March 2027 2028 season");
  }, 120_000);

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
