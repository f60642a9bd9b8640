import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { createRandom, type RandomSource } from "../../src/stats/createRandom.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";
import { superposedEpochAnalysis } from "../../src/stats/superposedEpochAnalysis.js";

// No published numeric worked example of SEA significance was found. The procedures follow Haurwitz M.W.,
// Brier G.W. (1981) Monthly Weather Review 109:2074–2079, Prager M.H., Hoenig J.M. (1989) Transactions of the
// American Fisheries Society 118:608–618 and Adams J.B., Mann M.E., Ammann C.M. (2003) Nature 426:274–278
// (their procedural details are from memory). The checks below therefore use series whose composite is known by
// hand, exact enumerations of the randomization distribution over every C(n, k) event set, and an independent
// brute-force resampling with its own generator and sampler (jstat for means and quantiles).

/** Every k-subset of 0 … n − 1, in lexicographic order (exact enumeration, no random numbers). */
function allSubsets(n: number, k: number): number[][] {
  const subsets: number[][] = [];
  const current: number[] = [];
  const extend = (start: number): void => {
    if (current.length === k) {
      subsets.push([...current]);
      return;
    }
    for (let index = start; index <= n - (k - current.length); index += 1) {
      current.push(index);
      extend(index + 1);
      current.pop();
    }
  };
  extend(0);
  return subsets;
}

/**
 * An independent uniform k-subset sampler for the brute-force check: Park–Miller minimal-standard generator
 * (Park S.K., Miller K.W. (1988) "Random number generators: good ones are hard to find", Communications of the
 * ACM 31(10):1192–1201) giving each candidate a random key; the k smallest keys win. Shares no code with
 * src/stats (neither createRandom nor sampleWithoutReplacement).
 */
function parkMillerSubsetSampler(seed: number): <T>(pool: readonly T[], k: number) => T[] {
  let state = seed;
  const uniform = (): number => {
    state = (state * 48271) % 2147483647;
    return state / 2147483647;
  };
  return <T>(pool: readonly T[], k: number): T[] =>
    pool
      .map((item) => ({ item, key: uniform() }))
      .sort((left, right) => left.key - right.key)
      .slice(0, k)
      .map(({ item }) => item);
}

/** 1800 … 1839 with a pulse of 2 in every year ending in 5, else 0: baseline 4·2/40 = 0.2. */
const PULSE_YEARS = Object.freeze(Array.from({ length: 40 }, (_, index) => 1800 + index));
const PULSE_VALUES = Object.freeze(PULSE_YEARS.map((year) => (year % 10 === 5 ? 2 : 0)));

/** A smooth, irregular test series (no randomness needed): two incommensurate sines and a trend. */
function wavySeries(firstYear: number, length: number): { years: number[]; values: number[] } {
  const years = Array.from({ length }, (_, index) => firstYear + index);
  const values = years.map((_, index) => Math.sin(index * 0.9) + 0.6 * Math.sin(index * 2.3 + 1) + index * 0.004);
  return { years, values };
}

/** Counts every integer drawn, so a test can prove the injected source is what drives the draws. */
function countingSource(seed: number): RandomSource & { integerCalls: number } {
  const inner = createRandom(seed);
  const source = {
    integerCalls: 0,
    nextInt(maxExclusive: number): number {
      source.integerCalls += 1;
      return inner.nextInt(maxExclusive);
    },
    nextFloat(): number {
      return inner.nextFloat();
    },
  };
  return source;
}

