import { spawnSync } from "node:child_process";
import { cpSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve, sep } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { runInProcess } from "../cli/helpers.js";

// The invented demo region (demo-region/, written by demo-region/generate.mjs) against what its
// generator planted: a strong, dose-response link of the Dec–Mar PMI (dry raises the odds), a
// one-year lagged ENSO link (no same-season link), no WSI link, and a modern record driven by the
// same links. Everything in the folder is invented and generated.

const DEMO = resolve("demo-region");
const GENERATOR = join(DEMO, "generate.mjs");
let work: string;

beforeAll(() => {
  work = mkdtempSync(join(tmpdir(), "firephase-demo-test-"));
});

afterAll(() => {
  rmSync(work, { recursive: true, force: true });
});

/** Every file below `folder` (relative paths, sorted), without the generator and its README. */
function generatedFiles(folder: string): string[] {
  return readdirSync(folder, { recursive: true, withFileTypes: true })
    .filter((entry) => entry.isFile())
    .map((entry) => join(entry.parentPath, entry.name).slice(folder.length + 1))
    .filter((name) => name !== "generate.mjs" && name !== "README.md")
    .sort();
}

/** A copy of the demo with only the named indices left in region.json. */
function demoWithIndices(names: readonly string[]): string {
  const folder = join(work, `only-${names.join("-")}`);
  cpSync(DEMO, folder, { recursive: true });
  const file = join(folder, "region.json");
  const region = JSON.parse(readFileSync(file, "utf8")) as { indices: Record<string, unknown> };
  region.indices = Object.fromEntries(Object.entries(region.indices).filter(([name]) => names.includes(name)));
  writeFileSync(file, `${JSON.stringify(region, null, 2)}\n`);
  return folder;
}

async function json<T>(argv: readonly string[]): Promise<T> {
  const run = await runInProcess(argv);
  expect(run.stderr).toBe("");
  expect(run.code).toBe(0);
  return JSON.parse(run.stdout) as T;
}

interface CalibrationIndexJson {
  readonly contingency: { readonly pValue: number; readonly qValue: number };
  readonly sea: { readonly lags: readonly number[]; readonly mean: readonly number[]; readonly pValue: readonly number[] };
  readonly phases: readonly { readonly label: string; readonly years: number; readonly fireYears: number }[];
}
interface CalibrationJson {
  readonly period: { readonly first: number; readonly last: number; readonly years: number };
  readonly indices: Readonly<Record<string, CalibrationIndexJson>>;
}
interface OutlookJson {
  readonly current: readonly { readonly index: string; readonly provisional: boolean; readonly months: readonly string[] }[];
  readonly fireYear: { readonly basisIndices: readonly string[] };
  readonly hindcast: { readonly hasSkill: boolean; readonly brierSkillScore: number | null };
}

describe("demo-region/generate.mjs (seed 20270310)", () => {
  it("regenerates every committed demo file byte for byte", () => {
    const out = join(work, "regenerated");
    const run = spawnSync(process.execPath, [GENERATOR, "--out", out], { encoding: "utf8" });
    expect(run.status).toBe(0);
    const names = generatedFiles(out);
    // `brief demo-region` may keep its own outlook in issued/; every other file is the generator's.
    const notKept = (name: string) => !name.startsWith(`issued${sep}`);
    expect(generatedFiles(DEMO).filter(notKept)).toEqual(names.filter(notKept));
    for (const name of names) expect(readFileSync(join(out, name)).equals(readFileSync(join(DEMO, name))), name).toBe(true);
  });

  it("writes the PMI table in the wide layout with declared -99.99 codes, through Feb 2027", () => {
    const region = JSON.parse(readFileSync(join(DEMO, "region.json"), "utf8")) as {
      indices: Record<string, { file: string; missing?: number[] }>;
      outlook: Record<string, unknown>;
    };
    expect(region.indices["PMI"]?.missing).toEqual([-99.99]);
    expect(region.outlook).toEqual({ season: 2027, issued: "2027-03-10" });
    const lines = readFileSync(join(DEMO, "pmi-monthly.csv"), "utf8").split("\r\n");
    expect(lines[0]).toBe("year,Jan,Feb,Mar,Apr,May,Jun,Jul,Aug,Sep,Oct,Nov,Dec");
    const last = (lines.at(-2) ?? "").split(",");
    expect(last.slice(0, 3)).not.toContain("-99.99");
    expect(last.slice(3)).toEqual(new Array(10).fill("-99.99"));
    expect(last[0]).toBe("2027");
  });
});

