import { spawnSync } from "node:child_process";
import { cpSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";

// Runs the built CLI (npm test builds first) on the invented demo region.
const root = fileURLToPath(new URL("../..", import.meta.url));
function firephase(...args: string[]) {
  const result = spawnSync(process.execPath, ["dist/cli/main.js", ...args], { cwd: root, encoding: "utf8" });
  return { code: result.status, stdout: result.stdout, stderr: result.stderr };
}

describe("firephase calibrate demo-region", () => {
  it("shows the planted dry-PMI link with intervals", () => {
    const run = firephase("calibrate", "demo-region");
    expect(run.code).toBe(0);
    expect(run.stdout).toMatch(/PMI — 270 years/);
    expect(run.stdout).toMatch(/dry\s+85\s+19\s+22%\s+15–32%/);
    expect(run.stderr).toBe("");
  });

  it("prints byte-identical JSON on two runs with the same seed", () => {
    const first = firephase("calibrate", "demo-region", "--json");
    const second = firephase("calibrate", "demo-region", "--json");
    expect(first.code).toBe(0);
    expect(first.stdout).toBe(second.stdout);
    const json = JSON.parse(first.stdout);
    expect(json.schema).toBe("firephase.calibration/1");
    expect(json.period).toEqual({ first: 1720, last: 1990, years: 271 });
    expect(json.indices.PMI.sea.draws).toBe(10000);
  });
});

describe("firephase calibrate with unusable settings", () => {
  it("exits 1 with a region.json message when no calibration year is usable", () => {
    const folder = join(mkdtempSync(join(tmpdir(), "firephase-cal-")), "region");
    cpSync(join(root, "demo-region"), folder, { recursive: true });
    const region = JSON.parse(readFileSync(join(folder, "region.json"), "utf8"));
    region.calibration = { first: 1200, last: 1300 };
    writeFileSync(join(folder, "region.json"), JSON.stringify(region, null, 2));
    const run = firephase("calibrate", folder);
    expect(run.code).toBe(1);
    expect(run.stderr).toBe(`${join(folder, "region.json")}: no calibration years: no year of calibration 1200–1300 has at least 3 recording sites in the fire record\n`);
    expect(run.stdout).toBe("");
  });

  it("takes a path to region.json as its folder", () => {
    const run = firephase("calibrate", "demo-region/region.json", "--json");
    expect(run.code).toBe(0);
    expect(JSON.parse(run.stdout).region.name).toMatch(/demo/);
  });
});

describe("firephase outlook demo-region", () => {
  it("states the odds in plain words first, then the skill", () => {
    const run = firephase("outlook", "demo-region");
    expect(run.code).toBe(0);
    const lines = run.stdout.split("\n");
    expect(lines[2]).toMatch(/^About \d+ in \d+ chance of a high-fire year \(\d+%, 95% interval \d+–\d+%\); in an average year about 1 in 10 \(10%\)\.$/);
    expect(lines[3]).toMatch(/average year/);
    expect(lines[4]).toMatch(/skill/i);
    expect(run.stdout).toMatch(/Analog years/);
    expect(run.stdout).toMatch(/does not replace official agency outlooks/);
  });

  it("merges repeated --values and says where each value came from", () => {
    const run = firephase("outlook", "demo-region", "--values", "PMI=-1", "--values", "WSI=0.1", "--json");
    expect(run.code).toBe(0);
    const json = JSON.parse(run.stdout);
    const sources = Object.fromEntries(json.current.map((c: { index: string; source: string }) => [c.index, c.source]));
    expect(sources).toEqual({ PMI: "--values", ENSO: "climate-monthly.csv, Dec 2026–Feb 2027", WSI: "--values" });
  });

  it("warns when region.json's values were written for another season", () => {
    // The demo keeps no outlook.values (its values come from the files): add one for season 2027.
    const folder = join(mkdtempSync(join(tmpdir(), "firephase-values-")), "region");
    cpSync(join(root, "demo-region"), folder, { recursive: true });
    const region = JSON.parse(readFileSync(join(folder, "region.json"), "utf8"));
    region.outlook = { ...region.outlook, values: { PMI: -1.2 } };
    writeFileSync(join(folder, "region.json"), JSON.stringify(region, null, 2));
    const run = firephase("outlook", folder, "--season", "2028", "--json");
    const json = JSON.parse(run.stdout);
    expect(json.warnings.map((w: { code: string }) => w.code)).toContain("values-for-another-season");
  });

  it("takes --values over region.json and keeps the promised JSON", () => {
    const run = firephase("outlook", "demo-region", "--values", "PMI=1.2", "--issued", "2027-02-01", "--season", "2027", "--json");
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
    [["--values", "ENSO=warm"], /ENSO must be a decimal number such as 1.2 or -0.5, found "warm"/],
    [["--values", "ENSO=0x10"], /ENSO must be a decimal number/],
    [["--values", "ENSO=1,ENSO=2"], /ENSO is given more than once/],
    [["--issued", "10 March"], /--issued: expected a date as YYYY-MM-DD/],
    [["--season", "next"], /--season: expected a year/],
  ])("exits 2 with a clear message for bad usage %j", (args, message) => {
    const run = firephase("outlook", "demo-region", ...args);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(message);
    expect(run.stderr).not.toMatch(/\n\s+at /);
    expect(run.stdout).toBe("");
  });
});
