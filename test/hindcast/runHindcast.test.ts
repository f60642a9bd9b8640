import fc from "fast-check";
import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { activityByYear, valuesByYear } from "../../src/calibrate/activityByYear.js";
import { runHindcast, type HindcastInput, runCurveRuleHindcast, withCurveRule } from "../../src/hindcast/runHindcast.js";
import { compositeFireRecord } from "../../src/record/composite.js";
import { blockPermutationIndices } from "../../src/stats/blockPermutation.js";
import { createRandom } from "../../src/stats/createRandom.js";
import { rocArea } from "../../src/stats/rocArea.js";
import type { IndexSettings } from "../../src/workspace/types.js";
import { syntheticWorkspace, type SyntheticOptions } from "../helpers/syntheticWorkspace.js";

/** Fast settings for tests that do not look at the permutation test, the intervals or the curve rule. */
const LEAN = { permutations: 0, bootstrapResamples: 0, curveRule: false } as const;

function hindcastInput(options: SyntheticOptions): HindcastInput {
  const workspace = syntheticWorkspace(options);
  const record = compositeFireRecord(workspace.fireRecord, 3);
  return {
    years: record.usableYears,
    activity: activityByYear(record, "fraction"),
    indexValues: new Map(workspace.indices.map((series) => [series.name, valuesByYear(series)])),
    indexSettings: workspace.settings.indices,
    indices: ["A", "B"],
    top: 0.1,
    measure: "fraction",
    exclusion: 2,
    jointMinYears: 10,
    jointMaxQ: 0.05,
    seed: options.seed ?? 7,
  };
}

/** The same region with its activity block-shuffled across years (no link to the indices is left). */
function shuffled(input: HindcastInput, seed: number, blockYears = 1): HindcastInput {
  const years = [...input.years].sort((a, b) => a - b);
  const order = blockPermutationIndices(years.length, blockYears, createRandom(seed));
  const activity = new Map(years.map((year, position) => [year, input.activity.get(years[order[position] as number] as number) as number]));
  return { ...input, activity };
}

