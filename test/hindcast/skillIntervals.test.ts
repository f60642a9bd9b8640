import jStat from "jstat";
import { wilcoxonRankSum } from "simple-statistics";
import { describe, expect, it } from "vitest";
import { skillIntervals, type ScoredYear } from "../../src/hindcast/skillIntervals.js";
import { createRandom } from "../../src/stats/createRandom.js";
import { movingBlockBootstrapIndices } from "../../src/stats/movingBlockBootstrap.js";
import { rankedProbabilityScore } from "../../src/stats/rankedProbabilityScore.js";

/**
 * Hanley J.A., McNeil B.J. (1982) "The meaning and use of the area under a receiver operating characteristic
 * (ROC) curve", Radiology 143(1):29–36, Table I: 58 normal and 51 abnormal CT images rated 1 … 5; area 0.893,
 * standard error 0.032 (the standard error as published is quoted from memory).
 */
function hanleyMcNeil(): ScoredYear[] {
  const normal = [33, 6, 6, 11, 2];
  const abnormal = [3, 2, 2, 11, 33];
  const years: ScoredYear[] = [];
  normal.forEach((count, rating) => {
    for (let i = 0; i < count; i += 1) years.push({ probability: (rating + 1) / 5, reference: 51 / 109, fireYear: false, rps: Number.NaN, rpsReference: Number.NaN });
  });
  abnormal.forEach((count, rating) => {
    for (let i = 0; i < count; i += 1) years.push({ probability: (rating + 1) / 5, reference: 51 / 109, fireYear: true, rps: Number.NaN, rpsReference: Number.NaN });
  });
  return years;
}

/** An invented 80-year hindcast with persistent forecasts and outcomes (AR-like runs), three categories. */
function inventedHindcast(): ScoredYear[] {
  const random = createRandom(77);
  const years: ScoredYear[] = [];
  let state = 0;
  for (let i = 0; i < 80; i += 1) {
    state = 0.6 * state + (random.nextFloat() - 0.5);
    const probability = Math.min(0.9, Math.max(0.02, 0.15 + 0.3 * state));
    const fireYear = random.nextFloat() < probability;
    const observed = (fireYear ? 2 : random.nextInt(2)) as 0 | 1 | 2;
    const categories: [number, number, number] = [(1 - probability) / 2, (1 - probability) / 2, probability];
    years.push({
      probability,
      reference: 0.15,
      fireYear,
      rps: rankedProbabilityScore(categories, observed),
      rpsReference: rankedProbabilityScore([0.425, 0.425, 0.15], observed),
    });
  }
  return years;
}

describe("skillIntervals(years, blockYears, resamples, random)", () => {
  it("Hanley & McNeil (1982) Table I with blocks of 1 (independent cases): the 95% ROC interval is close to 0.893 ± 1.96 × 0.032", () => {
    const intervals = skillIntervals(hanleyMcNeil(), 1, 4000, createRandom(3), false);
    const [lower, upper] = intervals.rocArea as readonly [number, number];
    // Normal approximation with the published standard error: [0.830, 0.956]; the percentile bootstrap of
    // independent cases estimates the same sampling spread (and is slightly skewed towards lower areas).
    expect(lower).toBeGreaterThan(0.81);
    expect(lower).toBeLessThan(0.85);
    expect(upper).toBeGreaterThan(0.935);
    expect(upper).toBeLessThan(0.965);
    expect(intervals.rpss).toBeNull();
  });

  it("equals an independent recomputation of the same resamples: BSS and RPSS by jStat sums, ROC area from simple-statistics' rank sum, type-7 percentiles by jStat.quantiles", () => {
    const years = inventedHindcast();
    const n = years.length;
    const resamples = 500;
    const intervals = skillIntervals(years, 5, resamples, createRandom(12));
    const random = createRandom(12);
    const bss: number[] = [];
    const rpss: number[] = [];
    const roc: number[] = [];
    for (let resample = 0; resample < resamples; resample += 1) {
      const chosen = movingBlockBootstrapIndices(n, 5, random).map((position) => years[position] as ScoredYear);
      const outcome = (year: ScoredYear) => (year.fireYear ? 1 : 0);
      const bs = jStat.sum(chosen.map((year) => (year.probability - outcome(year)) ** 2));
      const bsReference = jStat.sum(chosen.map((year) => (year.reference - outcome(year)) ** 2));
      if (bsReference > 0) bss.push(1 - bs / bsReference);
      rpss.push(1 - jStat.sum(chosen.map((year) => year.rps)) / jStat.sum(chosen.map((year) => year.rpsReference)));
      const events = chosen.filter((year) => year.fireYear).map((year) => year.probability);
      const others = chosen.filter((year) => !year.fireYear).map((year) => year.probability);
      if (events.length > 0 && others.length > 0) {
        const rankSum = wilcoxonRankSum(events, others);
        roc.push((rankSum - (events.length * (events.length + 1)) / 2) / (events.length * others.length));
      }
    }
    const percentiles = (values: number[]) => jStat.quantiles(values, [0.025, 0.975], 1, 1);
    const check = (interval: readonly [number, number] | null, values: number[]) => {
      const [lower, upper] = percentiles(values) as [number, number];
      expect(interval?.[0]).toBeCloseTo(lower, 12);
      expect(interval?.[1]).toBeCloseTo(upper, 12);
    };
    check(intervals.brierSkillScore, bss);
    check(intervals.rpss, rpss);
    check(intervals.rocArea, roc);
    expect(intervals.blockYears).toBe(5);
    expect(intervals.resamples).toBe(resamples);
  });

  it("longer blocks widen the interval of a persistent series (the independence bootstrap is too narrow)", () => {
    const years = inventedHindcast();
    const width = (interval: readonly [number, number] | null) => (interval as readonly [number, number])[1] - (interval as readonly [number, number])[0];
    const one = skillIntervals(years, 1, 2000, createRandom(5));
    const ten = skillIntervals(years, 10, 2000, createRandom(5));
    expect(width(ten.brierSkillScore)).toBeGreaterThan(width(one.brierSkillScore));
  });

  it("gives null intervals with a reason for one year, and never a block longer than the record", () => {
    const years = inventedHindcast();
    const single = skillIntervals(years.slice(0, 1), 5, 99, createRandom(1));
    expect(single.brierSkillScore).toBeNull();
    expect(single.reason).toMatch(/only 1 hindcast year/);
    expect(skillIntervals(years.slice(0, 3), 5, 99, createRandom(1)).blockYears).toBe(3);
  });
});
