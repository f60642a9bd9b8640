import { describe, expect, it } from "vitest";
import jStat from "jstat";
import { MIN_MODERN_YEARS, modernEra } from "../../src/calibrate/modernEra.js";
import { runCalibration } from "../../src/calibrate/runCalibration.js";
import { toCalibrationJson } from "../../src/calibrate/toCalibrationJson.js";
import { breslowDayTest } from "../../src/stats/breslowDayTest.js";
import { createRandom } from "../../src/stats/createRandom.js";
import type { ModernFireRow, Workspace } from "../../src/workspace/types.js";
import { syntheticWorkspace } from "../helpers/syntheticWorkspace.js";

/**
 * An invented two-era region: the fire-scar record calibrates 1701–1880 and index A keeps going to 2020;
 * an invented agency record covers 1881–2020 with area burned and fire counts whose high-fire years follow
 * index A with the logistic slope `modernEffect` (positive = the same link as the fire-scar era, negative = reversed).
 */
function twoEraWorkspace(modernEffect: number, seed = 3, effect = 1.8): Workspace {
  const base = syntheticWorkspace({ effect, seed, last: 2020 });
  const a = base.indices.find((series) => series.name === "A")!;
  const random = createRandom(seed + 1000);
  const modern: ModernFireRow[] = [];
  a.years.forEach((year, i) => {
    if (year <= 1880) return;
    const value = a.values[i] as number;
    const big = random.nextFloat() < 1 / (1 + Math.exp(-(-2.2 + modernEffect * value)));
    const areaHa = Math.round((big ? 20000 : 500) * (0.5 + random.nextFloat()));
    const fires = Math.round((big ? 300 : 60) * (0.5 + random.nextFloat()));
    modern.push({ year, fires, areaHa });
  });
  return { ...base, settings: { ...base.settings, calibration: { first: 1701, last: 1880 } }, modern };
}

/** The fire-year rule recomputed by brute force: the ceil(top × N)-th highest value, ties all in, only values > 0. */
function bruteForceFireYears(rows: readonly ModernFireRow[], top: number): { threshold: number; years: number[] } {
  const values = rows.map((row) => row.areaHa as number).sort((x, y) => y - x);
  const threshold = values[Math.ceil(top * values.length - 1e-9) - 1] as number;
  return { threshold, years: rows.filter((row) => (row.areaHa as number) >= threshold && (row.areaHa as number) > 0).map((row) => row.year) };
}

describe("modernEra — modern high-fire years and odds by phase", () => {
  const workspace = twoEraWorkspace(1.8);
  const calibration = runCalibration(workspace);
  const modern = calibration.modern!;

  it("takes the modern years with an area value and an index value, and picks its high-fire years by the fire-scar rule (brute force)", () => {
    const rows = workspace.modern!;
    expect(modern.measure).toBe("area");
    expect(modern.period).toEqual({ first: 1881, last: 2020, years: 140 });
    const expected = bruteForceFireYears(rows, 0.1);
    expect(modern.threshold).toBe(expected.threshold);
    expect(modern.fireYears).toEqual(expected.years);
    expect(modern.realisedShare).toBeCloseTo(expected.years.length / 140, 12);
    expect(modern.baseRate.estimate).toBeCloseTo(expected.years.length / 140, 12);
  });

  it("counts each phase of A with the fire-scar cuts (≤ −0.5 low, ≥ 0.5 high) by brute force, with Wilson intervals", () => {
    const a = workspace.indices.find((series) => series.name === "A")!;
    const fire = new Set(modern.fireYears);
    const counts = { low: [0, 0], mid: [0, 0], high: [0, 0] } as Record<string, [number, number]>;
    a.years.forEach((year, i) => {
      if (year <= 1880) return;
      const value = a.values[i] as number;
      const label = value <= -0.5 ? "low" : value >= 0.5 ? "high" : "mid";
      counts[label]![0] += 1;
      if (fire.has(year)) counts[label]![1] += 1;
    });
    const index = modern.indices.find((candidate) => candidate.name === "A")!;
    for (const phase of index.phases) {
      const [years, fireYears] = counts[phase.label]!;
      expect([phase.years, phase.fireYears]).toEqual([years, fireYears]);
      // Wilson score interval by its closed form with jStat's normal quantile.
      const z = jStat.normal.inv(0.975, 0, 1);
      const p = fireYears / years;
      const centre = (p + (z * z) / (2 * years)) / (1 + (z * z) / years);
      const half = (z * Math.sqrt((p * (1 - p)) / years + (z * z) / (4 * years * years))) / (1 + (z * z) / years);
      expect(phase.probability.lower).toBeCloseTo(Math.max(0, centre - half), 10);
      expect(phase.probability.upper).toBeCloseTo(Math.min(1, centre + half), 10);
    }
  });

  it("B (terciles) keeps the fire-scar calibration's cuts, not terciles of the modern years", () => {
    const b = calibration.indices.find((index) => index.name === "B")!;
    const series = workspace.indices.find((candidate) => candidate.name === "B")!;
    const fire = new Set(modern.fireYears);
    const expected = [0, 0, 0];
    series.years.forEach((year, i) => {
      if (year <= 1880) return;
      const value = series.values[i] as number;
      const [low, high] = b.definition.cuts as [number, number];
      expected[value <= low ? 0 : value >= high ? 2 : 1]! += 1;
    });
    const index = modern.indices.find((candidate) => candidate.name === "B")!;
    expect(index.phases.map((phase) => phase.years)).toEqual(expected);
    expect(index.phases.reduce((sum, phase) => sum + phase.fireYears, 0)).toBe([...fire].length);
  });

  it("translates a high-fire year into hectares and fires (median and range per group)", () => {
    const rows = workspace.modern!;
    const fire = new Set(modern.fireYears);
    const high = rows.filter((row) => fire.has(row.year)).map((row) => row.areaHa as number);
    expect(modern.meaning.areaHa.highFire.median).toBeCloseTo(jStat.median(high), 10);
    expect(modern.meaning.areaHa.highFire.min).toBe(Math.min(...high));
    expect(modern.meaning.areaHa.highFire.max).toBe(Math.max(...high));
    const otherFires = rows.filter((row) => !fire.has(row.year)).map((row) => row.fires as number);
    expect(modern.meaning.fires.other.median).toBeCloseTo(jStat.median(otherFires), 10);
    expect(modern.meaning.areaHa.other.years).toBe(140 - high.length);
  });

  it("the overlap of both records is counted (here none: the fire-scar calibration ends in 1880)", () => {
    expect(modern.agreement.years).toBe(0);
    expect(modern.agreement.agreementShare).toBeNull();
    expect(modern.agreement.reason).toMatch(/no year is in both records/);
  });

  it("measure 'fires' picks the high-fire years by fire counts", () => {
    const byFires = runCalibration({ ...workspace, settings: { ...workspace.settings, methods: { ...workspace.settings.methods, modernMeasure: "fires" } } });
    const rows = workspace.modern!.map((row) => ({ ...row, areaHa: row.fires }));
    expect(byFires.modern!.measure).toBe("fires");
    expect(byFires.modern!.fireYears).toEqual(bruteForceFireYears(rows, 0.1).years);
  });
});