describe("runHindcast(input)", () => {
  it("finds skill in an invented region with a planted index–fire link (BSS > 0 and permutation p ≤ 0.05)", () => {
    const skill = runHindcast({ ...hindcastInput({ effect: 1.6, seed: 11 }), permutations: 199, bootstrapResamples: 199, curveRule: false });
    expect(skill.years).toBe(290);
    expect(skill.brierSkillScore).toBeGreaterThan(0);
    expect(skill.rocArea).toBeGreaterThan(0.65);
    expect(skill.permutations).toBe(199);
    expect(skill.skillPValue).toBeLessThanOrEqual(0.05);
    expect(skill.hasSkill).toBe(true);
    expect(skill.verdict).toMatch(/^Some skill/);
    // The bootstrap intervals bracket their scores.
    const intervals = skill.intervals;
    expect(intervals?.blockYears).toBe(5);
    expect(intervals?.brierSkillScore?.[0]).toBeLessThan(skill.brierSkillScore as number);
    expect(intervals?.brierSkillScore?.[1]).toBeGreaterThan(skill.brierSkillScore as number);
    expect(intervals?.rocArea?.[0]).toBeLessThan(skill.rocArea as number);
    expect(intervals?.rpss?.[1]).toBeGreaterThan(skill.rpss as number);
  });

  it("applies the q gate of the joint phase in every held-out calibration", () => {
    const input = { ...hindcastInput({ effect: 1.6, seed: 11 }), ...LEAN };
    // The noise index B never reaches q ≤ 1e-12, so no held-out forecast may come from a joint phase…
    expect(runHindcast({ ...input, jointMaxQ: 1e-12 }).forecasts.some((forecast) => forecast.basis === "joint")).toBe(false);
    // …while without the gate B joins A whenever the joint cell is large enough.
    expect(runHindcast({ ...input, jointMaxQ: 1 }).forecasts.every((forecast) => forecast.basis === "joint")).toBe(true);
  });

  it("says plainly that a pure-noise region has no skill", () => {
    for (const seed of [3, 5, 8]) {
      const skill = runHindcast({ ...hindcastInput({ effect: 0, seed }), permutations: 199, bootstrapResamples: 0, curveRule: false });
      expect(skill.hasSkill).toBe(false);
      expect(skill.verdict).toMatch(/^No skill/);
    }
  });

  it("fixes the event once: every hindcast year's outcome is its whole-period high-fire-year call, and the reference is the whole-period share", () => {
    const input = { ...hindcastInput({ effect: 1, seed: 13 }), ...LEAN };
    const skill = runHindcast(input);
    const ranked = [...input.years].map((year) => input.activity.get(year) as number).sort((a, b) => b - a);
    const threshold = ranked[Math.ceil(0.1 * ranked.length) - 1] as number;
    for (const forecast of skill.forecasts) {
      const activity = input.activity.get(forecast.year) as number;
      expect(forecast.fireYear).toBe(activity >= threshold && activity > 0);
    }
    const share = skill.forecasts.filter((forecast) => forecast.fireYear).length / skill.forecasts.length;
    expect(skill.reference?.fireYear).toBe(share);
  });

  it("nothing about a held-out year or its two neighbours either side reaches its forecast, for the phase rule and the curve rule", () => {
    // Reshuffling the activity among the left-out years (which keeps the event definition, fixed from the
    // whole period, exactly as it is) and changing the neighbours' index values must leave the held-out
    // year's forecasts unchanged: they are relearned from the other years only.
    const base = { ...hindcastInput({ effect: 1.5, seed: 21, first: 1801, last: 1900 }), permutations: 0, bootstrapResamples: 0 };
    const before = runHindcast(base);
    const own = (skill: typeof before, year: number) => skill.forecasts.find((forecast) => forecast.year === year);
    const ownCurve = (skill: typeof before, year: number) => skill.curveRule?.forecasts.find((forecast) => forecast.year === year);
    expect(before.curveRule?.forecasts.some((forecast) => forecast.basis === "curve")).toBe(true);
    fc.assert(
      fc.property(
        fc.integer({ min: 1801, max: 1900 }),
        fc.array(fc.integer({ min: 0, max: 1000 }), { minLength: 5, maxLength: 5 }),
        fc.array(fc.tuple(fc.integer({ min: -2, max: 2 }), fc.double({ min: -4, max: 4, noNaN: true })), { minLength: 1, maxLength: 5 }),
        (target, keys, changes) => {
          const window = [-2, -1, 0, 1, 2].map((offset) => target + offset).filter((year) => base.activity.has(year));
          const order = window.map((year, i) => ({ year, key: keys[i] as number })).sort((a, b) => a.key - b.key);
          const activity = new Map(base.activity);
          window.forEach((year, i) => activity.set(year, base.activity.get((order[i] as { year: number }).year) as number));
          const indexValues = new Map([...base.indexValues].map(([name, values]) => [name, new Map(values)]));
          for (const [offset, newIndex] of changes) {
            const year = target + offset;
            if (offset === 0 || !activity.has(year)) continue;
            for (const values of indexValues.values()) values.set(year, newIndex);
          }
          const after = runHindcast({ ...base, activity, indexValues });
          expect(own(after, target)?.probability).toBe(own(before, target)?.probability);
          expect(own(after, target)?.categoryProbabilities).toEqual(own(before, target)?.categoryProbabilities);
          expect(own(after, target)?.climatology).toBe(own(before, target)?.climatology);
          expect(ownCurve(after, target)?.probability).toBe(ownCurve(before, target)?.probability);
        },
      ),
      { numRuns: 15, seed: 4 },
    );
  });

  it("reports null scores with a reason when there are too few years", () => {
    const skill = runHindcast(hindcastInput({ effect: 1, first: 1901, last: 1906 }));
    expect(skill.brierSkillScore).toBeNull();
    expect(skill.reason).toMatch(/hindcast years/);
    expect(skill.skillPValue).toBeNull();
    expect(skill.hasSkill).toBe(false);
  });

  it("same seed → byte-identical Skill JSON; another seed → other shuffles and resamples", () => {
    const input = { ...hindcastInput({ effect: 1, seed: 5, first: 1801, last: 1920 }), permutations: 199, bootstrapResamples: 199, curvePermutations: 49 };
    const first = JSON.stringify(runHindcast(input));
    expect(JSON.stringify(runHindcast(input))).toBe(first);
    const other = runHindcast({ ...input, seed: 6 });
    expect(JSON.stringify(other)).not.toBe(first);
    // The scores themselves do not depend on the seed.
    expect(other.brierSkillScore).toBe(JSON.parse(first).brierSkillScore);
  });

  it("the reference forecasts cannot fake skill on shuffled records with tied activity: constant reference ROC = 0.5, left-in climatology ROC ≤ 0.5 and BSS ≤ 0", () => {
    // A record where a fifth of the years share the highest activity (ties at the threshold) and the rest
    // split between 0 and one low value: the case where a refitted threshold moved with the held-out year.
    const years = Array.from({ length: 200 }, (_, i) => 1801 + i);
    const random = createRandom(31);
    const activity = new Map(years.map((year) => [year, [0.5, 0.1, 0.1, 0, 0][random.nextInt(5)] as number]));
    const base: HindcastInput = { ...hindcastInput({ effect: 0, seed: 2, first: 1801, last: 2000 }), years, activity, ...LEAN };
    for (let seed = 1; seed <= 12; seed += 1) {
      const input = { ...shuffled(base, seed), indices: [] };
      const skill = runHindcast(input);
      const outcomes = skill.forecasts.map((forecast) => forecast.fireYear);
      const reference = skill.forecasts.map(() => skill.reference?.fireYear as number);
      expect(rocArea(reference, outcomes).area).toBe(0.5);
      // With no index the rule forecasts the left-in climatology in every fold.
      expect(skill.forecasts.every((forecast) => forecast.basis === "climatology" && forecast.probability === forecast.climatology)).toBe(true);
      expect(skill.rocArea).toBeLessThanOrEqual(0.5);
      expect(skill.brierSkillScore).toBeLessThanOrEqual(0);
    }
  });

  it("CORP reliability of the hindcast: its Brier score is the hindcast's and BSS = (DSC − MCB)/UNC against the whole-period climatology", () => {
    const skill = runHindcast({ ...hindcastInput({ effect: 1.6, seed: 11 }), permutations: 0, bootstrapResamples: 199, curveRule: false });
    const corp = skill.corp;
    expect(corp).not.toBeNull();
    expect(corp?.brierScore).toBeCloseTo(skill.brierScore as number, 12);
    const bss = ((corp?.discrimination as number) - (corp?.miscalibration as number)) / (corp?.uncertainty as number);
    expect(bss).toBeCloseTo(skill.brierSkillScore as number, 10);
    expect(corp?.resamples).toBe(199);
    // The binned table is kept beside it.
    expect(skill.reliability.length).toBeGreaterThan(0);
  });

  it("the curve rule is scored in the same folds, with its own permutation p (fewer shuffles unless it is the issued rule)", () => {
    const input = { ...hindcastInput({ effect: 1.6, seed: 11, first: 1801, last: 1920 }), permutations: 99, bootstrapResamples: 0, curvePermutations: 39 };
    const skill = runHindcast(input);
    const curve = skill.curveRule;
    expect(curve?.forecasts.map((forecast) => forecast.year)).toEqual(skill.forecasts.map((forecast) => forecast.year));
    expect(curve?.forecasts.filter((forecast) => forecast.basis === "curve").length).toBeGreaterThan(60);
    expect(curve?.brierSkillScore).toBeGreaterThan(0);
    expect(curve?.skillPValue).toBeLessThanOrEqual(0.05);
    expect(curve?.permutations).toBe(39);
    expect(curve?.rpss).toBeNull();
    expect(curve?.rpssReason).toMatch(/only high-fire years/);
    expect(runHindcast({ ...input, response: "curve" }).curveRule?.permutations).toBe(99);
  });
});

