import { describe, expect, it } from "vitest";
import { valuesByYear } from "../../src/calibrate/activityByYear.js";
import { buildTrainingSet } from "../../src/calibrate/buildTrainingSet.js";
import { forecastCell } from "../../src/calibrate/forecastCell.js";
import { rankIndicesByAssociation } from "../../src/calibrate/rankIndicesByAssociation.js";
import { runCalibration } from "../../src/calibrate/runCalibration.js";
import { classifyPhase } from "../../src/climate/phaseDefinition.js";
import { buildOutlook } from "../../src/outlook/buildOutlook.js";
import { selectionAwareInterval, selectionNote, type SelectionIntervalInput } from "../../src/outlook/selectionAwareInterval.js";
import { toOutlookJson } from "../../src/outlook/toOutlookJson.js";
import { wilsonInterval } from "../../src/stats/wilsonInterval.js";
import type { Workspace } from "../../src/workspace/types.js";
import { syntheticWorkspace } from "../helpers/syntheticWorkspace.js";

function inputOf(workspace: Workspace, current: Record<string, number>, resamples: number, seed: number): SelectionIntervalInput {
  const calibration = runCalibration(workspace);
  const indexValues = new Map(workspace.indices.map((series) => [series.name, valuesByYear(series)]));
  const training = buildTrainingSet({
    years: calibration.years,
    activity: calibration.activity,
    indexValues,
    indexSettings: workspace.settings.indices,
    top: 0.1,
    measure: "fraction",
  });
  return {
    years: calibration.years,
    activity: calibration.activity,
    indexValues,
    indexSettings: workspace.settings.indices,
    isFireYear: training.isFireYear,
    categories: training.categories,
    top: 0.1,
    measure: "fraction",
    current: new Map(Object.entries(current)),
    jointMinYears: 10,
    jointMaxQ: 0.05,
    response: "phase",
    blockYears: 5,
    resamples,
    seed,
  };
}

/** The rule's own odds on all calibration years (no resampling), for the Wilson interval beside it. */
function plainOdds(input: SelectionIntervalInput): { k: number; n: number } {
  const training = buildTrainingSet({ years: input.years, activity: input.activity, indexValues: input.indexValues, indexSettings: input.indexSettings, top: 0.1, measure: "fraction" });
  const phases = new Map([...input.current].map(([name, value]) => [name, classifyPhase(value, training.definitions.get(name)!.cuts)]));
  const ranking = rankIndicesByAssociation(training, input.indexSettings.map((settings) => settings.name));
  const cell = forecastCell(training, phases, ranking, 10, 0.05);
  return { k: cell.fireYears, n: cell.years.length };
}

describe("selectionAwareInterval — bootstrap of the whole rule", () => {
  it("is deterministic for a seed and changes with the seed", () => {
    const workspace = syntheticWorkspace({ effect: 1.2, seed: 4 });
    const first = selectionAwareInterval(inputOf(workspace, { A: 1.2, B: 0.3 }, 199, 17));
    const again = selectionAwareInterval(inputOf(workspace, { A: 1.2, B: 0.3 }, 199, 17));
    const other = selectionAwareInterval(inputOf(workspace, { A: 1.2, B: 0.3 }, 199, 18));
    expect(JSON.stringify(again)).toBe(JSON.stringify(first));
    expect(other.interval).not.toEqual(first.interval);
    expect(first.interval!.lower).toBeLessThanOrEqual(first.interval!.upper);
    expect(first.interval!.resamples).toBe(199);
    expect(first.interval!.method).toMatch(/moving-block bootstrap .* blocks of 5 years/);
  });

  it("on no-link regions it is at least as wide as the Wilson interval of the chosen cell in most regions (≥ 8 of 10)", () => {
    let wider = 0;
    for (let seed = 1; seed <= 10; seed += 1) {
      const workspace = syntheticWorkspace({ effect: 0, seed: 100 + seed });
      const input = inputOf(workspace, { A: 1.1, B: -0.8 }, 199, seed);
      const result = selectionAwareInterval(input);
      const { k, n } = plainOdds(input);
      const wilson = wilsonInterval(k, n);
      if (result.interval!.upper - result.interval!.lower >= wilson.upper - wilson.lower) wider += 1;
    }
    expect(wider).toBeGreaterThanOrEqual(8);
  });

  it("with one block of all the years every resample is the calibration itself, so the interval collapses onto the rule's own odds", () => {
    // A one-block region (block = all years) reproduces the calibration exactly: the interval collapses onto the rule's own odds.
    const workspace = syntheticWorkspace({ effect: 1.2, seed: 4 });
    const input = { ...inputOf(workspace, { A: 1.2, B: 0.3 }, 20, 3), blockYears: 10_000 };
    const { k, n } = plainOdds(input);
    const result = selectionAwareInterval(input);
    expect(result.interval!.lower).toBeCloseTo(k / n, 12);
    expect(result.interval!.upper).toBeCloseTo(k / n, 12);
  });

  it("fewer than 10 calibration years → null with a reason", () => {
    const workspace = syntheticWorkspace({ effect: 1.2, seed: 4, first: 1981, last: 1989 });
    const result = selectionAwareInterval(inputOf(workspace, { A: 1 }, 50, 1));
    expect(result.interval).toBeNull();
    expect(result.reason).toMatch(/only 9 calibration years/);
  });
});

describe("selectionNote — when the two intervals differ much (width ratio above 1.5)", () => {
  const format = (lower: number, upper: number) => `${Math.round(lower * 100)}–${Math.round(upper * 100)}%`;
  const interval = (lower: number, upper: number) => ({ lower, upper, resamples: 999, blockYears: 5, level: 0.95, seed: 1, method: "m" });
  it("wider by more than 1.5 → a sentence; within 1.5 → null; narrower by more than 1.5 → a sentence", () => {
    expect(selectionNote({ lower: 0.2, upper: 0.4 }, interval(0.1, 0.46), format)).toMatch(/^Allowing for how the rule chose .* 10–46%, 1.8 times as wide as the 20–40%/);
    expect(selectionNote({ lower: 0.2, upper: 0.4 }, interval(0.18, 0.45), format)).toBeNull();
    expect(selectionNote({ lower: 0.2, upper: 0.4 }, interval(0.25, 0.3), format)).toMatch(/narrower than the 20–40%/);
    expect(selectionNote({ lower: 0.2, upper: 0.4 }, null, format)).toBeNull();
  });
});

describe("buildOutlook: fireYear.selectionInterval beside the Wilson interval", () => {
  it("is in the outlook JSON with its settings, and byte-identical for the same seed", () => {
    const make = () => {
      const workspace = syntheticWorkspace({ effect: 1.2, seed: 4, methods: { permutations: 0, bootstrapResamples: 199 } });
      return JSON.stringify(toOutlookJson(buildOutlook(workspace, runCalibration(workspace), { values: { A: 1.2, B: 0.3 }, issued: "2027-03-10", season: 2027 })));
    };
    const first = make();
    expect(make()).toBe(first);
    const json = JSON.parse(first);
    expect(json.fireYear.selectionInterval).toEqual(expect.objectContaining({ lower: expect.any(Number), upper: expect.any(Number), resamples: 199, blockYears: 5, method: expect.any(String) }));
  });
});
