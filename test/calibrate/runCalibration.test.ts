import { describe, expect, it } from "vitest";
import { calibrationBasis, runCalibration } from "../../src/calibrate/runCalibration.js";
import { toCalibrationJson } from "../../src/calibrate/toCalibrationJson.js";
import { buildOutlook, outlookHindcastInput } from "../../src/outlook/buildOutlook.js";
import { toOutlookJson } from "../../src/outlook/toOutlookJson.js";
import { syntheticWorkspace, withCutsForA } from "../helpers/syntheticWorkspace.js";

/** Outlook tests here check the odds, not the skill verdict: no permutation test, few bootstrap resamples. */
const QUICK = { permutations: 0, bootstrapResamples: 199 } as const;

describe("runCalibration(workspace)", () => {
  const workspace = syntheticWorkspace({ effect: 1.6, seed: 11 });
  const calibration = runCalibration(workspace);

  it("calibrates over the overlap of fire record and indices", () => {
    expect(calibration.period).toEqual({ first: 1701, last: 1990, years: 290 });
    expect(calibration.fireYears.years.length).toBeGreaterThanOrEqual(29);
    expect(calibration.baseRate.estimate).toBeCloseTo(calibration.fireYears.years.length / 290, 12);
  });

  it("finds the planted link of index A and none for the noise index B", () => {
    const a = calibration.indices.find((index) => index.name === "A");
    const b = calibration.indices.find((index) => index.name === "B");
    const high = a?.phases[2]?.probability.estimate ?? 0;
    const low = a?.phases[0]?.probability.estimate ?? 1;
    expect(high).toBeGreaterThan(2 * low);
    expect(a?.contingency.pValue).toBeLessThan(0.001);
    expect(b?.contingency.pValue).toBeGreaterThan(0.01);
    // SEA: the index departs upward in the fire year itself (lag 0)
    const lag0 = a?.sea.lags.indexOf(0) as number;
    expect(a?.sea.mean[lag0]).toBeGreaterThan((a?.sea.ci95[lag0] as [number, number])[1]);
  });

  it("counts each phase's years and fire years consistently", () => {
    for (const index of calibration.indices) {
      expect(index.phases.reduce((sum, phase) => sum + phase.years, 0)).toBe(index.years);
      expect(index.phases.reduce((sum, phase) => sum + phase.fireYears, 0)).toBe(calibration.fireYears.years.length);
    }
  });

  it("gives byte-identical JSON for the same inputs and seed, and other limits for another seed", () => {
    const again = JSON.stringify(toCalibrationJson(runCalibration(syntheticWorkspace({ effect: 1.6, seed: 11 }))));
    expect(again).toBe(JSON.stringify(toCalibrationJson(calibration)));
    const other = syntheticWorkspace({ effect: 1.6, seed: 11 });
    const reseeded = runCalibration({ ...other, settings: { ...other.settings, seed: 12 } });
    expect(reseeded.indices[0]?.sea.ci95).not.toEqual(calibration.indices[0]?.sea.ci95);
    expect(reseeded.indices[0]?.phases).toEqual(calibration.indices[0]?.phases);
  });

  it("keeps every promised JSON key (README, JSON output)", () => {
    const json = toCalibrationJson(calibration) as Record<string, any>;
    expect(json.schema).toBe("firephase.calibration/1");
    expect(Object.keys(json)).toEqual(expect.arrayContaining(["region", "period", "fireYears", "indices"]));
    expect(json.fireYears).toEqual(expect.objectContaining({ top: 0.1, threshold: expect.any(Number), years: expect.any(Array) }));
    const a = json.indices.A;
    expect(a.phases[0]).toEqual(
      expect.objectContaining({ label: "low", years: expect.any(Number), fireYears: expect.any(Number), probability: expect.objectContaining({ estimate: expect.any(Number), lower: expect.any(Number), upper: expect.any(Number) }) }),
    );
    expect(a.contingency).toEqual(expect.objectContaining({ chiSquare: expect.any(Number), df: 2, pValue: expect.any(Number) }));
    expect(a.contingency.perPhase[0]).toEqual(expect.objectContaining({ label: "low", fisherPValue: expect.any(Number), residual: expect.any(Number) }));
    expect(a.sea).toEqual(expect.objectContaining({ lags: [-4, -3, -2, -1, 0, 1, 2], mean: expect.any(Array), ci95: expect.any(Array), ci99: expect.any(Array), pValue: expect.any(Array) }));
    expect(a.aggregated).toEqual(expect.objectContaining({ blockYears: 5, lags: [-2, -1, 0, 1, 2], r: expect.any(Array), pValue: expect.any(Array) }));
  });
});

