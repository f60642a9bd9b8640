import fc from "fast-check";
import { mean } from "simple-statistics";
import { describe, expect, it } from "vitest";
import { corpReliability } from "../../src/stats/corpReliability.js";
import { createRandom, type RandomSource } from "../../src/stats/createRandom.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";

/**
 * Independent recalibration for the checks below (no PAV): the max–min formula of isotonic regression,
 * fitted value at distinct forecast i = max over s ≤ i of min over t ≥ i of the event share of forecasts
 * s … t (Barlow, Bartholomew, Bremner & Brunk 1972, Statistical Inference under Order Restrictions, Wiley,
 * chapter 1; from memory).
 */
function maxMinRecalibrated(probabilities: readonly number[], outcomes: readonly boolean[]): number[] {
  const distinct = [...new Set(probabilities)].sort((a, b) => a - b);
  const counts = distinct.map((value) => probabilities.filter((p) => p === value).length);
  const events = distinct.map((value) => probabilities.filter((p, index) => p === value && outcomes[index]).length);
  const levels = distinct.map((_, i) => {
    let best = Number.NEGATIVE_INFINITY;
    for (let s = 0; s <= i; s += 1) {
      let smallest = Number.POSITIVE_INFINITY;
      for (let t = i; t < distinct.length; t += 1) {
        let eventSum = 0;
        let countSum = 0;
        for (let k = s; k <= t; k += 1) {
          eventSum += events[k] as number;
          countSum += counts[k] as number;
        }
        smallest = Math.min(smallest, eventSum / countSum);
      }
      best = Math.max(best, smallest);
    }
    return best;
  });
  return probabilities.map((p) => levels[distinct.indexOf(p)] as number);
}

/** Brier score as a plain simple-statistics mean of squared errors. */
function meanSquaredError(forecasts: readonly number[], outcomes: readonly boolean[]): number {
  return mean(forecasts.map((f, index) => (f - (outcomes[index] ? 1 : 0)) ** 2));
}

/** A random source that counts its calls, to prove the band draws from the source it was given. */
function countingSource(seed: number): RandomSource & { floatCalls: number } {
  const inner = createRandom(seed);
  const source = {
    floatCalls: 0,
    nextInt: (maxExclusive: number) => inner.nextInt(maxExclusive),
    nextFloat: () => {
      source.floatCalls += 1;
      return inner.nextFloat();
    },
  };
  return source;
}

/** Simulated calibrated forecasts: p on a grid of tenths, outcome drawn as a yes with probability p. */
function calibratedSample(seed: number, size: number): { probabilities: number[]; outcomes: boolean[] } {
  const random = createRandom(seed);
  const probabilities = Array.from({ length: size }, () => random.nextInt(11) / 10);
  const outcomes = probabilities.map((p) => random.nextFloat() < p);
  return { probabilities, outcomes };
}

