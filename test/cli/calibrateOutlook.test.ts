import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { runInProcess } from "./helpers.js";

// The invented demo region (demo-region/README.md). Outlook runs pass --issued 2027-03-10, the
// demo's own issue date, so that they do not depend on the wall clock.
const DEMO = "demo-region";

/** Temporary folders made by these tests, removed when the file is done. */
const made: string[] = [];
afterAll(() => {
  for (const folder of made) rmSync(folder, { recursive: true, force: true });
});

describe("firephase calibrate demo-region", () => {
  it("shows the planted dry-PMI link with intervals", async () => {
    const run = await runInProcess(["calibrate", DEMO]);
    expect(run.code).toBe(0);
    expect(run.stdout).toMatch(/PMI — 270 years/);
    expect(run.stdout).toMatch(/dry\s+85\s+19\s+22%\s+15–32%/);
    expect(run.stdout).toMatch(/^Modern record \d{4}–\d{4} \(\d+ years\), high-fire years by area burned/m);
    expect(run.stderr).toBe("");
  });

  it("prints byte-identical JSON on two runs with the same seed", async () => {
    const first = await runInProcess(["calibrate", DEMO, "--json"]);
    const second = await runInProcess(["calibrate", DEMO, "--json"]);
    expect(first.code).toBe(0);
    expect(first.stdout).toBe(second.stdout);
    const json = JSON.parse(first.stdout);
    expect(json.schema).toBe("firephase.calibration/1");
    expect(json.period).toEqual({ first: 1720, last: 1990, years: 271 });
    expect(json.indices.PMI.sea.draws).toBe(10000);
  });
});

describe("firephase calibrate with unusable settings", () => {
  it("exits 1 with a region.json message when no calibration year is usable", async () => {
    const parent = mkdtempSync(join(tmpdir(), "firephase-cal-"));
    made.push(parent);
    const folder = join(parent, "region");
    cpSync(DEMO, folder, { recursive: true });
    const region = JSON.parse(readFileSync(join(folder, "region.json"), "utf8"));
    region.calibration = { first: 1200, last: 1300 };
    writeFileSync(join(folder, "region.json"), JSON.stringify(region, null, 2));
    const run = await runInProcess(["calibrate", folder]);
    expect(run.code).toBe(1);
    expect(run.stderr).toBe(`${join(folder, "region.json")}: no calibration years: no year of calibration 1200–1300 has at least 3 recording sites in the fire record\n`);
    expect(run.stdout).toBe("");
  });

  it("takes a path to region.json as its folder", async () => {
    const run = await runInProcess(["calibrate", "demo-region/region.json", "--json"]);
    expect(run.code).toBe(0);
    expect(JSON.parse(run.stdout).region.name).toMatch(/demo/);
  });
});

