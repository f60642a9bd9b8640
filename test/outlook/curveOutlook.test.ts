import { describe, expect, it } from "vitest";
import { runCalibration } from "../../src/calibrate/runCalibration.js";
import { buildOutlook, type OutlookRequest } from "../../src/outlook/buildOutlook.js";
import { toOutlookJson } from "../../src/outlook/toOutlookJson.js";
import type { MethodSettings, Workspace } from "../../src/workspace/types.js";
import { syntheticWorkspace } from "../helpers/syntheticWorkspace.js";

/** Quick settings for tests: no permutation test, few resamples. */
const QUICK: Partial<MethodSettings> = { permutations: 0, bootstrapResamples: 199 };

function outlookOf(workspace: Workspace, request: Partial<OutlookRequest> & Pick<OutlookRequest, "values">) {
  const calibration = runCalibration(workspace);
  return buildOutlook(workspace, calibration, { issued: "2027-03-10", season: 2027, ...request });
}

describe("buildOutlook with methods.response 'curve' on a planted dose-response region", () => {
  const workspace = syntheticWorkspace({ effect: 1.6, seed: 11, methods: { ...QUICK, response: "curve" } });
  const calibration = runCalibration(workspace);
  const strong = buildOutlook(workspace, calibration, { values: { A: 2.0, B: 0 }, issued: "2027-03-10", season: 2027 });
  const weak = buildOutlook(workspace, calibration, { values: { A: 0.6, B: 0 }, issued: "2027-03-10", season: 2027 });

  it("a strong and a weak value in the same phase (A high, ≥ 0.5) get the same phase odds but higher curve odds for the strong one", () => {
    expect(strong.current[0]!.label).toBe("high");
    expect(weak.current[0]!.label).toBe("high");
    expect(strong.fireYear.phaseOdds!.estimate).toBe(weak.fireYear.phaseOdds!.estimate);
    expect(strong.fireYear.response).toBe("curve");
    expect(strong.fireYear.estimate!).toBeGreaterThan(weak.fireYear.estimate! + 0.1);
    expect(strong.fireYear.estimate).toBe(strong.fireYear.curveOdds!.estimate);
    expect(strong.fireYear.lower).toBe(strong.fireYear.curveOdds!.lower);
    expect(strong.fireYear.basis).toMatch(/^the A response curve read at 2/);
    expect(strong.fireYear.basisIndices).toEqual(["A"]);
  });

  it("says in a plain sentence that this season's value is strong within its phase and what the curve gives", () => {
    expect(strong.fireYear.strengthNote).toMatch(/^This season's A value \(2\) is strong within its high phase/);
    expect(strong.fireYear.strengthNote).toMatch(/the curve gives \d+%/);
    // 0.6 is just above the 0.5 cut: not strong within its phase, so no sentence.
    expect(weak.fireYear.strengthNote).toBeNull();
  });

  it("a value beyond the calibration range is flagged and the curve is read at the largest calibration value", () => {
    const far = buildOutlook(workspace, calibration, { values: { A: 9, B: 0 }, issued: "2027-03-10", season: 2027 });
    const curve = calibration.indices.find((index) => index.name === "A")!.curve!;
    expect(far.fireYear.curveOdds!.beyondRange).toBe("above");
    expect(far.fireYear.curveOdds!.readAt).toBe(curve.range.max);
    expect(far.warnings.map((warning) => warning.code)).toContain("curve-beyond-range");
    const atMax = buildOutlook(workspace, calibration, { values: { A: curve.range.max, B: 0 }, issued: "2027-03-10", season: 2027 });
    expect(far.fireYear.estimate).toBe(atMax.fireYear.estimate);
  });

  it("the hindcast verifies the issued rule: with the curve headline it is the curve rule's, the phase rule's beside it", () => {
    expect(strong.hindcast.issuedRule).toBe("curve");
    expect(strong.hindcast.phaseRule).toBeDefined();
    expect(strong.hindcast.phaseRule!.forecasts.some((forecast) => forecast.basis === "curve")).toBe(false);
    expect(strong.hindcast.forecasts.some((forecast) => forecast.basis === "curve")).toBe(true);
    expect(strong.hindcast.curveRule).toBeNull();
    const json = toOutlookJson(strong) as Record<string, any>;
    expect(json.hindcast.issuedRule).toBe("curve");
    expect(json.hindcast.phaseRule.brierSkillScore).toBe(strong.hindcast.phaseRule!.brierSkillScore);
  });

  it("with response 'phase' the headline is the phase cell and the curve odds stay beside it", () => {
    const phaseWorkspace = syntheticWorkspace({ effect: 1.6, seed: 11, methods: { ...QUICK, response: "phase" } });
    const phase = outlookOf(phaseWorkspace, { values: { A: 2.0, B: 0 } });
    expect(phase.fireYear.response).toBe("phase");
    expect(phase.fireYear.estimate).toBe(phase.fireYear.phaseOdds!.estimate);
    expect(phase.fireYear.curveOdds!.estimate).toBeCloseTo(strong.fireYear.curveOdds!.estimate, 12);
    const json = toOutlookJson(phase) as Record<string, any>;
    expect(json.fireYear).toEqual(expect.objectContaining({ estimate: expect.any(Number), lower: expect.any(Number), upper: expect.any(Number), basis: expect.any(String) }));
    expect(json.fireYear.phaseOdds).toEqual(expect.objectContaining({ estimate: expect.any(Number), years: expect.any(Number) }));
    expect(json.fireYear.curveOdds).toEqual(expect.objectContaining({ index: "A", estimate: expect.any(Number), beyondRange: null }));
    expect(phase.hindcast.issuedRule).toBe("phase");
    expect(phase.hindcast.curveRule?.forecasts.some((forecast) => forecast.basis === "curve")).toBe(true);
  });
});

describe("strength note and curve q-value on records without a link", () => {
  it("a strong value in an outer phase gets no strength note when the curve has no clear link (q across indices above 0.05)", () => {
    let notes = 0;
    let checked = 0;
    for (const seed of [3, 5, 8, 13, 21, 34]) {
      const workspace = syntheticWorkspace({ effect: 0, seed, methods: { ...QUICK, response: "phase" } });
      const calibration = runCalibration(workspace);
      const curve = calibration.indices.find((index) => index.name === "A")!.curve!;
      expect(curve.qValue).toBeGreaterThanOrEqual(curve.pValue);
      const outlook = buildOutlook(workspace, calibration, { values: { A: 2.4, B: 0 }, issued: "2027-03-10", season: 2027 });
      if (curve.qValue! > 0.05) {
        checked += 1;
        if (outlook.fireYear.strengthNote !== undefined && outlook.fireYear.strengthNote !== null) notes += 1;
      }
    }
    expect(checked).toBeGreaterThan(0);
    expect(notes).toBe(0);
  });
});

describe("buildOutlook — current values: sources, details, near-boundary margin, z", () => {
  const workspace = syntheticWorkspace({ effect: 1.6, seed: 11, methods: QUICK });
  const calibration = runCalibration(workspace);
  const sd = calibration.indices.find((index) => index.name === "A")!.sd;

  it("fills current[].source, window, months and provisional from the request's details, and warns about a provisional value", () => {
    const outlook = buildOutlook(workspace, calibration, {
      values: { A: 1.2, B: 0 },
      issued: "2027-03-10",
      season: 2027,
      sources: { B: "--values" },
      details: { A: { source: "indices.csv, Dec 2026–Feb 2027", window: "Dec-Mar", months: ["2026-12", "2027-01", "2027-02"], provisional: true } },
    });
    const [a, b] = outlook.current;
    expect(a).toEqual(expect.objectContaining({ source: "indices.csv, Dec 2026–Feb 2027", window: "Dec-Mar", months: ["2026-12", "2027-01", "2027-02"], provisional: true }));
    expect(b).toEqual(expect.objectContaining({ source: "--values", window: null, months: [], provisional: false }));
    const warning = outlook.warnings.find((candidate) => candidate.code === "value-provisional");
    expect(warning?.message).toMatch(/^A = 1.2 is provisional: computed from Dec 2026–Feb 2027 of its Dec-Mar window/);
    const json = toOutlookJson(outlook) as Record<string, any>;
    expect(json.current[0]).toEqual(expect.objectContaining({ provisional: true, months: ["2026-12", "2027-01", "2027-02"], source: "indices.csv, Dec 2026–Feb 2027" }));
  });

  it("near the boundary means within methods.nearBoundarySd × the index's SD of a cut", () => {
    const near = buildOutlook(workspace, calibration, { values: { A: 0.5 + 0.05 * sd, B: 0 }, issued: "2027-03-10", season: 2027 });
    const far = buildOutlook(workspace, calibration, { values: { A: 0.5 + 0.15 * sd, B: 0 }, issued: "2027-03-10", season: 2027 });
    expect(near.current[0]!.nearBoundary).toBe(true);
    expect(near.current[0]!.nearBoundaryMargin).toBeCloseTo(0.1 * sd, 12);
    expect(far.current[0]!.nearBoundary).toBe(false);
    const wider = syntheticWorkspace({ effect: 1.6, seed: 11, methods: { ...QUICK, nearBoundarySd: 0.2 } });
    expect(outlookOf(wider, { values: { A: 0.5 + 0.15 * sd, B: 0 } }).current[0]!.nearBoundary).toBe(true);
  });

  it("an index with no spread gets z null with a reason beside it, in JSON too", () => {
    const flat: Workspace = {
      ...workspace,
      indices: workspace.indices.map((series) => (series.name === "B" ? { ...series, values: series.values.map(() => 0) } : series)),
    };
    const outlook = outlookOf(flat, { values: { A: 1.2, B: 0 } });
    const b = outlook.current.find((phase) => phase.index === "B")!;
    expect(b.z).toBeNull();
    expect(b.zReason).toMatch(/no spread/);
    const json = toOutlookJson(outlook) as Record<string, any>;
    expect(json.current[1].z).toBeNull();
    expect(json.current[1].zReason).toMatch(/no spread/);
    expect(json.current[0].zReason).toBeUndefined();
  });
});

describe("buildOutlook — index names that are built-in object properties", () => {
  const names = ["constructor", "toString", "hasOwnProperty", "valueOf", "__proto__"];
  for (const name of names) {
    it(`an index named "${name}" without a current value is left out, not read from Object.prototype`, () => {
      const base = syntheticWorkspace({ effect: 1.6, seed: 11, methods: QUICK });
      const workspace: Workspace = {
        ...base,
        settings: { ...base.settings, indices: base.settings.indices.map((index) => (index.name === "B" ? { ...index, name, column: name } : index)) },
        indices: base.indices.map((series) => (series.name === "B" ? { ...series, name } : series)),
      };
      const outlook = outlookOf(workspace, { values: { A: 1.2 } });
      expect(outlook.missing).toEqual([name]);
      expect(outlook.current.map((phase) => phase.index)).toEqual(["A"]);
      const json = toOutlookJson(outlook) as Record<string, any>;
      expect(Object.keys(json.phases)).toEqual(["A"]);
      // With a value, the name is an ordinary own key of the JSON.
      const given = outlookOf(workspace, { values: Object.fromEntries([["A", 1.2], [name, 0.1]]) });
      expect(given.missing).toEqual([]);
      expect(Object.hasOwn(toOutlookJson(given).phases as object, name)).toBe(true);
    });
  }
});

/** Keys whose null is a documented value, not a missing statistic: a value inside the range, a yearly index. */
const NULL_MEANS_NOT_APPLICABLE = new Set(["beyondRange", "window"]);

/** Every null in `value` (objects only) has a `reason` or a `<key>Reason` beside it; returns the paths that do not. */
function nullsWithoutReason(value: unknown, path = "$"): string[] {
  if (Array.isArray(value)) return value.flatMap((item, i) => nullsWithoutReason(item, `${path}[${i}]`));
  if (value === null || typeof value !== "object") return [];
  const record = value as Record<string, unknown>;
  return Object.entries(record).flatMap(([key, item]) =>
    item === null
      ? NULL_MEANS_NOT_APPLICABLE.has(key) || typeof record.reason === "string" || typeof record[`${key}Reason`] === "string"
        ? []
        : [`${path}.${key}`]
      : nullsWithoutReason(item, `${path}.${key}`),
  );
}

describe("outlook JSON: no null without a reason in fireYear and current", () => {
  it("with values, without values (no curve), and on a 9-year record (no selection-aware interval)", () => {
    const workspace = syntheticWorkspace({ effect: 1.6, seed: 11, methods: QUICK });
    const cases = [
      outlookOf(workspace, { values: { A: 1.2, B: 0 } }),
      outlookOf(workspace, { values: {} }),
      outlookOf(syntheticWorkspace({ effect: 1.6, seed: 11, first: 1981, last: 1989, methods: QUICK }), { values: { A: 1.2 } }),
    ];
    for (const outlook of cases) {
      const json = toOutlookJson(outlook) as Record<string, any>;
      expect(nullsWithoutReason({ fireYear: json.fireYear, current: json.current })).toEqual([]);
    }
    expect(cases[1]!.fireYear.curveOdds).toBeNull();
    expect(cases[1]!.fireYear.curveOddsReason).toMatch(/long-term average/);
    expect(cases[1]!.fireYear.selectionNote).toBeNull();
    expect(cases[2]!.fireYear.selectionInterval).toBeNull();
    expect(cases[2]!.fireYear.selectionIntervalReason).toMatch(/only 9 calibration years/);
  });
});