describe("corpReliability(probabilities, outcomes, random, options)", () => {
  it("corpReliability([0.1, 0.3, 0.3, 0.8], [no, yes, no, yes]) → curve 0, 0.5, 1; BS 0.1575 = 0.0325 − 0.125 + 0.25", () => {
    // Hand-counted example (the one in the doc comment): the recalibrated curve needs no pooling here.
    // BS = (0.01 + 0.49 + 0.09 + 0.04)/4 = 0.1575; BS(recalibrated) = (0 + 0.25 + 0.25 + 0)/4 = 0.125;
    // ō = 0.5, UNC = 0.25; MCB = 0.1575 − 0.125 = 0.0325; DSC = 0.25 − 0.125 = 0.125.
    const corp = corpReliability([0.1, 0.3, 0.3, 0.8], [false, true, false, true], createRandom(1), {
      resamples: 0,
    });
    expect(corp.points).toEqual([
      { forecast: 0.1, calibrated: 0, count: 1 },
      { forecast: 0.3, calibrated: 0.5, count: 2 },
      { forecast: 0.8, calibrated: 1, count: 1 },
    ]);
    expect(corp.brierScore).toBeCloseTo(0.1575, 15);
    expect(corp.miscalibration).toBeCloseTo(0.0325, 15);
    expect(corp.discrimination).toBeCloseTo(0.125, 15);
    expect(corp.uncertainty).toBeCloseTo(0.25, 15);
    expect(corp.band).toEqual([]);
  });

  it("pools adjacent violators: forecasts 0.2, 0.4, 0.6 with event shares 1/2, 0, 1 → curve 1/3, 1/3, 1", () => {
    // 0.2: one yes of two; 0.4: no of one → pooled (1 + 0)/3 = 1/3; 0.6: yes.
    const corp = corpReliability([0.2, 0.2, 0.4, 0.6], [true, false, false, true], createRandom(1), {
      resamples: 0,
    });
    expect(corp.points.map((point) => point.calibrated)).toEqual([1 / 3, 1 / 3, 1]);
    expect(corp.points.map((point) => point.count)).toEqual([2, 1, 1]);
  });

  it("BS = MCB − DSC + UNC, MCB ≥ 0 and DSC ≥ 0 on random forecasts (fast-check, fixed seed)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 0, max: 20 }), fc.boolean()), { minLength: 1, maxLength: 120 }),
        (pairs) => {
          const probabilities = pairs.map(([step]) => step / 20);
          const outcomes = pairs.map(([, event]) => event);
          const corp = corpReliability(probabilities, outcomes, createRandom(3), { resamples: 0 });
          const recomposed = corp.miscalibration - corp.discrimination + corp.uncertainty;
          return (
            Math.abs(recomposed - corp.brierScore) < 1e-14 &&
            corp.miscalibration > -1e-14 &&
            corp.discrimination > -1e-14
          );
        },
      ),
      { seed: 2021, numRuns: 300 },
    );
  });

  it("curve and decomposition agree with an independent max–min recalibration and simple-statistics means", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 0, max: 1000 }), fc.boolean()), { minLength: 1, maxLength: 60 }),
        (pairs) => {
          const probabilities = pairs.map(([step]) => step / 1000);
          const outcomes = pairs.map(([, event]) => event);
          const corp = corpReliability(probabilities, outcomes, createRandom(5), { resamples: 0 });
          const recalibrated = maxMinRecalibrated(probabilities, outcomes);
          const climatology = mean(outcomes.map((event) => (event ? 1 : 0)));
          const original = meanSquaredError(probabilities, outcomes);
          const recalibratedScore = meanSquaredError(recalibrated, outcomes);
          const climatologyScore = meanSquaredError(
            probabilities.map(() => climatology),
            outcomes,
          );
          const curveMatches = corp.points.every(
            (point) =>
              Math.abs(point.calibrated - (recalibrated[probabilities.indexOf(point.forecast)] as number)) < 1e-12 &&
              point.count === probabilities.filter((p) => p === point.forecast).length,
          );
          const ascending = corp.points.every(
            (point, index) => index === 0 || point.forecast > (corp.points[index - 1]?.forecast as number),
          );
          return (
            curveMatches &&
            ascending &&
            Math.abs(corp.brierScore - original) < 1e-12 &&
            Math.abs(corp.miscalibration - (original - recalibratedScore)) < 1e-12 &&
            Math.abs(corp.discrimination - (climatologyScore - recalibratedScore)) < 1e-12 &&
            Math.abs(corp.uncertainty - climatologyScore) < 1e-12
          );
        },
      ),
      { seed: 118, numRuns: 200 },
    );
  });

  it("perfectly calibrated, perfectly sharp forecasts: MCB 0, DSC = UNC, BS 0", () => {
    const corp = corpReliability([0, 0, 1, 1, 1], [false, false, true, true, true], createRandom(1), {
      resamples: 0,
    });
    expect(corp.brierScore).toBe(0);
    expect(corp.miscalibration).toBe(0);
    expect(corp.discrimination).toBeCloseTo(0.24, 15);
    expect(corp.uncertainty).toBeCloseTo(0.24, 15);
  });

  describe("consistency band", () => {
    it("defaults: 1000 resamples at level 0.90 (Dimitriadis, Gneiting & Jordan 2021 draw 90% bands)", () => {
      const { probabilities, outcomes } = calibratedSample(7, 40);
      const source = countingSource(7);
      const corp = corpReliability(probabilities, outcomes, source);
      expect(corp.resamples).toBe(1000);
      expect(corp.level).toBe(0.9);
      // one Bernoulli draw per case and resample: the band is made from the injected source
      expect(source.floatCalls).toBe(1000 * 40);
      expect(corp.band.map((row) => row.forecast)).toEqual(corp.points.map((point) => point.forecast));
    });

    it("same seed → identical band; a different seed → a different band", () => {
      const { probabilities, outcomes } = calibratedSample(11, 60);
      const first = corpReliability(probabilities, outcomes, createRandom(99), { resamples: 300 });
      const again = corpReliability(probabilities, outcomes, createRandom(99), { resamples: 300 });
      const other = corpReliability(probabilities, outcomes, createRandom(100), { resamples: 300 });
      expect(JSON.stringify(again)).toBe(JSON.stringify(first));
      expect(JSON.stringify(other.band)).not.toBe(JSON.stringify(first.band));
      // the curve and the decomposition do not depend on the seed
      expect(other.points).toEqual(first.points);
      expect(other.brierScore).toBe(first.brierScore);
    });

    it("calibrated simulated forecasts: the band holds the diagonal and the CORP curve lies inside it at most points", () => {
      let points = 0;
      let diagonalInside = 0;
      let curveInside = 0;
      for (let trial = 0; trial < 20; trial += 1) {
        const { probabilities, outcomes } = calibratedSample(1000 + trial, 200);
        const corp = corpReliability(probabilities, outcomes, createRandom(trial), { resamples: 400 });
        corp.band.forEach((row, index) => {
          points += 1;
          if (row.lower <= row.forecast && row.forecast <= row.upper) diagonalInside += 1;
          const calibrated = corp.points[index]?.calibrated as number;
          if (row.lower <= calibrated && calibrated <= row.upper) curveInside += 1;
        });
      }
      expect(diagonalInside / points).toBeGreaterThan(0.95);
      // pointwise 90% bands: the share inside should be near 0.9 (more at 0 and 1, where the band is a point)
      expect(curveInside / points).toBeGreaterThan(0.85);
    });

    it("overconfident forecasts (truth is halfway to 0.5) fall outside the band at most extreme points", () => {
      const random = createRandom(21);
      const probabilities = Array.from({ length: 400 }, () => random.nextInt(11) / 10);
      const outcomes = probabilities.map((p) => random.nextFloat() < 0.5 + (p - 0.5) / 2);
      const corp = corpReliability(probabilities, outcomes, createRandom(22), { resamples: 400 });
      const extreme = corp.band
        .map((row, index) => ({ row, calibrated: corp.points[index]?.calibrated as number }))
        .filter(({ row }) => row.forecast <= 0.2 || row.forecast >= 0.8);
      const outside = extreme.filter(({ row, calibrated }) => calibrated < row.lower || calibrated > row.upper);
      expect(outside.length).toBeGreaterThanOrEqual(extreme.length - 1);
      expect(corp.miscalibration).toBeGreaterThan(0.02);
    });

    it("a band of level 0.5 is no wider than one of level 0.99 at every point", () => {
      const { probabilities, outcomes } = calibratedSample(31, 80);
      const narrow = corpReliability(probabilities, outcomes, createRandom(5), { resamples: 500, level: 0.5 });
      const wide = corpReliability(probabilities, outcomes, createRandom(5), { resamples: 500, level: 0.99 });
      narrow.band.forEach((row, index) => {
        expect(row.lower).toBeGreaterThanOrEqual(wide.band[index]?.lower as number);
        expect(row.upper).toBeLessThanOrEqual(wide.band[index]?.upper as number);
      });
    });
  });

  describe("edge cases", () => {
    it("all outcomes equal: UNC = DSC = 0 and a flat curve", () => {
      const corp = corpReliability([0.2, 0.5, 0.9], [true, true, true], createRandom(1), { resamples: 10 });
      expect(corp.uncertainty).toBe(0);
      expect(corp.discrimination).toBe(0);
      expect(corp.points.map((point) => point.calibrated)).toEqual([1, 1, 1]);
      expect(corp.miscalibration).toBeCloseTo(corp.brierScore, 15);
    });

    it("one distinct forecast: one point, DSC 0", () => {
      const corp = corpReliability([0.4, 0.4, 0.4, 0.4], [true, false, false, false], createRandom(1), {
        resamples: 10,
      });
      expect(corp.points).toEqual([{ forecast: 0.4, calibrated: 0.25, count: 4 }]);
      expect(corp.discrimination).toBeCloseTo(0, 15);
      expect(corp.band).toHaveLength(1);
    });

    it("empty input, mismatched lengths, bad probabilities, resamples and levels throw StatsInputError", () => {
      const random = createRandom(1);
      expect(() => corpReliability([], [], random)).toThrow(StatsInputError);
      expect(() => corpReliability([0.5], [true, false], random)).toThrow(StatsInputError);
      expect(() => corpReliability([1.5], [true], random)).toThrow(StatsInputError);
      expect(() => corpReliability([Number.NaN], [true], random)).toThrow(StatsInputError);
      expect(() => corpReliability([0.5], [1 as unknown as boolean], random)).toThrow(StatsInputError);
      expect(() => corpReliability([0.5], [true], random, { resamples: -1 })).toThrow(StatsInputError);
      expect(() => corpReliability([0.5], [true], random, { resamples: 2.5 })).toThrow(StatsInputError);
      expect(() => corpReliability([0.5], [true], random, { level: 1 })).toThrow(StatsInputError);
      expect(() => corpReliability([0.5], [true], random, { level: 0 })).toThrow(StatsInputError);
    });
  });
});