describe("superposedEpochAnalysis({ years, values, eventYears, firstLag, lastLag, draws, random })", () => {
  it("pulse every 10 years, events one year after it: composite [-0.2, 1.8, -0.2, -0.2] at lags -2…1", () => {
    const result = superposedEpochAnalysis({
      years: PULSE_YEARS,
      values: PULSE_VALUES,
      eventYears: [1826, 1806, 1816],
      firstLag: -2,
      lastLag: 1,
      draws: 2000,
      random: createRandom(1),
    });
    expect(result.reason).toBeNull();
    expect(result.lags).toEqual([-2, -1, 0, 1]);
    expect(result.baseline).toBeCloseTo(0.2, 14);
    expect(result.baseline).toBeCloseTo(jStat.mean([...PULSE_VALUES]), 14);
    const expected = [-0.2, 1.8, -0.2, -0.2];
    result.composite.forEach((value, index) => expect(value).toBeCloseTo(expected[index] as number, 12));
    expect(result.eventsUsed).toEqual([1806, 1816, 1826]);
    expect(result.eventsDropped).toEqual([]);
    // Covered years: y − 2 ≥ 1800 and y + 1 ≤ 1839, i.e. 1802 … 1838.
    expect(result.poolSize).toBe(37);
    // The observed 1.8 at lag −1 lies above the 99 % limit of composites of 3 random years.
    const [, upper99AtMinusOne] = result.ci99[1] as [number, number];
    expect(result.composite[1] as number).toBeGreaterThan(upper99AtMinusOne);
  });

  it("p-values are (b + 1)/(draws + 1), never 0, even for a composite beyond every random one", () => {
    const draws = 1000;
    const result = superposedEpochAnalysis({
      years: PULSE_YEARS,
      values: PULSE_VALUES,
      eventYears: [1806, 1816, 1826],
      firstLag: -2,
      lastLag: 1,
      draws,
      random: createRandom(2),
    });
    for (const p of result.pValue) {
      expect(p).toBeGreaterThan(0);
      const countPlusOne = p * (draws + 1);
      expect(countPlusOne).toBeCloseTo(Math.round(countPlusOne), 9);
    }
    // At lag −1 only draws holding all three pulse-following years (1/C(37,3) = 1/7770 each) are as extreme.
    expect(result.pValue[1] as number).toBeLessThan(0.01);
    expect(result.pValue[1] as number).toBeGreaterThanOrEqual(1 / (draws + 1));
  });

  it("same seed → identical output; different seeds → different limits (the injected source is used)", () => {
    const { years, values } = wavySeries(1700, 150);
    const input = { years, values, eventYears: [1710, 1733, 1750, 1761, 1790, 1805, 1822, 1840], firstLag: -3, lastLag: 2, draws: 1000 };
    const first = superposedEpochAnalysis({ ...input, random: createRandom(100) });
    const again = superposedEpochAnalysis({ ...input, random: createRandom(100) });
    const other = superposedEpochAnalysis({ ...input, random: createRandom(101) });
    expect(again).toEqual(first);
    expect(other.composite).toEqual(first.composite);
    expect(other.ci95).not.toEqual(first.ci95);
    expect(other.ci99).not.toEqual(first.ci99);
  });

  it("draws eventsUsed.length integers per draw from the injected source, and none when not computable", () => {
    const { years, values } = wavySeries(1700, 150);
    const random = countingSource(5);
    const result = superposedEpochAnalysis({
      years, values, eventYears: [1699, 1710, 1733, 1750, 1848], firstLag: -3, lastLag: 2, draws: 1500, random,
    });
    expect(result.eventsUsed).toEqual([1710, 1733, 1750]);
    expect(random.integerCalls).toBe(1500 * 3);

    const idle = countingSource(5);
    const empty = superposedEpochAnalysis({
      years, values, eventYears: [1600], firstLag: -3, lastLag: 2, draws: 1500, random: idle,
    });
    expect(empty.reason).not.toBeNull();
    expect(idle.integerCalls).toBe(0);
  });

  it("drops events whose window runs off the record, into a gap or onto a missing value", () => {
    // 1800 … 1849 without 1835 (a gap in `years`) and with 1820 missing (null); window lags −2 … +1.
    const years = Array.from({ length: 50 }, (_, index) => 1800 + index).filter((year) => year !== 1835);
    const values = years.map((year) => (year === 1820 ? null : (year % 7) - 3));
    const result = superposedEpochAnalysis({
      years,
      values,
      // 1801: lag −2 is 1799 (before the record). 1821: lag −1 is 1820 (null). 1836: lag −1 is 1835 (gap).
      // 1849: lag +1 is 1850 (after the record). 1900: nowhere near. 1830 and 1848: whole window present.
      eventYears: [1849, 1801, 1830, 1821, 1900, 1836, 1848],
      firstLag: -2,
      lastLag: 1,
      draws: 1000,
      random: createRandom(3),
    });
    expect(result.eventsUsed).toEqual([1830, 1848]);
    expect(result.eventsDropped).toEqual([1801, 1821, 1836, 1849, 1900]);
    // Covered years 1802 … 1848 (47) minus 1819 … 1822 (window meets 1820) and 1834 … 1837 (meets 1835).
    expect(result.poolSize).toBe(39);
    const present = values.filter((value): value is number => value !== null);
    const baseline = jStat.mean(present);
    expect(result.baseline).toBeCloseTo(baseline, 12);
    const valueOf = (year: number): number => (values[years.indexOf(year)] as number) - baseline;
    result.lags.forEach((lag, index) => {
      expect(result.composite[index] as number).toBeCloseTo((valueOf(1830 + lag) + valueOf(1848 + lag)) / 2, 12);
    });
  });

  it("a window without lag 0 uses an event year beyond the series when its window is covered", () => {
    const { years, values } = wavySeries(1800, 50); // 1800 … 1849
    const result = superposedEpochAnalysis({
      years, values, eventYears: [1850, 1851], firstLag: -3, lastLag: -1, draws: 1000, random: createRandom(4),
    });
    expect(result.eventsUsed).toEqual([1850]); // 1847 … 1849 present
    expect(result.eventsDropped).toEqual([1851]); // 1850 missing
    expect(result.poolSize).toBe(48); // key years 1803 … 1850
  });

  it("Monte Carlo p matches the exact randomization p from all C(10, 3) = 120 subsets of the pool", () => {
    // One lag, ten years, three events: the exact two-sided p is the share of the 120 equally likely
    // 3-subsets whose composite is at least as far from the pool mean as the observed one.
    const years = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
    const values = [0.3, -1.2, 2.5, 0.1, 1.9, -0.4, 0.0, 2.2, -0.9, 0.6];
    const eventYears = [3, 5, 10];
    const mean = jStat.mean(values);
    const departures = values.map((value) => value - mean);
    const observed = jStat.mean(eventYears.map((year) => departures[year - 1] as number));
    let asExtreme = 0;
    let subsets = 0;
    for (let a = 0; a < 10; a += 1) {
      for (let b = a + 1; b < 10; b += 1) {
        for (let c = b + 1; c < 10; c += 1) {
          const composite = jStat.mean([departures[a], departures[b], departures[c]] as number[]);
          subsets += 1;
          if (Math.abs(composite) >= Math.abs(observed) - 1e-12) {
            asExtreme += 1;
          }
        }
      }
    }
    const exactP = asExtreme / subsets;
    const draws = 40_000;
    const result = superposedEpochAnalysis({
      years, values, eventYears, firstLag: 0, lastLag: 0, draws, random: createRandom(8),
    });
    expect(result.composite[0] as number).toBeCloseTo(observed, 12);
    const standardError = Math.sqrt((exactP * (1 - exactP)) / draws);
    expect(Math.abs((result.pValue[0] as number) - exactP)).toBeLessThan(5 * standardError + 1 / draws);
  });

  it("p-values and 95 %/99 % limits at lags −1…1 match the exact distribution over all C(12, 4) = 495 event sets", () => {
    // Fourteen years, lags −1 … +1: the covered key years are 2 … 13 (12), four events. Every 4-subset of the
    // pool is equally likely under the randomization, so the exact null distribution of the composite at each
    // lag is the list of 495 subset composites, enumerated here without any random numbers.
    const years = Array.from({ length: 14 }, (_, index) => index + 1);
    const values = [0.4, -1.1, 2.3, 0.2, 1.7, -0.6, 0.9, 2.8, -1.4, 0.5, 1.2, -0.2, 3.1, -0.8];
    const eventYears = [3, 8, 11, 13];
    const lags = [-1, 0, 1];
    const baseline = jStat.mean(values);
    const departure = (year: number): number => (values[year - 1] as number) - baseline;
    const pool = years.filter((year) => year - 1 >= 1 && year + 1 <= 14);
    const subsets = allSubsets(pool.length, eventYears.length);
    const draws = 20_000;
    const result = superposedEpochAnalysis({
      years, values, eventYears, firstLag: -1, lastLag: 1, draws, random: createRandom(12),
    });
    expect(result.poolSize).toBe(12);
    lags.forEach((lag, lagIndex) => {
      const exact = subsets.map((subset) => jStat.mean(subset.map((position) => departure((pool[position] as number) + lag))));
      const observed = jStat.mean(eventYears.map((year) => departure(year + lag)));
      expect(result.composite[lagIndex] as number).toBeCloseTo(observed, 12);
      // exact two-sided p: share of event sets at least as far from the pool mean as the observed one
      const poolMean = jStat.mean(exact);
      const exactP =
        exact.filter((value) => Math.abs(value - poolMean) >= Math.abs(observed - poolMean) - 1e-12).length /
        exact.length;
      const standardError = Math.sqrt((exactP * (1 - exactP)) / draws);
      expect(Math.abs((result.pValue[lagIndex] as number) - exactP)).toBeLessThan(5 * standardError + 2 / draws);
      // limits: the exact share of event sets below each Monte Carlo limit must be close to its nominal level
      // (tolerance: 5 Monte Carlo standard errors plus one atom of the 495-point distribution)
      const atLag = [...exact].sort((a, b) => a - b);
      const shareBelow = (limit: number, inclusive: boolean): number =>
        atLag.filter((value) => (inclusive ? value <= limit + 1e-12 : value < limit - 1e-12)).length / atLag.length;
      const ci95 = result.ci95[lagIndex] as [number, number];
      const ci99 = result.ci99[lagIndex] as [number, number];
      for (const [limit, level] of [
        [ci95[0], 0.025],
        [ci95[1], 0.975],
        [ci99[0], 0.005],
        [ci99[1], 0.995],
      ] as const) {
        const tolerance = 5 * Math.sqrt((level * (1 - level)) / draws) + 1 / atLag.length;
        expect(shareBelow(limit, true)).toBeGreaterThanOrEqual(level - tolerance);
        expect(shareBelow(limit, false)).toBeLessThanOrEqual(level + tolerance);
      }
    });
  });

  it("limits and p-values agree with a brute-force resampling (own generator and sampler, jstat quantiles) within Monte Carlo error", () => {
    const { years, values } = wavySeries(1650, 200);
    const eventYears = [1660, 1671, 1689, 1702, 1715, 1733, 1748, 1760, 1777, 1790, 1811, 1829, 1840];
    const firstLag = -4;
    const lastLag = 2;
    const draws = 20_000;
    const result = superposedEpochAnalysis({
      years, values, eventYears, firstLag, lastLag, draws, random: createRandom(31),
    });

    // Independent implementation: plain arrays, a Map by year, jstat for means and type-7 quantiles.
    const baseline = jStat.mean(values);
    const departureByYear = new Map(years.map((year, index) => [year, (values[index] as number) - baseline]));
    const lags = Array.from({ length: lastLag - firstLag + 1 }, (_, index) => firstLag + index);
    const covered = (year: number): boolean => lags.every((lag) => departureByYear.has(year + lag));
    const pool = years.filter(covered);
    const used = eventYears.filter(covered);
    expect(result.poolSize).toBe(pool.length);
    expect(result.eventsUsed).toEqual(used);
    const compositeOf = (keys: readonly number[], lag: number): number =>
      jStat.mean(keys.map((year) => departureByYear.get(year + lag) as number));
    const sample = parkMillerSubsetSampler(32);
    const randomComposites = lags.map(() => [] as number[]);
    for (let draw = 0; draw < draws; draw += 1) {
      const keys = sample(pool, used.length);
      lags.forEach((lag, index) => randomComposites[index]?.push(compositeOf(keys, lag)));
    }
    lags.forEach((lag, index) => {
      const atLag = randomComposites[index] as number[];
      const spread = jStat.stdev(atLag);
      const observed = compositeOf(used, lag);
      expect(result.composite[index] as number).toBeCloseTo(observed, 12);
      const [lower95, upper95, lower99, upper99] = jStat.quantiles(atLag, [0.025, 0.975, 0.005, 0.995], 1, 1);
      const ci95 = result.ci95[index] as [number, number];
      const ci99 = result.ci99[index] as [number, number];
      // Difference of two independent percentile estimates: about 0.03σ at 2.5 % and 0.05σ at 0.5 %.
      expect(Math.abs(ci95[0] - (lower95 as number))).toBeLessThan(0.15 * spread);
      expect(Math.abs(ci95[1] - (upper95 as number))).toBeLessThan(0.15 * spread);
      expect(Math.abs(ci99[0] - (lower99 as number))).toBeLessThan(0.3 * spread);
      expect(Math.abs(ci99[1] - (upper99 as number))).toBeLessThan(0.3 * spread);
      const poolMean = jStat.mean(pool.map((year) => departureByYear.get(year + lag) as number));
      const asExtreme = atLag.filter((value) => Math.abs(value - poolMean) >= Math.abs(observed - poolMean) - 1e-12).length;
      const bruteP = (asExtreme + 1) / (draws + 1);
      expect(Math.abs((result.pValue[index] as number) - bruteP)).toBeLessThan(0.025);
    });
  });

  describe("degenerate input", () => {
    it("a constant series gives composite 0, limits [0, 0] and p = 1", () => {
      const years = Array.from({ length: 30 }, (_, index) => 1900 + index);
      const result = superposedEpochAnalysis({
        years, values: years.map(() => 4.2), eventYears: [1905, 1915], firstLag: -1, lastLag: 1, draws: 1000,
        random: createRandom(6),
      });
      expect(result.composite.every((value) => Math.abs(value) < 1e-12)).toBe(true);
      for (const [lower, upper] of [...result.ci95, ...result.ci99]) {
        expect(Math.abs(lower)).toBeLessThan(1e-12);
        expect(Math.abs(upper)).toBeLessThan(1e-12);
      }
      expect(result.pValue).toEqual([1, 1, 1]);
    });

    it("a pool equal to the used events collapses the limits onto the composite and gives p = 1", () => {
      const years = Array.from({ length: 10 }, (_, index) => 1800 + index);
      const values = [3, 1, 4, 1, 5, 9, 2, 6, 5, 3];
      const result = superposedEpochAnalysis({
        years, values, eventYears: years.slice(1), firstLag: -1, lastLag: 0, draws: 1000, random: createRandom(7),
      });
      expect(result.poolSize).toBe(9);
      expect(result.eventsUsed).toHaveLength(9);
      result.composite.forEach((value, index) => {
        const [lower, upper] = result.ci99[index] as [number, number];
        expect(lower).toBeCloseTo(value, 12);
        expect(upper).toBeCloseTo(value, 12);
      });
      expect(result.pValue).toEqual([1, 1]);
    });

    it("no usable event gives NaN at every lag and a reason; so does an empty event list", () => {
      const { years, values } = wavySeries(1800, 20);
      for (const eventYears of [[1700, 1819], []]) {
        const result = superposedEpochAnalysis({
          years, values, eventYears, firstLag: -2, lastLag: 2, draws: 1000, random: createRandom(1),
        });
        expect(result.lags).toEqual([-2, -1, 0, 1, 2]);
        expect(result.composite.every(Number.isNaN)).toBe(true);
        expect(result.pValue.every(Number.isNaN)).toBe(true);
        expect(result.ci95.flat().every(Number.isNaN)).toBe(true);
        expect(result.ci99.flat().every(Number.isNaN)).toBe(true);
        expect(typeof result.reason).toBe("string");
        expect(result.poolSize).toBe(16);
      }
    });
  });

  describe("contract breaks throw StatsInputError", () => {
    const { years, values } = wavySeries(1800, 30);
    const base = { years, values, eventYears: [1810], firstLag: -1, lastLag: 1, draws: 1000, random: createRandom(1) };
    it.each([
      ["draws below 1000", { draws: 999 }],
      ["non-integer draws", { draws: 1000.5 }],
      ["length mismatch", { values: values.slice(1) }],
      ["years not increasing", { years: [...years].reverse() }],
      ["non-integer year", { years: years.map((year, index) => (index === 3 ? year + 0.5 : year)) }],
      ["NaN value", { values: values.map((value, index) => (index === 2 ? Number.NaN : value)) }],
      ["duplicate event years", { eventYears: [1810, 1810] }],
      ["firstLag after lastLag", { firstLag: 2, lastLag: 1 }],
      ["non-integer lag", { firstLag: -1.5 }],
    ])("%s", (_, change) => {
      expect(() => superposedEpochAnalysis({ ...base, ...change })).toThrow(StatsInputError);
    });
  });

  it("superposedEpochAnalysis({ …, poolYears }) draws key years only from the given candidates", () => {
    const { years, values } = wavySeries(1690, 300);
    const eventYears = [1710, 1750, 1790, 1830];
    // Candidates = the events themselves: every random draw is the observed set, so p = 1 at every lag.
    const onlyEvents = superposedEpochAnalysis({
      years, values, eventYears, firstLag: -2, lastLag: 2, draws: 1000, random: createRandom(3), poolYears: eventYears,
    });
    expect(onlyEvents.poolSize).toBe(4);
    expect(onlyEvents.pValue.every((p) => p === 1)).toBe(true);
    // A pool restricted to 1700–1850 has exactly the 151 years of that span (all windows covered).
    const restricted = superposedEpochAnalysis({
      years, values, eventYears, firstLag: -2, lastLag: 2, draws: 1000, random: createRandom(3),
      poolYears: Array.from({ length: 151 }, (_, i) => 1700 + i),
    });
    expect(restricted.poolSize).toBe(151);
    // Fewer candidates than events: not computable, with a reason.
    const tooFew = superposedEpochAnalysis({
      years, values, eventYears, firstLag: -2, lastLag: 2, draws: 1000, random: createRandom(3), poolYears: [1710, 1750],
    });
    expect(tooFew.reason).toMatch(/fewer than the 4 events/);
  });
});
