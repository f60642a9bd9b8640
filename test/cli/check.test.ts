import { beforeAll, describe, expect, it } from "vitest";
import { handleError } from "../../src/cli/handleError.js";
import { UsageError } from "../../src/cli/errors.js";
import { printJson } from "../../src/cli/printJson.js";
import { InputError } from "../../src/workspace/InputError.js";
import { buildOnce, runBuilt, runInProcess } from "./helpers.js";

const VALID = "test/fixtures/regions/valid";
const noStack = (text: string): void => expect(text).not.toMatch(/^\s+at /m);

describe("firephase check <region> (in process)", () => {
  it("check valid → exit 0, a summary on stdout, warnings on stderr", async () => {
    const run = await runInProcess(["check", VALID]);
    expect(run.code).toBe(0);
    expect(run.stdout).toContain("Region: Test Ridge — A tiny invented region for tests");
    expect(run.stdout).toContain("Fire record: 4 sites, 10 fire events (site-years), 1700–1710 (11 years)");
    expect(run.stdout).toContain("Usable years (at least 3 sites recording): 9 between 1702 and 1710; 2 thin years left out");
    expect(run.stdout).toMatch(/ENSO\s+yearly\s+indices\.csv\s+14\s+1698–1712\s+1\s+1702–1710 \(8 years\)/); // ENSO is missing in 1703
    expect(run.stdout).toMatch(/NAO\s+Dec-Mar\s+nao-monthly\.csv\s+9\s+1701–1710\s+1\s+1702–1710 \(8 years\)/);
    expect(run.stdout).toContain("Warnings: 5 (listed on stderr)");
    expect(run.stderr).toContain("warning: sites A and B are 11.1 km apart, closer than 40 km");
    expect(run.stderr).toContain("warning: 2 years have fewer than 3 recording sites");
  });

  it("check valid --json → exactly the promised shape, warnings inside, nothing on stderr", async () => {
    const run = await runInProcess(["check", VALID, "--json"]);
    expect(run.code).toBe(0);
    expect(run.stderr).toBe("");
    expect(run.stdout.endsWith("}\n")).toBe(true);
    const report = JSON.parse(run.stdout) as Record<string, unknown>;
    expect(report.schema).toBe("firephase.check/1");
    expect(report.activity).toEqual([
      { year: 1700, sitesRecording: 2, sitesBurned: 0 },
      { year: 1701, sitesRecording: 2, sitesBurned: 2 },
      { year: 1702, sitesRecording: 3, sitesBurned: 0 },
      { year: 1703, sitesRecording: 3, sitesBurned: 0 },
      { year: 1704, sitesRecording: 4, sitesBurned: 3 },
      { year: 1705, sitesRecording: 4, sitesBurned: 1 },
      { year: 1706, sitesRecording: 3, sitesBurned: 0 },
      { year: 1707, sitesRecording: 3, sitesBurned: 0 },
      { year: 1708, sitesRecording: 3, sitesBurned: 3 },
      { year: 1709, sitesRecording: 3, sitesBurned: 0 },
      { year: 1710, sitesRecording: 3, sitesBurned: 1 },
    ]);
    const warnings = report.warnings as { code: string; message: string; sites?: string[]; distanceKm?: number }[];
    for (const warning of warnings) expect(Object.keys(warning)).toEqual(expect.arrayContaining(["code", "message"]));
    expect(warnings.map((w) => w.code).sort()).toEqual(["season-missing-month", "short-overlap", "short-overlap", "sites-close", "thin-years"]);
    const close = warnings.find((w) => w.code === "sites-close");
    expect(close?.sites).toEqual(["A", "B"]);
    expect(close?.distanceKm).toBeCloseTo((6371 * Math.PI) / 1800, 9);
    expect(report.region).toEqual({ name: "Test Ridge", description: "A tiny invented region for tests" });
  });

  it("check <bad region> → exit 1, each problem as file:line: message on stderr, nothing on stdout, no stack", async () => {
    const run = await runInProcess(["check", "test/fixtures/regions/many-problems"]);
    expect(run.code).toBe(1);
    expect(run.stdout).toBe("");
    const lines = run.stderr.trimEnd().split("\n");
    expect(lines).toHaveLength(21);
    for (const line of lines.slice(0, 20)) expect(line).toMatch(/^[^:]+:\d+: /);
    expect(lines[20]).toBe("test/fixtures/regions/many-problems/fire-events.csv: and 5 more problems");
    noStack(run.stderr);
  });

  it("check <bad region> --json → exit 1 and still no JSON on stdout", async () => {
    const run = await runInProcess(["check", "test/fixtures/regions/unknown-key", "--json"]);
    expect(run.code).toBe(1);
    expect(run.stdout).toBe("");
    expect(run.stderr).toBe('test/fixtures/regions/unknown-key/region.json:31: unknown key "seaDraw" in "methods" (did you mean "seaDraws"?)\n');
  });

  it("usage errors exit 2 with the firephase: prefix and the command's own help hint", async () => {
    for (const [argv, hint] of [
      [["check"], "(run firephase check --help for usage)"],
      [["check", VALID, "--bogus"], "(run firephase check --help for usage)"],
      [["outlook", VALID, "--season", "next"], "(run firephase outlook --help for usage)"],
      [["frobnicate"], "(run firephase --help for usage)"],
    ] as const) {
      const run = await runInProcess(argv);
      expect(run.code).toBe(2);
      expect(run.stdout).toBe("");
      const lines = run.stderr.trimEnd().split("\n");
      expect(lines[0]).toMatch(/^firephase: /);
      expect(lines.at(-1)).toBe(hint);
      expect(run.stderr).not.toMatch(/^error: /m);
      noStack(run.stderr);
    }
  });

  it("--version prints the package version and exits 0; --help exits 0", async () => {
    const version = await runInProcess(["--version"]);
    expect(version).toEqual({ code: 0, stdout: "0.1.0\n", stderr: "" });
    const help = await runInProcess(["--help"]);
    expect(help.code).toBe(0);
    expect(help.stdout).toContain("check [options] <region>");
  });
});