describe("modernEra — the two-era homogeneity test (Breslow–Day with Tarone's correction)", () => {
  const same = runCalibration(twoEraWorkspace(1.8)).modern!.indices.find((index) => index.name === "A")!.homogeneity;
  const reversed = runCalibration(twoEraWorkspace(-1.8)).modern!.indices.find((index) => index.name === "A")!.homogeneity;

  it("the same planted link in both eras → a large p and 'cannot tell'", () => {
    expect(same.phase).toBe("high");
    expect(same.pValue).toBeGreaterThan(0.05);
    expect(same.canTell).toBe(false);
    expect(same.sentence).toMatch(/cannot tell/);
    expect(same.sentence).toMatch(/140 modern years/);
  });

  it("a reversed link in the modern era → a small p, 'weaker', and a sentence that says so", () => {
    expect(reversed.pValue).toBeLessThan(0.001);
    expect(reversed.direction).toBe("weaker");
    expect(reversed.canTell).toBe(true);
    expect(reversed.sentence).toMatch(/^The A high association with high-fire years looks weaker in the modern record/);
    expect(reversed.modernOddsRatio!).toBeLessThan(1);
    expect(reversed.fireScarOddsRatio!).toBeGreaterThan(1);
  });

  it("each era's 2×2 table is its phase-vs-rest × high-fire count, and the fire-scar era leaves out modern years", () => {
    const workspace = twoEraWorkspace(1.8);
    const calibration = runCalibration(workspace);
    const a = workspace.indices.find((series) => series.name === "A")!;
    const fire = new Set(calibration.fireYears.years);
    const table = [
      [0, 0],
      [0, 0],
    ];
    a.years.forEach((year, i) => {
      if (!calibration.years.includes(year)) return;
      const row = (a.values[i] as number) >= 0.5 ? 0 : 1;
      table[row]![fire.has(year) ? 0 : 1]! += 1;
    });
    expect(calibration.modern!.indices[0]!.homogeneity.tables.fireScar).toEqual(table);
    // The p-value is Breslow–Day with Tarone's correction on exactly these two tables.
    const homogeneity = calibration.modern!.indices[0]!.homogeneity;
    const test = breslowDayTest([homogeneity.tables.fireScar, homogeneity.tables.modern], { tarone: true });
    expect(homogeneity.pValue).toBe(test.pValue);
    expect(homogeneity.statistic).toBe(test.statistic);
  });
});

