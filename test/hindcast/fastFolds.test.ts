import { describe, expect, it } from "vitest";
import { curveRuleForecasts } from "../../src/hindcast/curveRuleForecasts.js";
import { curveScratch } from "../../src/hindcast/fastResponseCurve.js";
import { fixedEvent } from "../../src/hindcast/fixedEvent.js";
import { hindcastDesign } from "../../src/hindcast/hindcastDesign.js";
import { BASIS, phaseRuleForecasts, phaseRuleScratch } from "../../src/hindcast/phaseRuleForecasts.js";
import type { HindcastInput } from "../../src/hindcast/runHindcast.js";
import { createRandom } from "../../src/stats/createRandom.js";
import type { IndexSettings } from "../../src/workspace/types.js";
import { slowHindcast } from "./slowHindcast.js";

/**
 * Invented regions built to stress the fold counting: activity with many ties (and many zero years), index
 * values rounded to one decimal (ties at the tercile cuts), missing index values, gaps in the years, tercile
 * and fixed-cut indices, a planted link of random strength.
 */
function trickyInput(seed: number): HindcastInput {
  const random = createRandom(seed);
  const length = 25 + random.nextInt(90);
  const years: number[] = [];
  let year = 1800;
  for (let i = 0; i < length; i += 1) {
    year += random.nextInt(10) === 0 ? 2 + random.nextInt(3) : 1;
    years.push(year);
  }
  const names = ["P", "Q", "R", "S"].slice(0, 2 + random.nextInt(3));
  const settings: IndexSettings[] = names.map((name, i) =>
    i % 2 === 0
      ? { name, file: "i.csv", column: name, phases: { kind: "terciles", labels: ["low", "middle", "high"] }, months: null }
      : { name, file: "i.csv", column: name, phases: { kind: "cuts", cuts: [-0.5, 0.5], labels: ["low", "mid", "high"] }, months: null },
  ) as IndexSettings[];
  const effect = random.nextFloat() * 3;
  const indexValues = new Map<string, Map<number, number>>(names.map((name) => [name, new Map()]));
  const activity = new Map<number, number>();
  for (const y of years) {
    let driver = 0;
    names.forEach((name, i) => {
      const value = Math.round((random.nextFloat() * 4 - 2) * 10) / 10;
      if (i === 0) driver = value;
      if (random.nextInt(12) !== 0) indexValues.get(name)?.set(y, value);
    });
    const burn = random.nextFloat() < 1 / (1 + Math.exp(-(-1.5 + effect * driver)));
    activity.set(y, burn ? [0.5, 0.6, 0.6, 0.8][random.nextInt(4)] as number : [0, 0, 0, 0.1, 0.2][random.nextInt(5)] as number);
  }
  return {
    years,
    activity,
    indexValues,
    indexSettings: settings,
    indices: names.filter(() => random.nextInt(4) !== 0),
    top: [0.1, 0.2, 0.3][random.nextInt(3)] as number,
    measure: "fraction",
    exclusion: random.nextInt(4),
    jointMinYears: [3, 10][random.nextInt(2)] as number,
    jointMaxQ: [0.05, 0.5, 1][random.nextInt(3)] as number,
  };
}

describe("phaseRuleForecasts(design, fire, category, settings) and curveRuleForecasts", () => {
  it("agree with the outlook's own functions rebuilt fold by fold (buildTrainingSet, rankIndicesByAssociation, forecastCell, curveForecast) on 40 tie-heavy invented regions: the phase rule exactly, the curve rule to 1e-9 (cold and warm starts)", () => {
    let folds = 0;
    const bases = new Set<string>();
    for (let seed = 1; seed <= 40; seed += 1) {
      const input = trickyInput(seed);
      const design = hindcastDesign(input);
      const event = fixedEvent(design.years, input.activity, input.top, input.measure);
      const fast = phaseRuleForecasts(design, event.fire, event.category, input);
      const curve = curveRuleForecasts(design, event.fire, fast);
      // The permutation test's path: warm starts and warm steps from the previous fold's fit.
      const scratch = design.names.map(() => curveScratch(design.years.length));
      curveRuleForecasts(design, event.fire, fast, scratch, true);
      const warm = curveRuleForecasts(design, event.fire, fast, scratch, true);
      const slow = slowHindcast(input);
      expect(design.folds).toBe(slow.length);
      slow.forEach((fold, f) => {
        expect(design.years[design.target[f] as number]).toBe(fold.year);
        expect(fast.probability[f]).toBe(fold.probability);
        expect([fast.categories[f * 3], fast.categories[f * 3 + 1], fast.categories[f * 3 + 2]]).toEqual(fold.categories);
        expect(fast.climatology[f]).toBe(fold.climatology);
        expect(BASIS[fast.basis[f] as number]).toBe(fold.basis);
        expect(Math.abs((curve.probability[f] as number) - fold.curveProbability)).toBeLessThan(1e-9);
        expect(curve.read[f] === 1).toBe(fold.curveRead);
        expect(Math.abs((warm.probability[f] as number) - fold.curveProbability)).toBeLessThan(1e-9);
        bases.add(fold.basis);
        folds += 1;
      });
    }
    // The regions exercise every branch of the rule.
    expect(bases).toEqual(new Set(["joint", "single", "climatology"]));
    expect(folds).toBeGreaterThan(1500);
  });
});

describe('phaseRuleForecasts(…, "probability"): the permutation tests\' pass', () => {
  it("gives the same probability, basis, cell index and climatology as the full pass, fold by fold, on 40 tie-heavy regions with their records shuffled, sharing one scratch", () => {
    let folds = 0;
    for (let seed = 1; seed <= 40; seed += 1) {
      const input = trickyInput(seed);
      const design = hindcastDesign(input);
      const event = fixedEvent(design.years, input.activity, input.top, input.measure);
      const scratch = phaseRuleScratch(design);
      const random = createRandom(1000 + seed);
      for (let shuffle = 0; shuffle < 4; shuffle += 1) {
        // A shuffled record (outcome and category of a year move together), as the permutation test makes.
        const order = Array.from(event.fire, (_, i) => i);
        for (let i = order.length - 1; i > 0; i -= 1) {
          const j = random.nextInt(i + 1);
          [order[i], order[j]] = [order[j] as number, order[i] as number];
        }
        const fire = Uint8Array.from(order, (from) => event.fire[from] as number);
        const category = Uint8Array.from(order, (from) => event.category[from] as number);
        // Alternate the two passes on the same scratch, so neither can lean on what the other left behind.
        const quick = phaseRuleForecasts(design, fire, category, input, scratch, "probability");
        const quickCopy = { probability: Float64Array.from(quick.probability), basis: Uint8Array.from(quick.basis), cellIndex: Int16Array.from(quick.cellIndex), climatology: Float64Array.from(quick.climatology) };
        expect(Number.isNaN(quick.categories[0] as number)).toBe(true);
        const full = phaseRuleForecasts(design, fire, category, input, scratch, "all");
        expect(quickCopy.probability).toEqual(full.probability);
        expect(quickCopy.basis).toEqual(full.basis);
        expect(quickCopy.cellIndex).toEqual(full.cellIndex);
        expect(quickCopy.climatology).toEqual(full.climatology);
        // And the full pass after a quick one equals a full pass on fresh buffers.
        expect(full.categories).toEqual(phaseRuleForecasts(design, fire, category, input).categories);
        folds += design.folds;
      }
    }
    expect(folds).toBeGreaterThan(6000);
  });
});
