import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { brierScore } from "../../src/stats/brierScore.js";
import { contingencyTableScores } from "../../src/stats/contingencyTableScores.js";
import { createRandom } from "../../src/stats/createRandom.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";

/**
 * Finley J.P. (1884) tornado forecasts, American Meteorological Journal 1:85–88, as discussed by Murphy A.H. (1996)
 * "The Finley affair", Weather and Forecasting 11:3–20 (table as quoted by secondary sources; citation details
 * from memory).
 */
const FINLEY = Object.freeze({ hits: 28, misses: 23, falseAlarms: 72, correctNegatives: 2680 });

/** Expands a table into case-by-case 0/1 forecasts and outcomes. */
function cases(table: Parameters<typeof contingencyTableScores>[0]): { forecast: number[]; observed: number[] } {
  const forecast: number[] = [];
  const observed: number[] = [];
  const add = (count: number, f: number, o: number): void => {
    for (let index = 0; index < count; index += 1) {
      forecast.push(f);
      observed.push(o);
    }
  };
  add(table.hits, 1, 1);
  add(table.misses, 0, 1);
  add(table.falseAlarms, 1, 0);
  add(table.correctNegatives, 0, 0);
  return { forecast, observed };
}

describe("contingencyTableScores({ hits, misses, falseAlarms, correctNegatives })", () => {
  it("Finley's tornado table: published percent correct 0.966, threat score 0.228, POD 0.549, FAR 0.720", () => {
    // Published values as quoted in verification lecture notes on Finley's table (secondary sources).
    const scores = contingencyTableScores(FINLEY);
    expect(scores.percentCorrect).toBeCloseTo(0.966, 3);
    expect(scores.threatScore).toBeCloseTo(0.228, 3);
    expect(scores.hitRate).toBeCloseTo(0.549, 3);
    expect(scores.falseAlarmRatio).toBeCloseTo(0.72, 3);
  });

  it("Finley's tornado table: bias 1.961, POFD 0.02616, Heidke 0.3553, Peirce 0.5229, ETS 0.2160", () => {
    // Recomputed from Finley's table (derived, not published numbers).
    const scores = contingencyTableScores(FINLEY);
    expect(scores.bias).toBeCloseTo(1.961, 3);
    expect(scores.falseAlarmRate).toBeCloseTo(0.02616, 5);
    expect(scores.heidkeSkillScore).toBeCloseTo(0.3553, 4);
    expect(scores.peirceSkillScore).toBeCloseTo(0.5229, 4);
    expect(scores.equitableThreatScore).toBeCloseTo(0.216, 4);
  });

  it("hand-counted table H = 2, M = 2, F = 1, C = 2 gives exact fractions", () => {
    // The small table of the xskillscore package's own contingency-score tests (from memory, M): threat score 2/5; others by hand.
    const scores = contingencyTableScores({ hits: 2, misses: 2, falseAlarms: 1, correctNegatives: 2 });
    expect(scores.threatScore).toBeCloseTo(2 / 5, 15);
    expect(scores.hitRate).toBeCloseTo(2 / 4, 15);
    expect(scores.falseAlarmRatio).toBeCloseTo(1 / 3, 15);
    expect(scores.falseAlarmRate).toBeCloseTo(1 / 3, 15);
    expect(scores.bias).toBeCloseTo(3 / 4, 15);
    expect(scores.percentCorrect).toBeCloseTo(4 / 7, 15);
    // HSS = 2(2·2 − 2·1)/(4·4 + 3·3) = 4/25; PSS = (4 − 2)/(4·3) = 1/6; H_random = 12/7, ETS = (2/7)/(5 − 12/7).
    expect(scores.heidkeSkillScore).toBeCloseTo(4 / 25, 15);
    expect(scores.peirceSkillScore).toBeCloseTo(1 / 6, 15);
    expect(scores.equitableThreatScore).toBeCloseTo(2 / 23, 15);
  });

  it("scores agree with case-by-case means (jstat) and textbook alternative formulas on random tables", () => {
    const random = createRandom(61);
    for (let trial = 0; trial < 40; trial += 1) {
      const table = {
        hits: 1 + random.nextInt(40),
        misses: 1 + random.nextInt(40),
        falseAlarms: 1 + random.nextInt(40),
        correctNegatives: 1 + random.nextInt(200),
      };
      const scores = contingencyTableScores(table);
      const { forecast, observed } = cases(table);
      const total = forecast.length;
      const whereObserved = forecast.filter((_, index) => observed[index] === 1);
      const whereNotObserved = forecast.filter((_, index) => observed[index] === 0);
      const outcomeWhereForecast = observed.filter((_, index) => forecast[index] === 1);
      expect(scores.hitRate).toBeCloseTo(jStat.mean(whereObserved), 12);
      expect(scores.falseAlarmRate).toBeCloseTo(jStat.mean(whereNotObserved), 12);
      expect(scores.falseAlarmRatio).toBeCloseTo(1 - jStat.mean(outcomeWhereForecast), 12);
      expect(scores.bias).toBeCloseTo(jStat.mean(forecast) / jStat.mean(observed), 12);
      const agreement = forecast.map((f, index) => (f === observed[index] ? 1 : 0));
      expect(scores.percentCorrect).toBeCloseTo(jStat.mean(agreement), 12);
      // 0/1 forecasts: Brier score = 1 − proportion correct.
      expect(scores.percentCorrect).toBeCloseTo(1 - brierScore(forecast, observed as (0 | 1)[]), 12);
      // Heidke: (PC − E)/(1 − E) with E the proportion correct expected by chance from the margins.
      const forecastRate = jStat.mean(forecast);
      const eventRate = jStat.mean(observed);
      const chance = forecastRate * eventRate + (1 - forecastRate) * (1 - eventRate);
      expect(scores.heidkeSkillScore).toBeCloseTo((scores.percentCorrect - chance) / (1 - chance), 12);
      expect(scores.peirceSkillScore).toBeCloseTo(scores.hitRate - scores.falseAlarmRate, 12);
      const randomHits = total * forecastRate * eventRate;
      expect(scores.equitableThreatScore).toBeCloseTo(
        (table.hits - randomHits) / (table.hits + table.misses + table.falseAlarms - randomHits),
        12,
      );
    }
  });

  describe("edge cases", () => {
    it("zero denominators give NaN: no events, never forecast 'yes', an empty table", () => {
      const noEvents = contingencyTableScores({ hits: 0, misses: 0, falseAlarms: 3, correctNegatives: 5 });
      expect(noEvents.hitRate).toBeNaN();
      expect(noEvents.bias).toBeNaN();
      expect(noEvents.peirceSkillScore).toBeNaN();
      expect(noEvents.falseAlarmRate).toBeCloseTo(3 / 8, 15);
      const neverYes = contingencyTableScores({ hits: 0, misses: 4, falseAlarms: 0, correctNegatives: 5 });
      expect(neverYes.falseAlarmRatio).toBeNaN();
      expect(neverYes.hitRate).toBe(0);
      expect(neverYes.heidkeSkillScore).toBe(0);
      const empty = contingencyTableScores({ hits: 0, misses: 0, falseAlarms: 0, correctNegatives: 0 });
      expect(Object.values(empty).every(Number.isNaN)).toBe(true);
      const onlyNegatives = contingencyTableScores({ hits: 0, misses: 0, falseAlarms: 0, correctNegatives: 9 });
      expect(onlyNegatives.threatScore).toBeNaN();
      expect(onlyNegatives.equitableThreatScore).toBeNaN();
      expect(onlyNegatives.percentCorrect).toBe(1);
    });

    it("negative or non-integer counts throw StatsInputError", () => {
      expect(() => contingencyTableScores({ ...FINLEY, hits: -1 })).toThrow(StatsInputError);
      expect(() => contingencyTableScores({ ...FINLEY, misses: 2.5 })).toThrow(StatsInputError);
      expect(() => contingencyTableScores({ ...FINLEY, correctNegatives: Number.NaN })).toThrow(StatsInputError);
    });
  });
});