describe("modernEra — no modern record, too few years", () => {
  it("a region without modern-fires.csv → modern null with a reason (also in JSON)", () => {
    const calibration = runCalibration(syntheticWorkspace({ effect: 1, seed: 2 }));
    expect(calibration.modern).toBeNull();
    expect(calibration.modernReason).toMatch(/no modern fire record/);
    const json = toCalibrationJson(calibration) as Record<string, unknown>;
    expect(json.modern).toBeNull();
    expect(json.modernReason).toMatch(/no modern fire record/);
  });

  it(`fewer than ${MIN_MODERN_YEARS} modern years with a value → null with a reason`, () => {
    const result = modernEra({
      rows: [
        { year: 2001, fires: 3, areaHa: 10 },
        { year: 2002, fires: null, areaHa: null },
      ],
      measure: "area",
      top: 0.1,
      indexValues: new Map([["A", new Map([[2001, 0.3], [2002, 1]])]]),
      indices: [],
      calibrationYears: [],
      fireScarFireYears: new Set(),
      interval: "wilson",
    });
    expect(result.modern).toBeNull();
    expect(result.reason).toMatch(/only 0 modern year/);
  });
});

describe("calibration JSON: modern and curve keys (C7)", () => {
  it("has modern.measure, period, threshold, fireYears, baseRate, indices.A.phases and indices.A.homogeneity.pValue; indices.A.curve with its points", () => {
    const json = toCalibrationJson(runCalibration(twoEraWorkspace(1.8))) as Record<string, any>;
    expect(json.modern).toEqual(
      expect.objectContaining({
        measure: "area",
        period: { first: 1881, last: 2020, years: 140 },
        threshold: expect.any(Number),
        fireYears: expect.any(Array),
        baseRate: expect.objectContaining({ estimate: expect.any(Number) }),
      }),
    );
    expect(json.modern.indices.A.phases[2]).toEqual(
      expect.objectContaining({ label: "high", years: expect.any(Number), fireYears: expect.any(Number), probability: expect.objectContaining({ estimate: expect.any(Number), lower: expect.any(Number), upper: expect.any(Number) }) }),
    );
    expect(json.modern.indices.A.homogeneity.pValue).toEqual(expect.any(Number));
    const curve = json.indices.A.curve;
    expect(curve).toEqual(expect.objectContaining({ intercept: expect.any(Number), slope: expect.any(Number), standardErrors: expect.any(Array), pValue: expect.any(Number), method: "maximum likelihood", separation: false }));
    expect(curve.points).toHaveLength(41);
    expect(curve.points[0]).toEqual({ value: expect.any(Number), estimate: expect.any(Number), lower: expect.any(Number), upper: expect.any(Number) });
  });

  it("is byte-identical for the same inputs and seed", () => {
    const first = JSON.stringify(toCalibrationJson(runCalibration(twoEraWorkspace(-1.8, 9))));
    const second = JSON.stringify(toCalibrationJson(runCalibration(twoEraWorkspace(-1.8, 9))));
    expect(second).toBe(first);
  });
});

/** Every null in `value` (objects only) has a `reason` or a `<key>Reason` beside it; returns the paths that do not. */
function nullsWithoutReason(value: unknown, path = "$"): string[] {
  if (Array.isArray(value)) return value.flatMap((item, i) => nullsWithoutReason(item, `${path}[${i}]`));
  if (value === null || typeof value !== "object") return [];
  const record = value as Record<string, unknown>;
  return Object.entries(record).flatMap(([key, item]) =>
    item === null
      ? typeof record.reason === "string" || typeof record[`${key}Reason`] === "string"
        ? []
        : [`${path}.${key}`]
      : nullsWithoutReason(item, `${path}.${key}`),
  );
}

describe("calibration JSON: no null without a reason in modern and curve", () => {
  it("a two-era region, a region without overlap, one without a modern record, and a no-fire index", () => {
    const twoEra = toCalibrationJson(runCalibration(twoEraWorkspace(1.8))) as Record<string, any>;
    expect(nullsWithoutReason(twoEra.modern)).toEqual([]);
    for (const name of ["A", "B"]) expect(nullsWithoutReason({ curve: twoEra.indices[name].curve, curveReason: twoEra.indices[name].curveReason })).toEqual([]);
    const none = toCalibrationJson(runCalibration(syntheticWorkspace({ effect: 1, seed: 2 }))) as Record<string, any>;
    expect(nullsWithoutReason({ modern: none.modern, modernReason: none.modernReason })).toEqual([]);
    // A modern record in which one group has no fire counts at all.
    const base = twoEraWorkspace(1.8);
    const noFires = toCalibrationJson(runCalibration({ ...base, modern: base.modern!.map((row) => ({ ...row, fires: null })) })) as Record<string, any>;
    expect(noFires.modern.meaning.fires.highFire.median).toBeNull();
    expect(nullsWithoutReason(noFires.modern)).toEqual([]);
  });
});