describe("firephase on the demo region", () => {
  it("check passes and warns about the one close pair of sites", async () => {
    const run = await runInProcess(["check", DEMO]);
    expect(run.code).toBe(0);
    expect(run.stdout).toMatch(/Fire record: 30 sites/);
    expect(run.stderr).toMatch(/sites T07 and T08 are 18\.8 km apart, closer than 40 km/);
  });

  it("calibrate finds the planted PMI link and no WSI link; ENSO shows only at lag −1", async () => {
    const calibration = await json<CalibrationJson>(["calibrate", DEMO, "--json"]);
    expect(calibration.period).toEqual({ first: 1720, last: 1990, years: 271 });
    const { PMI, ENSO, WSI } = calibration.indices;
    if (PMI === undefined || ENSO === undefined || WSI === undefined) throw new Error("demo indices missing");
    // Planted strong link: dry PMI raises the odds.
    expect(PMI.contingency.pValue).toBeLessThan(0.001);
    expect(PMI.contingency.qValue).toBeLessThan(0.01);
    const share = (label: string) => {
      const phase = PMI.phases.find((p) => p.label === label);
      if (phase === undefined) throw new Error(`no phase ${label}`);
      return phase.fireYears / phase.years;
    };
    expect(share("dry")).toBeGreaterThan(2 * share("wet"));
    // Planted null index: no clear link, no epoch departure.
    expect(WSI.contingency.pValue).toBeGreaterThan(0.05);
    expect(WSI.contingency.qValue).toBeGreaterThan(0.05);
    expect(Math.min(...WSI.sea.pValue)).toBeGreaterThan(0.05);
    // Planted lag: no same-season link, a clear positive departure the year before fire years.
    expect(ENSO.contingency.pValue).toBeGreaterThan(0.05);
    const lag = ENSO.sea.lags.indexOf(-1);
    expect(ENSO.sea.pValue[lag]).toBeLessThan(0.01);
    expect(ENSO.sea.mean[lag]).toBeGreaterThan(0);
    expect(ENSO.sea.pValue[ENSO.sea.lags.indexOf(0)]).toBeGreaterThan(0.05);
  });

  // The outlook runs the leave-out hindcast (and its permutations); it takes longer than the default limit.
  const OUTLOOK_TIMEOUT_MS = 600_000;

  it("outlook on 2027-03-10 reads the values from the files (PMI Dec-Mar provisional, ENSO and WSI Dec-Feb complete) and its PMI rule has skill", async () => {
    const outlook = await json<OutlookJson>(["outlook", DEMO, "--json"]);
    const byIndex = Object.fromEntries(outlook.current.map((c) => [c.index, c]));
    expect(byIndex["PMI"]?.provisional).toBe(true);
    expect(byIndex["PMI"]?.months).toEqual(["2026-12", "2027-01", "2027-02"]);
    expect(byIndex["ENSO"]?.provisional).toBe(false);
    expect(byIndex["WSI"]?.provisional).toBe(false);
    // Only PMI has a clear link, so the rule (and its hindcast) rests on PMI alone.
    expect(outlook.fireYear.basisIndices).toEqual(["PMI"]);
    expect(outlook.hindcast.hasSkill).toBe(true);
  }, OUTLOOK_TIMEOUT_MS);

  it.each([["ENSO"], ["WSI"]])(
    "hindcast with only %s has no skill (no same-season link was planted)",
    async (name) => {
      const outlook = await json<OutlookJson>(["outlook", demoWithIndices([name]), "--json"]);
      expect(outlook.hindcast.hasSkill).toBe(false);
      expect(outlook.hindcast.brierSkillScore ?? 0).toBeLessThanOrEqual(0);
    },
    OUTLOOK_TIMEOUT_MS,
  );
});