describe("buildOutlook(workspace, calibration, request)", () => {
  // No permutation test and few resamples: these tests are about the odds, not the skill verdict.
  const workspace = syntheticWorkspace({ effect: 1.6, seed: 11, methods: { jointMinYears: 10, ...QUICK } });
  const calibration = runCalibration(workspace);

  it("reads a high-A season from the high-A years and raises the odds above the base rate", () => {
    const outlook = buildOutlook(workspace, calibration, { values: { A: 1.4, B: 0.1 }, issued: "2027-03-10", season: 2027 });
    expect(outlook.fireYear.basisIndices[0]).toBe("A");
    expect(outlook.fireYear.estimate).toBeGreaterThan(calibration.baseRate.estimate as number);
    const c = outlook.categories;
    expect((c.below.estimate ?? 0) + (c.near.estimate ?? 0) + (c.above.estimate ?? 0)).toBeCloseTo(1, 12);
    expect(outlook.analogs).toHaveLength(10);
    expect(outlook.analogs.every((analog, i, all) => i === 0 || (all[i - 1]?.distance ?? 0) <= analog.distance)).toBe(true);
  });

  it("falls back to climatology without current values and says so", () => {
    const outlook = buildOutlook(workspace, calibration, { values: {}, issued: "2027-03-10", season: 2027 });
    expect(outlook.fireYear.estimate).toBeCloseTo(calibration.baseRate.estimate as number, 12);
    expect(outlook.fireYear.basis).toMatch(/long-term average/);
    expect(outlook.missing).toEqual(["A", "B"]);
  });

  it("warns when a value lies beyond five standard deviations", () => {
    const outlook = buildOutlook(workspace, calibration, { values: { A: 9 }, issued: "2027-03-10", season: 2027 });
    expect(outlook.warnings.map((w) => w.code)).toContain("value-far-outside");
  });

  it("carries every promised outlook JSON key", () => {
    const json = toOutlookJson(buildOutlook(workspace, calibration, { values: { A: 1.4, B: 0.1 }, issued: "2027-03-10", season: 2027 })) as Record<string, any>;
    expect(json).toEqual(
      expect.objectContaining({
        schema: "firephase.outlook/1",
        issued: "2027-03-10",
        season: 2027,
        baseRate: expect.objectContaining({ estimate: expect.any(Number) }),
        phases: { A: "high", B: "middle" },
        fireYear: expect.objectContaining({ estimate: expect.any(Number), lower: expect.any(Number), upper: expect.any(Number), basis: expect.any(String) }),
        categories: expect.objectContaining({ below: expect.any(Object), near: expect.any(Object), above: expect.any(Object) }),
        analogs: expect.any(Array),
        hindcast: expect.objectContaining({ years: 290, brierSkillScore: expect.any(Number), rpss: expect.any(Number), rocArea: expect.any(Number) }),
      }),
    );
    expect(json.analogs[0]).toEqual(expect.objectContaining({ year: expect.any(Number), distance: expect.any(Number), fireYear: expect.any(Boolean), activity: expect.any(Number) }));
  });

  it("falls back as the hindcast does when this season's phase has no past year", () => {
    // Cuts at ±5 leave the outer phases of index A empty in a standard-normal record.
    const wide = withCutsForA(syntheticWorkspace({ effect: 1.6, seed: 11, methods: QUICK }), [-5, 5], ["low", "mid", "high"]);
    const wideCalibration = runCalibration(wide);
    const alone = buildOutlook(wide, wideCalibration, { values: { A: 10 }, issued: "2027-03-10", season: 2027 });
    expect(alone.fireYear.estimate).toBeCloseTo(wideCalibration.baseRate.estimate as number, 12);
    expect(alone.fireYear.basis).toMatch(/no past year shared this season's phases/);
    const withB = buildOutlook(wide, wideCalibration, { values: { A: 10, B: 0.1 }, issued: "2027-03-10", season: 2027 });
    expect(withB.fireYear.basisIndices).toEqual(["B"]);
    expect(withB.fireYear.estimate).not.toBeNull();
  });

  it("says why a weak index is not combined, and warns when the odds rest on an index without a clear link", () => {
    const strong = buildOutlook(workspace, calibration, { values: { A: 1.4, B: 0.1 }, issued: "2027-03-10", season: 2027 });
    expect(strong.fireYear.basisIndices).toEqual(["A"]);
    expect(strong.fireYear.basis).toMatch(/B is not combined with it because its link is not clear, q = /);
    expect(strong.warnings.map((w) => w.code)).not.toContain("no-clear-link");
    const weak = buildOutlook(workspace, calibration, { values: { B: 0.1 }, issued: "2027-03-10", season: 2027 });
    expect(weak.fireYear.basisIndices).toEqual(["B"]);
    expect(weak.warnings.find((w) => w.code === "no-clear-link")?.message).toMatch(/^the odds rest on B, whose link to high-fire years is not clear/);
  });

  it("gives, for a value near a phase boundary, the odds the outlook itself would give on the other side", () => {
    const near = buildOutlook(workspace, calibration, { values: { A: 0.45 }, issued: "2027-03-10", season: 2027 });
    const other = buildOutlook(workspace, calibration, { values: { A: 0.55 }, issued: "2027-03-10", season: 2027 });
    const note = near.warnings.find((w) => w.code === "basis-near-boundary")?.message ?? "";
    expect(note).toContain("had it been high");
    expect(note).toContain(`the chance would be ${Math.round((other.fireYear.estimate as number) * 100)}%`);
    expect(note).toContain(`${other.fireYear.years} years)`);
  });
});

describe("buildOutlook when the strongest index's phase has no past year", () => {
  it("names the index actually used and why", () => {
    // A fourth phase of A beyond 5 is empty in a standard-normal record, while A keeps its measured link.
    const wide = withCutsForA(syntheticWorkspace({ effect: 1.6, seed: 11, methods: QUICK }), [-0.5, 0.5, 5], ["low", "mid", "high", "extreme"]);
    const outlook = buildOutlook(wide, runCalibration(wide), { values: { A: 10, B: 0.1 }, issued: "2027-03-10", season: 2027 });
    expect(outlook.fireYear.basisIndices).toEqual(["B"]);
    expect(outlook.fireYear.basis).toMatch(/the most strongly linked index with past years in its current phase; no past year shared this season's phase of A\)$/);
    expect(outlook.warnings.map((w) => w.code)).toContain("no-clear-link");
  });
});

describe("calibrationBasis(workspace): the first step of runCalibration, all the hindcast needs", () => {
  it("gives the calibration's years and their activity, and runCalibration with it equals runCalibration without it", () => {
    const workspace = syntheticWorkspace({ effect: 1.2, seed: 5 });
    const basis = calibrationBasis(workspace);
    const calibration = runCalibration(workspace, {}, basis);
    expect(calibration.years).toBe(basis.period.years);
    expect([...calibration.activity]).toEqual([...basis.calibrationActivity]);
    expect(toCalibrationJson(calibration)).toEqual(toCalibrationJson(runCalibration(workspace)));
    // The outlook's hindcast input is the same from the basis as from the whole calibration.
    const request = { values: { A: 1.1, B: -0.4 }, issued: "2027-03-10", season: 2027 };
    expect(outlookHindcastInput(workspace, { years: basis.period.years, activity: basis.calibrationActivity }, request)).toEqual(outlookHindcastInput(workspace, calibration, request));
  });
});