describe("handleError(error, output)", () => {
  const capture = (error: unknown, debug = false): { code: number; text: string } => {
    let text = "";
    const code = handleError(error, { writeErr: (t) => (text += t), debug });
    process.exitCode = undefined;
    return { code, text };
  };

  it("InputError → one line per problem, file:line: or file:, exit 1", () => {
    const error = new InputError([
      { file: "r/a.csv", line: 3, message: "bad (found x)" },
      { file: "r/b.csv", line: null, message: "the file is empty" },
    ]);
    expect(capture(error)).toEqual({ code: 1, text: "r/a.csv:3: bad (found x)\nr/b.csv: the file is empty\n" });
  });

  it("UsageError → firephase: message, exit 2", () => {
    expect(capture(new UsageError("--values: unknown index"))).toEqual({ code: 2, text: "firephase: --values: unknown index\n" });
  });

  it("any other error → internal error, exit 1, the stack only with FIREPHASE_DEBUG=1", () => {
    const plain = capture(new TypeError("x is undefined"));
    expect(plain).toEqual({ code: 1, text: "firephase: internal error: x is undefined\n" });
    const debug = capture(new TypeError("x is undefined"), true);
    expect(debug.text).toMatch(/^firephase: internal error: x is undefined\nTypeError: x is undefined\n\s+at /);
    expect(capture("a thrown string")).toEqual({ code: 1, text: "firephase: internal error: a thrown string\n" });
  });
});

describe("printJson(value, write)", () => {
  it("writes stable 2-space JSON and a newline", () => {
    let text = "";
    printJson({ schema: "s", list: [1, 2], none: null }, (t) => (text += t));
    expect(text).toBe('{\n  "schema": "s",\n  "list": [\n    1,\n    2\n  ],\n  "none": null\n}\n');
  });
});