describe("the demo's modern record and kept outlooks", () => {
  /** Dec–Mar mean of the wide PMI table per season (null when a month is -99.99). */
  function pmiSeasons(): Map<number, number | null> {
    const rows = readFileSync(join(DEMO, "pmi-monthly.csv"), "utf8").trim().split("\r\n").slice(1);
    const month = new Map<string, number | null>();
    for (const row of rows) {
      const [year, ...values] = row.split(",");
      values.forEach((value, i) => month.set(`${year}-${i + 1}`, value === "-99.99" ? null : Number(value)));
    }
    const seasons = new Map<number, number | null>();
    for (let season = 1601; season <= 2026; season++) {
      const values = [`${season - 1}-12`, `${season}-1`, `${season}-2`, `${season}-3`].map((key) => month.get(key) ?? null);
      seasons.set(season, values.includes(null) ? null : (values as number[]).reduce((a, b) => a + b, 0) / 4);
    }
    return seasons;
  }

  it("modern high-fire years (top 10 % by area) are dry PMI seasons, as planted", () => {
    const rows = readFileSync(join(DEMO, "modern-fires.csv"), "utf8").trim().split("\r\n").slice(1).map((row) => row.split(",").map(Number));
    expect(rows[0]?.[0]).toBe(1950);
    expect(rows.at(-1)?.[0]).toBe(2026);
    const areas = rows.map((row) => row[2] as number).sort((a, b) => b - a);
    const threshold = areas[Math.ceil(0.1 * rows.length) - 1] as number;
    const seasons = pmiSeasons();
    const pmiOf = (rowsOf: number[][]) => rowsOf.map((row) => seasons.get(row[0] as number) as number);
    const mean = (values: number[]) => values.reduce((a, b) => a + b, 0) / values.length;
    const high = pmiOf(rows.filter((row) => (row[2] as number) >= threshold));
    const other = pmiOf(rows.filter((row) => (row[2] as number) < threshold));
    expect(high.length).toBe(8);
    expect(mean(high)).toBeLessThan(mean(other) - 0.5);
  });

  it("kept outlooks are firephase.outlook/1 objects named <season>-<issue date>.json, with sound intervals", () => {
    const folder = join(DEMO, "issued");
    // The generator's eight (seasons 2019–2026); a `brief` of the demo may have kept a later one.
    const names = readdirSync(folder).filter((name) => /^20(19|2[0-6])-/.test(name)).sort();
    expect(names.length).toBe(8);
    for (const name of names) {
      const kept = JSON.parse(readFileSync(join(folder, name), "utf8")) as {
        schema: string; issued: string; season: number;
        fireYear: { estimate: number; lower: number; upper: number; basis: string };
        categories: Record<"below" | "near" | "above", { estimate: number }>;
        phases: Record<string, string>;
      };
      expect(kept.schema).toBe("firephase.outlook/1");
      expect(name).toBe(`${kept.season}-${kept.issued}.json`);
      expect(kept.issued.startsWith(`${kept.season}-03-`)).toBe(true);
      expect(kept.fireYear.lower).toBeLessThanOrEqual(kept.fireYear.estimate);
      expect(kept.fireYear.estimate).toBeLessThanOrEqual(kept.fireYear.upper);
      const { below, near, above } = kept.categories;
      expect(below.estimate + near.estimate + above.estimate).toBeCloseTo(1, 12);
      expect(Object.keys(kept.phases)).toEqual(["PMI", "ENSO", "WSI"]);
    }
  });
});