describe("firephase outlook demo-region", () => {
  it("states the odds in plain words first, then the skill, with this season's values taken from the files", async () => {
    const run = await runInProcess(["outlook", DEMO, "--issued", "2027-03-10"]);
    expect(run.code).toBe(0);
    const lines = run.stdout.split("\n");
    expect(lines[2]).toMatch(/^About \d+ in \d+ chance of a high-fire year \(\d+%, 95% interval \d+–\d+%\); in an average year about 1 in 10 \(10%\)\.$/);
    expect(lines[3]).toMatch(/average year/);
    expect(lines[4]).toMatch(/skill/i);
    expect(run.stdout).toMatch(/PMI\s+-?\d\.\d\d\s+pmi-monthly\.csv, Dec 2026–Feb 2027 \(provisional\)/);
    expect(run.stdout).toMatch(/Analog years/);
    expect(run.stdout).toMatch(/does not replace official agency outlooks/);
  });

  it("prints what the JSON and the briefing carry: the selection-aware interval, the curve odds and their notes", async () => {
    const text = await runInProcess(["outlook", DEMO, "--issued", "2027-03-10"]);
    const json = JSON.parse((await runInProcess(["outlook", DEMO, "--issued", "2027-03-10", "--json"])).stdout);
    expect(text.code).toBe(0);
    const pct = (p: number): number => Math.round(p * 100);
    const selection = json.fireYear.selectionInterval;
    expect(text.stdout).toContain(`  95% interval allowing for the rule's choice of index: ${pct(selection.lower)}–${pct(selection.upper)}% (${selection.resamples} block-bootstrap resamples of the whole rule)\n`);
    expect(text.stdout).toContain(`  ${json.fireYear.selectionNote}\n`);
    const curve = json.fireYear.curveOdds;
    expect(curve.beyondRange).toBeNull();
    expect(text.stdout).toContain(`  response curve of PMI at ${curve.value.toFixed(2)}: ${pct(curve.estimate)}% (${pct(curve.lower)}–${pct(curve.upper)}%)\n`);
    expect(text.stdout).toContain(`  ${json.fireYear.strengthNote}\n`);
  });

  it("says when this season's value lies beyond the calibration range of the curve", async () => {
    const run = await runInProcess(["outlook", DEMO, "--issued", "2027-03-10", "--values", "PMI=-9"]);
    expect(run.code).toBe(0);
    expect(run.stdout).toMatch(/response curve of PMI at -9\.00: \d+% \(\d+–\d+%\); -9\.00 is below every calibration year \(-?\d+\.\d\d to -?\d+\.\d\d\), so the curve is read at -\d+\.\d\d, the record's edge\n/);
  });

  it("merges repeated --values (U+2212 minus too) and says where each value came from", async () => {
    const run = await runInProcess(["outlook", DEMO, "--issued", "2027-03-10", "--values", "ENSO=\u22121", "--values", "WSI=0.1", "--json"]);
    expect(run.code).toBe(0);
    const json = JSON.parse(run.stdout);
    const sources = Object.fromEntries(json.current.map((c: { index: string; source: string }) => [c.index, c.source]));
    expect(sources).toEqual({ PMI: "pmi-monthly.csv, Dec 2026–Feb 2027 (provisional)", ENSO: "--values", WSI: "--values" });
    expect(json.current.find((c: { index: string }) => c.index === "ENSO").value).toBe(-1);
    expect(json.current.find((c: { index: string }) => c.index === "PMI")).toMatchObject({ provisional: true, months: ["2026-12", "2027-01", "2027-02"] });
  });

  it.each(["\u2012", "\u2013", "\u2014", "\ufe63", "\uff0d"])("reads the dash %j before a --values number as a minus", async (dash) => {
    const run = await runInProcess(["outlook", DEMO, "--issued", "2027-03-10", "--values", `ENSO=${dash}0.8`, "--json"]);
    expect(run.code).toBe(0);
    expect(JSON.parse(run.stdout).current.find((c: { index: string }) => c.index === "ENSO").value).toBe(-0.8);
  });

  it("takes --values over the files and keeps the promised JSON", async () => {
    const run = await runInProcess(["outlook", DEMO, "--values", "PMI=1.2", "--issued", "2027-02-01", "--season", "2027", "--json"]);
    expect(run.code).toBe(0);
    const json = JSON.parse(run.stdout);
    expect(json.schema).toBe("firephase.outlook/1");
    expect(json.issued).toBe("2027-02-01");
    expect(json.phases.PMI).toBe("wet");
    expect(json.fireYear.estimate).toBeLessThan(json.baseRate.estimate);
    expect(json.hindcast.years).toBe(271);
  });

  it.each([
    [["--values", "FOO=1"], /unknown index "FOO"; this region's indices are PMI, ENSO, WSI/],
    [["--values", "PMI=warm"], /PMI must be a decimal number such as 1.2 or -0.5, found "warm"/],
    [["--values", "PMI=0x10"], /PMI must be a decimal number/],
    [["--values", "PMI=1e200"], /PMI = 1e200 is beyond ±1,000,000/],
    [["--values", "PMI=1,PMI=2"], /PMI is given more than once/],
    [["--values", "PMI=-0,8"], /"PMI=-0,8" has a decimal comma; use a decimal point: -0\.8/],
    [["--values", "pmi=0.4"], /unknown index "pmi" \(did you mean "PMI"\? names are case-sensitive\)/],
    [["--issued", "10 March"], /--issued: expected a date as YYYY-MM-DD/],
    [["--issued", "2027-02-30"], /--issued: 2027-02-30 does not exist \(February 2027 has 28 days\)/],
    [["--issued", "1500-03-01"], /--issued: 1500-03-01 is before the index records begin/],
    [["--season", "next"], /--season: expected a year/],
    [["--season", "9999"], /--season: 9999 is more than a year after today's \d{4} season/],
  ])("exits 2 with a clear message for bad usage %j", async (args, message) => {
    const run = await runInProcess(["outlook", DEMO, ...args]);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(message);
    expect(run.stderr).toMatch(/^firephase: /);
    expect(run.stderr).toMatch(/\(run firephase outlook --help for usage\)\n$/);
    expect(run.stderr).not.toMatch(/\n\s+at /);
    expect(run.stdout).toBe("");
  });
});