describe("node dist/cli/main.js (the built bin, spawned)", () => {
  beforeAll(() => buildOnce());

  it("check valid --json → exit 0 and JSON with schema firephase.check/1", () => {
    const run = runBuilt(["check", VALID, "--json"]);
    expect(run.code).toBe(0);
    expect(JSON.parse(run.stdout)).toMatchObject({ schema: "firephase.check/1" });
  });

  it("check <bad region> → exit 1, file:line: lines, no stack trace", () => {
    const run = runBuilt(["check", "test/fixtures/regions/bad-latitude"]);
    expect(run.code).toBe(1);
    expect(run.stderr).toBe('test/fixtures/regions/bad-latitude/fire-sites.csv:4: latitude must be between -90 and 90 (found "95")\n');
    noStack(run.stderr);
  });

  it("a missing argument → exit 2; --version → 0.1.0", () => {
    expect(runBuilt(["check"]).code).toBe(2);
    expect(runBuilt(["--version"])).toMatchObject({ code: 0, stdout: "0.1.0\n" });
  });
});

describe("firephase check: the calibration period it will use", () => {
  it("prints the default period's years when region.json gives none, and the set period with its usable years", async () => {
    const run = await runInProcess(["check", VALID]);
    expect(run.stdout).toContain(
      'Calibration period: 1702–1710, 9 usable years (default: the overlap of the usable fire record and the indices; set "calibration" in region.json to choose)\n',
    );
    const demo = await runInProcess(["check", "demo-region"]);
    expect(demo.stdout).toContain("Calibration period: 1720–1990, 271 usable years (set in region.json)\n");
  });

  it("calibrationYears(report) is the period the calibration uses (calibrationPeriod), default or set, and null when none", async () => {
    const { buildCheckReport, calibrationYears, formatCheckReport } = await import("../../src/cli/check.js");
    const { calibrationPeriod } = await import("../../src/calibrate/calibrationPeriod.js");
    const { compositeFireRecord } = await import("../../src/record/composite.js");
    const { loadWorkspace } = await import("../../src/workspace/loadWorkspace.js");
    const demo = await loadWorkspace("demo-region");
    const cases = [
      await loadWorkspace(VALID),
      demo,
      { ...demo, settings: { ...demo.settings, calibration: null } },
      { ...demo, settings: { ...demo.settings, calibration: { first: 1500, last: 1800 } } },
    ];
    for (const workspace of cases) {
      const period = calibrationPeriod(workspace.settings, compositeFireRecord(workspace.fireRecord, workspace.settings.fireYears.minSitesRecording), workspace.indices);
      expect(calibrationYears(buildCheckReport(workspace))).toEqual({ first: period.first, last: period.last, years: period.years.length, fromRegionJson: workspace.settings.calibration !== null });
    }
    const report = buildCheckReport(cases[0] as (typeof cases)[0]);
    const apart = { ...report, indices: report.indices.map((index) => ({ ...index, first: 1800, last: 1810 })) };
    expect(calibrationYears(apart)).toBeNull();
    expect(formatCheckReport(apart)).toContain("Calibration period: none (default: the overlap of the usable fire record and the indices, which do not overlap)\n");
  });
});

describe("terminalWarnings(warnings, limitKm)", () => {
  it("prints the 5 closest site pairs and counts the rest; other warnings stay whole", async () => {
    const { terminalWarnings } = await import("../../src/cli/check.js");
    const pairs = Array.from({ length: 24 }, (_, i) => ({
      code: "sites-close",
      message: `sites S${i} and T${i} are ${(30 - i).toFixed(1)} km apart`,
      sites: [`S${i}`, `T${i}`] as const,
      distanceKm: 30 - i,
    }));
    const lines = terminalWarnings([{ code: "thin-years", message: "2 years are thin" }, ...pairs], 40);
    expect(lines).toEqual([
      "warning: 2 years are thin",
      "warning: sites S23 and T23 are 7.0 km apart",
      "warning: sites S22 and T22 are 8.0 km apart",
      "warning: sites S21 and T21 are 9.0 km apart",
      "warning: sites S20 and T20 are 10.0 km apart",
      "warning: sites S19 and T19 are 11.0 km apart",
      "warning: and 19 more site pairs closer than 40 km; all in check --json",
    ]);
    expect(terminalWarnings(pairs.slice(0, 5), 40)).toHaveLength(5);
  });
});
