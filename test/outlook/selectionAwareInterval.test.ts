import { describe, expect, it } from "vitest";
import jStat from "jstat";
import { valuesByYear } from "../../src/calibrate/activityByYear.js";
import { buildTrainingSet } from "../../src/calibrate/buildTrainingSet.js";
import { forecastCell } from "../../src/calibrate/forecastCell.js";
import { rankIndicesByAssociation } from "../../src/calibrate/rankIndicesByAssociation.js";
import { runCalibration } from "../../src/calibrate/runCalibration.js";
import { curveForecast } from "../../src/calibrate/curveForecast.js";
import { buildOutlook } from "../../src/outlook/buildOutlook.js";
import { createRandom } from "../../src/stats/createRandom.js";
import { movingBlockBootstrapIndices } from "../../src/stats/movingBlockBootstrap.js";
import { quantileSorted } from "../../src/stats/quantileSorted.js";
import { classifyPhase, phaseDefinition } from "../../src/climate/phaseDefinition.js";
import type { PhaseDefinition } from "../../src/climate/types.js";
import type { TrainingSet } from "../../src/calibrate/buildTrainingSet.js";
import type { ActivityCategories } from "../../src/record/types.js";
import { curveScratch, readFastResponseCurve, type CurveScratch } from "../../src/hindcast/fastResponseCurve.js";
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
    indexValues,
    indexSettings: workspace.settings.indices,
    isFireYear: training.isFireYear,
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
function plainOdds(input: SelectionIntervalInput, activity: ReadonlyMap<number, number>): { k: number; n: number } {
  const training = buildTrainingSet({ years: input.years, activity, indexValues: input.indexValues, indexSettings: input.indexSettings, top: 0.1, measure: "fraction" });
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
      const { k, n } = plainOdds(input, runCalibration(workspace).activity);
      const wilson = wilsonInterval(k, n);
      if (result.interval!.upper - result.interval!.lower >= wilson.upper - wilson.lower) wider += 1;
    }
    expect(wider).toBeGreaterThanOrEqual(8);
  });

  it("with one block of all the years every resample is the calibration itself, so the interval collapses onto the rule's own odds", () => {
    // A one-block region (block = all years) reproduces the calibration exactly: the interval collapses onto the rule's own odds.
    const workspace = syntheticWorkspace({ effect: 1.2, seed: 4 });
    const input = { ...inputOf(workspace, { A: 1.2, B: 0.3 }, 20, 3), blockYears: 10_000 };
    const { k, n } = plainOdds(input, runCalibration(workspace).activity);
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

/**
 * The same bootstrap rebuilt from the outlook's own functions, one resample at a time: buildTrainingSet with the
 * event fixed from the whole period, rankIndicesByAssociation, forecastCell and curveForecast.
 */
function slowSelectionInterval(input: SelectionIntervalInput, calibrationActivity: ReadonlyMap<number, number>, calibrationThreshold: number | null, cuts: { lowerCut: number; upperCut: number }): [number, number] {
  const random = createRandom(input.seed);
  const n = input.years.length;
  const estimates: number[] = [];
  for (let resample = 0; resample < input.resamples; resample += 1) {
    const positions = movingBlockBootstrapIndices(n, input.blockYears, random);
    const years = positions.map((_, i) => i);
    const activity = new Map(positions.map((position, i) => [i, calibrationActivity.get(input.years[position]!)!]));
    const indexValues = new Map(
      [...input.indexValues].map(([name, values]) => [
        name,
        new Map(positions.flatMap((position, i) => (values.has(input.years[position]!) ? [[i, values.get(input.years[position]!)!] as const] : []))),
      ]),
    );
    const training = buildTrainingSet({ years, activity, indexValues, indexSettings: input.indexSettings, top: 0.1, measure: "fraction", event: { threshold: calibrationThreshold, ...cuts } });
    const phases = new Map([...input.current].map(([name, value]) => [name, classifyPhase(value, training.definitions.get(name)!.cuts)]));
    const ranking = rankIndicesByAssociation(training, input.indexSettings.map((settings) => settings.name));
    const cell = forecastCell(training, phases, ranking, input.jointMinYears, input.jointMaxQ);
    const phaseOdds = cell.fireYears / cell.years.length;
    const curve = input.response === "curve" ? curveForecast(training, indexValues, cell, input.current) : null;
    estimates.push(curve?.forecast ? curve.forecast.reading.estimate : phaseOdds);
  }
  estimates.sort((a, b) => a - b);
  return [jStat.percentile(estimates, 0.025), jStat.percentile(estimates, 0.975)];
}

describe("selectionAwareInterval against the outlook's own functions rebuilt resample by resample", () => {
  for (const response of ["phase", "curve"] as const) {
    it(`response "${response}": the same percentile interval as buildTrainingSet + rankIndicesByAssociation + forecastCell${response === "curve" ? " + curveForecast" : ""} on each resample`, () => {
      const workspace = syntheticWorkspace({ effect: 1.4, seed: 21 });
      const input = { ...inputOf(workspace, { A: 1.3, B: -0.2 }, 60, 5), response };
      const calibration = runCalibration(workspace);
      const fast = selectionAwareInterval(input).interval!;
      const [lower, upper] = slowSelectionInterval(input, calibration.activity, calibration.fireYears.threshold, { lowerCut: calibration.categories.lowerCut, upperCut: calibration.categories.upperCut });
      expect(fast.lower).toBeCloseTo(lower, 9);
      expect(fast.upper).toBeCloseTo(upper, 9);
    });
  }
});

/** The index values with one index's values left out in the years `drop` picks (missing values for the tests). */
function withoutYears(values: SelectionIntervalInput["indexValues"], name: string, drop: (year: number) => boolean): SelectionIntervalInput["indexValues"] {
  const out = new Map(values);
  out.set(name, new Map([...(values.get(name) as Map<number, number>)].filter(([year]) => !drop(year))));
  return out;
}

describe("selectionAwareInterval resample by resample: each single-resample interval is that resample's odds, exactly", () => {
  // One resample gives lower = upper = its odds, so 30 seeds compare 30 resamples one by one (exactly for the phase
  // rule's counts; to 12 decimals for the curve, whose Newton iterations differ in rounding):
  // missing values in one index, joint cells allowed (q gate 1, 3 years), this season's value for both or one index.
  const workspace = syntheticWorkspace({ effect: 1.1, seed: 8 });
  const calibration = runCalibration(workspace);
  const base = inputOf(workspace, { A: 0.9, B: -0.7 }, 1, 1);
  const gappy = withoutYears(base.indexValues, "B", (year) => year % 7 === 3);
  const cases: { label: string; input: SelectionIntervalInput }[] = [
    { label: "joint cells allowed, B with gaps", input: { ...base, indexValues: gappy, jointMaxQ: 1, jointMinYears: 3 } },
    { label: "the outlook's own gate", input: { ...base, indexValues: gappy } },
    { label: "only B has a value this season", input: { ...base, indexValues: gappy, current: new Map([["B", 0.2]]), jointMaxQ: 1, jointMinYears: 3 } },
  ];
  for (const { label, input } of cases) {
    for (const response of ["phase", "curve"] as const) {
      it(`${label}, response "${response}"`, () => {
        for (let seed = 1; seed <= 30; seed += 1) {
          const one = { ...input, response, seed };
          const fast = selectionAwareInterval(one).interval!;
          const [slow] = slowSelectionInterval(one, calibration.activity, calibration.fireYears.threshold, { lowerCut: calibration.categories.lowerCut, upperCut: calibration.categories.upperCut });
          if (response === "phase") {
            expect(fast.lower).toBe(slow);
            expect(fast.upper).toBe(slow);
          } else {
            // readFastResponseCurve's Newton steps end within rounding of fitResponseCurve's, not bit for bit.
            expect(fast.lower).toBeCloseTo(slow as number, 12);
            expect(fast.upper).toBe(fast.lower);
          }
        }
      });
    }
  }
});

/**
 * The map-based resample of the release before the typed-array rewrite, kept as an exact reference: each resample
 * a TrainingSet of pseudo-years (phaseDefinition, classifyPhase), rankIndicesByAssociation, forecastCell, and
 * readFastResponseCurve with one scratch per index name (the same warm starts in the same order). The typed
 * version must give bit for bit the same percentile interval, for the curve rule too.
 */
function mapBasedSelectionInterval(input: SelectionIntervalInput, categories: ActivityCategories): [number, number] {
  const n = input.years.length;
  const blockYears = Math.max(1, Math.min(Math.round(input.blockYears), n));
  const random = createRandom(input.seed);
  const names = input.indexSettings.map((settings) => settings.name);
  const values = new Map(input.indexSettings.map((settings) => [settings.name, Float64Array.from(input.years, (year) => input.indexValues.get(settings.name)?.get(year) ?? Number.NaN)]));
  const fire = input.years.map((year) => input.isFireYear.has(year));
  const scratch = new Map<string, CurveScratch>();
  const estimates: number[] = [];
  for (let resample = 0; resample < input.resamples; resample += 1) {
    const positions = movingBlockBootstrapIndices(n, blockYears, random);
    const pseudoYears = positions.map((_, i) => i);
    const isFireYear = new Set(pseudoYears.filter((i) => fire[positions[i] as number]));
    const definitions = new Map<string, PhaseDefinition>();
    const phaseOf = new Map<string, Map<number, number>>();
    for (const settings of input.indexSettings) {
      const byPosition = values.get(settings.name) as Float64Array;
      const drawnYears = pseudoYears.filter((i) => !Number.isNaN(byPosition[positions[i] as number] as number));
      const drawn = drawnYears.map((i) => byPosition[positions[i] as number] as number);
      const definition = phaseDefinition(settings, drawn);
      definitions.set(settings.name, definition);
      phaseOf.set(settings.name, new Map(drawnYears.map((year, k) => [year, classifyPhase(drawn[k] as number, definition.cuts)])));
    }
    const fireYears = pseudoYears.filter((year) => isFireYear.has(year));
    const training: TrainingSet = {
      years: pseudoYears,
      fireYears: { top: 0.1, measure: "fraction", threshold: null, years: fireYears, realisedShare: fireYears.length / n, calibrationYears: n },
      isFireYear,
      categories: { ...categories, byYear: new Map() },
      definitions,
      phaseOf,
    };
    const phases = new Map([...input.current].flatMap(([name, value]) => (definitions.has(name) ? [[name, classifyPhase(value, (definitions.get(name) as PhaseDefinition).cuts)] as const] : [])));
    const cell = forecastCell(training, phases, rankIndicesByAssociation(training, names), input.jointMinYears, input.jointMaxQ);
    const phaseOdds = cell.years.length === 0 ? fireYears.length / n : cell.fireYears / cell.years.length;
    const index = input.response === "phase" || cell.basis === "climatology" ? undefined : cell.indices[0];
    if (index === undefined) {
      estimates.push(phaseOdds);
      continue;
    }
    const buffers = scratch.get(index) ?? curveScratch(n);
    scratch.set(index, buffers);
    const byPosition = values.get(index) as Float64Array;
    let m = 0;
    for (let i = 0; i < n; i += 1) {
      const x = byPosition[positions[i] as number] as number;
      if (Number.isNaN(x)) continue;
      buffers.x[m] = x;
      buffers.y[m] = isFireYear.has(i) ? 1 : 0;
      m += 1;
    }
    const estimate = readFastResponseCurve(buffers, m, input.current.get(index) as number);
    estimates.push(Number.isNaN(estimate) ? phaseOdds : estimate);
  }
  estimates.sort((a, b) => a - b);
  return [quantileSorted(estimates, 0.025), quantileSorted(estimates, 0.975)];
}

describe("selectionAwareInterval against the map-based resample of the previous release, bit for bit", () => {
  const workspace = syntheticWorkspace({ effect: 1.3, seed: 17 });
  const calibration = runCalibration(workspace);
  const base = inputOf(workspace, { A: 1.1, B: -0.8 }, 120, 9);
  const gappy = withoutYears(base.indexValues, "B", (year) => year % 5 === 1);
  for (const response of ["phase", "curve"] as const) {
    for (const gate of [{ jointMaxQ: 0.05, jointMinYears: 10 }, { jointMaxQ: 1, jointMinYears: 3 }]) {
      it(`response "${response}", q gate ${gate.jointMaxQ}, joint cells of at least ${gate.jointMinYears} years, one index with gaps`, () => {
        const input = { ...base, ...gate, indexValues: gappy, response };
        const fast = selectionAwareInterval(input).interval!;
        const [lower, upper] = mapBasedSelectionInterval(input, calibration.categories);
        expect(fast.lower).toBe(lower);
        expect(fast.upper).toBe(upper);
      });
    }
  }
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
