import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { brierScore } from "../../src/stats/brierScore.js";
import { createRandom } from "../../src/stats/createRandom.js";
import { reliabilityTable } from "../../src/stats/reliabilityTable.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";

describe("reliabilityTable(probabilities, outcomes, binEdges?)", () => {
  it("reliabilityTable([0.1, 0.1, 0.7, 0.8], [0, 1, 1, 1], [0, 0.5, 1]) counts, averages and frequencies by hand", () => {
    expect(reliabilityTable([0.1, 0.1, 0.7, 0.8], [0, 1, 1, 1], [0, 0.5, 1])).toEqual([
      { lower: 0, upper: 0.5, count: 2, meanForecast: 0.1, observedFrequency: 0.5 },
      { lower: 0.5, upper: 1, count: 2, meanForecast: 0.75, observedFrequency: 1 },
    ]);
  });

  it("default edges are ten bins of width 0.1; 0.3 opens [0.3, 0.4) and 1 closes the last bin", () => {
    const table = reliabilityTable([0, 0.3, 0.3, 0.999, 1, 0.05], [0, 1, 0, 1, 1, false]);
    expect(table).toHaveLength(10);
    expect(table.map((row) => row.lower)).toEqual([0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9]);
    expect(table[9]?.upper).toBe(1);
    expect(table.map((row) => row.count)).toEqual([2, 0, 0, 2, 0, 0, 0, 0, 0, 2]);
    expect(table[3]).toMatchObject({ meanForecast: 0.3, observedFrequency: 0.5 });
    expect(table[1]).toMatchObject({ count: 0, meanForecast: null, observedFrequency: null });
  });

  it("per-bin mean forecast and observed frequency match a brute-force filter with jstat.mean", () => {
    const random = createRandom(91);
    const probabilities = Array.from({ length: 500 }, () => Math.round(random.nextFloat() * 20) / 20);
    const outcomes = probabilities.map((p) => (random.nextFloat() < p ? 1 : 0) as 0 | 1);
    const edges = [0, 0.25, 0.5, 0.75, 1];
    const table = reliabilityTable(probabilities, outcomes, edges);
    expect(jStat.sum(table.map((row) => row.count))).toBe(500);
    table.forEach((row, bin) => {
      const isLast = bin === table.length - 1;
      const members = probabilities
        .map((p, index) => ({ p, o: outcomes[index] as number }))
        .filter(({ p }) => p >= row.lower && (isLast ? p <= row.upper : p < row.upper));
      expect(row.count).toBe(members.length);
      expect(row.meanForecast as number).toBeCloseTo(jStat.mean(members.map(({ p }) => p)), 12);
      expect(row.observedFrequency as number).toBeCloseTo(jStat.mean(members.map(({ o }) => o)), 12);
    });
  });

  it("Murphy (1973) decomposition BS = REL − RES + UNC holds exactly when forecasts sit on bin values", () => {
    // Murphy A.H. (1973) "A new vector partition of the probability score", J. Appl. Meteor. 12:595–600
    // (definitions consistent with the AMS Glossary of Meteorology, "Brier score"): with every forecast equal to its bin
    // value, REL = Σ nₖ(pₖ − ōₖ)²/N, RES = Σ nₖ(ōₖ − ō)²/N, UNC = ō(1 − ō).
    const random = createRandom(92);
    const values = [0.05, 0.15, 0.25, 0.35, 0.45, 0.55, 0.65, 0.75, 0.85, 0.95];
    const probabilities = Array.from({ length: 400 }, () => values[random.nextInt(values.length)] as number);
    const outcomes = probabilities.map((p) => (random.nextFloat() < p * 0.8 + 0.05 ? 1 : 0) as 0 | 1);
    const table = reliabilityTable(probabilities, outcomes);
    const total = probabilities.length;
    const climatology = jStat.mean(outcomes);
    let reliability = 0;
    let resolution = 0;
    for (const row of table) {
      if (row.count === 0) continue;
      reliability += (row.count * ((row.meanForecast as number) - (row.observedFrequency as number)) ** 2) / total;
      resolution += (row.count * ((row.observedFrequency as number) - climatology) ** 2) / total;
    }
    const uncertainty = climatology * (1 - climatology);
    expect(brierScore(probabilities, outcomes)).toBeCloseTo(reliability - resolution + uncertainty, 12);
  });

  describe("edge cases", () => {
    it("empty input gives every bin with count 0 and null averages", () => {
      const table = reliabilityTable([], [], [0, 0.5, 1]);
      expect(table).toEqual([
        { lower: 0, upper: 0.5, count: 0, meanForecast: null, observedFrequency: null },
        { lower: 0.5, upper: 1, count: 0, meanForecast: null, observedFrequency: null },
      ]);
    });

    it("bad edges, probabilities outside [0, 1] or the edges, outcome 2, mismatched lengths throw", () => {
      expect(() => reliabilityTable([0.5], [1], [0.5])).toThrow(StatsInputError);
      expect(() => reliabilityTable([0.5], [1], [0, 0.6, 0.6, 1])).toThrow(StatsInputError);
      expect(() => reliabilityTable([0.5], [1], [0, 1.5])).toThrow(StatsInputError);
      expect(() => reliabilityTable([1.2], [1])).toThrow(StatsInputError);
      expect(() => reliabilityTable([0.1], [1], [0.2, 1])).toThrow(StatsInputError);
      expect(() => reliabilityTable([0.5], [2 as 1])).toThrow(StatsInputError);
      expect(() => reliabilityTable([0.5, 0.2], [1])).toThrow(StatsInputError);
    });
  });
});