describe("runHindcast curve-rule permutation bound", () => {
  it("a 700-year record runs the curve rule's 99 shuffles; a 3,100-year record skips them with a reason unless the curve rule is the issued one", () => {
    const medium = runHindcast({ ...hindcastInput({ effect: 1.2, seed: 4, first: 1201, last: 1900 }), permutations: 99, bootstrapResamples: 0 });
    expect(medium.curveRule?.skillPValue).not.toBeNull();
    expect(medium.curveRule?.permutations).toBe(99);
    expect(medium.curveRule?.permutationStatistic).toMatch(/one-step case-deletion/);
    const input = { ...hindcastInput({ effect: 1.2, seed: 4, first: -1199, last: 1900 }), permutations: 99, bootstrapResamples: 0 };
    const skill = runHindcast(input);
    expect(skill.skillPValue).not.toBeNull();
    expect(skill.curveRule?.skillPValue).toBeNull();
    expect(skill.curveRule?.skillPValueReason).toMatch(/not run for a record of 3100 years/);
    expect(skill.curveRule?.permutationStatistic).toBeUndefined();
    expect(skill.curveRule?.hasSkill).toBe(false);
  });
});

describe("runHindcast permutation p-value", () => {
  it("matches the exact p of a brute-force enumeration of all 4! = 24 block orders (12 years, blocks of 3)", () => {
    const years = Array.from({ length: 12 }, (_, i) => 1901 + i);
    const index = [1.2, -0.8, 0.9, -1.1, 0.1, 1.4, -0.2, -0.9, 0.7, 0.0, -1.3, 1.1];
    const activity = [0.6, 0.1, 0.5, 0.0, 0.1, 0.7, 0.2, 0.0, 0.1, 0.2, 0.0, 0.3];
    const settings: IndexSettings[] = [
      { name: "A", file: "i.csv", column: "A", phases: { kind: "cuts", cuts: [-0.5, 0.5], labels: ["low", "mid", "high"] }, months: null },
    ];
    const base: HindcastInput = {
      years,
      activity: new Map(years.map((year, i) => [year, activity[i] as number])),
      indexValues: new Map([["A", new Map(years.map((year, i) => [year, index[i] as number]))]]),
      indexSettings: settings,
      indices: ["A"],
      top: 0.25,
      measure: "fraction",
      exclusion: 1,
      jointMinYears: 10,
      jointMaxQ: 0.05,
      blockYears: 3,
      bootstrapResamples: 0,
      curveRule: false,
    };
    const observed = runHindcast({ ...base, permutations: 0 }).brierSkillScore as number;
    // Every order of the blocks {1901–1903}, {1904–1906}, {1907–1909}, {1910–1912}, written out independently.
    const orders: number[][] = [];
    const permute = (prefix: number[], rest: number[]) => {
      if (rest.length === 0) orders.push(prefix);
      rest.forEach((block, i) => permute([...prefix, block], [...rest.slice(0, i), ...rest.slice(i + 1)]));
    };
    permute([], [0, 1, 2, 3]);
    expect(orders).toHaveLength(24);
    let reaching = 0;
    for (const order of orders) {
      const moved = order.flatMap((block) => [0, 1, 2].map((offset) => activity[block * 3 + offset] as number));
      const bss = runHindcast({ ...base, permutations: 0, activity: new Map(years.map((year, i) => [year, moved[i] as number])) }).brierSkillScore;
      if (bss !== null && bss >= observed - 1e-12) reaching += 1;
    }
    const exact = reaching / 24;
    expect(exact).toBeGreaterThan(0);
    expect(exact).toBeLessThan(1);
    const m = 4999;
    const p = runHindcast({ ...base, permutations: m }).skillPValue as number;
    // (b + 1)/(m + 1) with b ~ Binomial(m, exact): within 4 standard errors.
    expect(Math.abs(p - exact)).toBeLessThan(4 * Math.sqrt((exact * (1 - exact)) / m) + 1 / (m + 1));
  });

  it("false-alarm rate on 50 no-link invented regions × 199 shuffles: the verdict says skill in at most 6 (bound: P(X ≥ 7) < 4% when the rate is 5%)", () => {
    let alarms = 0;
    for (let region = 0; region < 50; region += 1) {
      const input = hindcastInput({ effect: 0, seed: 1000 + region, first: 1801, last: 1920 });
      const skill = runHindcast({ ...input, permutations: 199, bootstrapResamples: 0, curveRule: false });
      if (skill.hasSkill) alarms += 1;
    }
    // Binomial(50, 0.05) upper tail from jstat: the bound is chosen so a correct test fails this check < 4% of the time.
    expect(1 - jStat.binomial.cdf(6, 50, 0.05)).toBeLessThan(0.04);
    expect(alarms).toBeLessThanOrEqual(6);
  });
});

describe("runCurveRuleHindcast and withCurveRule (the two rules computed apart)", () => {
  it("joined, they equal runHindcast exactly (every part draws from its own seeded stream)", () => {
    const input = { ...hindcastInput({ effect: 1.2, seed: 7, first: 1701, last: 1960 }), permutations: 49, bootstrapResamples: 49 };
    const whole = runHindcast(input);
    const apart = withCurveRule(runHindcast({ ...input, curveRule: false }), runCurveRuleHindcast(input));
    expect(JSON.stringify(apart)).toBe(JSON.stringify(whole));
    expect(whole.curveRule?.skillPValue).not.toBeNull();
  });
});
