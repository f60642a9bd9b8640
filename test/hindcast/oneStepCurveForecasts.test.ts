import { describe, expect, it } from "vitest";
import { curveRuleForecasts } from "../../src/hindcast/curveRuleForecasts.js";
import { fixedEvent } from "../../src/hindcast/fixedEvent.js";
import { hindcastDesign } from "../../src/hindcast/hindcastDesign.js";
import { oneStepCurveForecasts, oneStepScratch } from "../../src/hindcast/oneStepCurveForecasts.js";
import { phaseRuleForecasts } from "../../src/hindcast/phaseRuleForecasts.js";
import { createRandom } from "../../src/stats/createRandom.js";
import { logisticRegression } from "../../src/stats/logisticRegression.js";
import type { IndexSettings } from "../../src/workspace/types.js";
import { shuttleOringAnyDistress } from "../fixtures/published/logisticRegressionExamples.js";

const cutsIndex = (name: string, cuts: number[]): IndexSettings =>
  ({ name, file: "i.csv", column: name, phases: { kind: "cuts", cuts, labels: cuts.map((_, i) => `p${i}`).concat(["top"]) }, months: null }) as IndexSettings;

const expit = (eta: number) => 1 / (1 + Math.exp(-eta));

/** Leave-one-out (exclusion 0) of the O-ring launches as "years" 1…23: one index, the launch temperature. */
function oringDesign() {
  const temperature = shuttleOringAnyDistress.temperature;
  const years = temperature.map((_, i) => i + 1);
  const indexValues = new Map([["T", new Map(years.map((year, i) => [year, temperature[i] as number]))]]);
  const design = hindcastDesign({ years, indexValues, indexSettings: [cutsIndex("T", [65, 72])], indices: ["T"], exclusion: 0 });
  const fire = Uint8Array.from(shuttleOringAnyDistress.damaged, (count) => (count > 0 ? 1 : 0));
  const category = Uint8Array.from(fire, (outcome) => outcome * 2);
  return { design, fire, category, temperature };
}

/** An invented record of `length` years, two indices, the first with a planted logistic link of slope `slope`. */
function inventedRecord(seed: number, length: number, slope: number, exclusion: number) {
  const random = createRandom(seed);
  const normal = () => Math.sqrt(-2 * Math.log(Math.max(random.nextFloat(), 1e-12))) * Math.cos(2 * Math.PI * random.nextFloat());
  const years = Array.from({ length }, (_, i) => 1700 + i);
  const a = new Map<number, number>();
  const b = new Map<number, number>();
  const activity = new Map<number, number>();
  for (const year of years) {
    const x = Math.round(normal() * 100) / 100;
    if (random.nextInt(40) !== 0) a.set(year, x);
    b.set(year, Math.round(normal() * 100) / 100);
    activity.set(year, random.nextFloat() < expit(-2.2 + slope * x) ? 0.4 + 0.5 * random.nextFloat() : 0.3 * random.nextFloat());
  }
  const indexSettings = [cutsIndex("A", [-0.5, 0.5]), { name: "B", file: "i.csv", column: "B", phases: { kind: "terciles", labels: ["low", "mid", "high"] }, months: null } as IndexSettings];
  const design = hindcastDesign({ years, indexValues: new Map([["A", a], ["B", b]]), indexSettings, indices: ["A", "B"], exclusion });
  const event = fixedEvent(design.years, activity, 0.1, "fraction");
  return { design, event };
}

/** BSS of fold forecasts against the fixed base rate. */
function brierSkill(design: ReturnType<typeof hindcastDesign>, fire: Uint8Array, base: number, probability: Float64Array): number {
  let score = 0;
  let reference = 0;
  for (let fold = 0; fold < design.folds; fold += 1) {
    const outcome = fire[design.target[fold] as number] as number;
    score += ((probability[fold] as number) - outcome) ** 2;
    reference += (base - outcome) ** 2;
  }
  return 1 - score / reference;
}

describe("oneStepCurveForecasts (one-step case deletion, Pregibon 1981)", () => {
  const settings = { jointMinYears: 10, jointMaxQ: 1 };

  it("O-ring launches (Dalal, Fowlkes & Hoadley 1989), leave one out: equals Pregibon's closed form b − (XᵀWX)⁻¹xᵢ(yᵢ − pᵢ)/(1 − hᵢ) computed by hand", () => {
    // Pregibon D. (1981) "Logistic regression diagnostics", Annals of Statistics 9:705–724, eq. for the one-step
    // change in the coefficients when case i is deleted. Whole fit by logisticRegression (checked against R's glm
    // on these data in logisticRegression.test.ts).
    const { design, fire, category, temperature } = oringDesign();
    const whole = logisticRegression(temperature.map((t) => [t]), Array.from(fire, (outcome) => outcome === 1));
    const [b0, b1] = whole.coefficients as [number, number];
    const v = whole.covariance; // (XᵀWX)⁻¹ at the optimum
    const phase = phaseRuleForecasts(design, fire, category, settings);
    const oneStep = oneStepCurveForecasts(design, fire, phase, oneStepScratch(design));
    const sorted = [...temperature].sort((p, q) => p - q);
    for (let fold = 0; fold < design.folds; fold += 1) {
      const i = design.target[fold] as number;
      const t = temperature[i] as number;
      const p = expit(b0 + b1 * t);
      const w = p * (1 - p);
      const vx0 = (v[0]![0] as number) + (v[0]![1] as number) * t;
      const vx1 = (v[1]![0] as number) + (v[1]![1] as number) * t;
      const leverage = w * (vx0 + vx1 * t);
      const factor = ((fire[i] as number) - p) / (1 - leverage);
      const d0 = b0 - vx0 * factor;
      const d1 = b1 - vx1 * factor;
      // Read at the held-out launch's temperature, clamped to the other launches' range.
      const others = sorted.filter((_, k) => k !== sorted.indexOf(t));
      const at = Math.min(Math.max(t, others[0] as number), others[others.length - 1] as number);
      expect(oneStep[fold]).toBeCloseTo(expit(d0 + d1 * at), 5);
    }
  });

  it("O-ring launches, leave one out: within 0.015 of the exact refit of the 22 other launches (the most influential launch moves most)", () => {
    const { design, fire, category } = oringDesign();
    const phase = phaseRuleForecasts(design, fire, category, settings);
    const exact = curveRuleForecasts(design, fire, phase);
    const oneStep = oneStepCurveForecasts(design, fire, phase, oneStepScratch(design));
    expect(exact.read.every((read) => read === 1)).toBe(true);
    const differences = Array.from(oneStep, (p, f) => Math.abs(p - (exact.probability[f] as number)));
    expect(Math.max(...differences)).toBeLessThan(0.015);
    expect(Math.max(...differences)).toBeGreaterThan(1e-4); // an approximation, not the refit itself
  });

  it("on 12 invented 290-year records (leave ±2 out): every fold within 1e-3 of the exact refit but where the two forms' choice flips, and the BSS within 0.003 (measured: at most 0.0020, 25 of 3,400 folds flip)", () => {
    let folds = 0;
    let flips = 0;
    for (let seed = 1; seed <= 12; seed += 1) {
      const { design, event } = inventedRecord(seed, 290, [0, 0.8, 1.6][seed % 3] as number, 2);
      const phase = phaseRuleForecasts(design, event.fire, event.category, settings);
      const exact = curveRuleForecasts(design, event.fire, phase).probability;
      const oneStep = oneStepCurveForecasts(design, event.fire, phase, oneStepScratch(design));
      for (let fold = 0; fold < design.folds; fold += 1) {
        const difference = Math.abs((oneStep[fold] as number) - (exact[fold] as number));
        if (difference >= 1e-3) flips += 1;
        folds += 1;
      }
      const bss = (probability: Float64Array) => brierSkill(design, event.fire, event.baseRate, probability);
      expect(Math.abs(bss(oneStep) - bss(exact))).toBeLessThan(0.003);
    }
    expect(folds).toBeGreaterThan(3000);
    expect(flips / folds).toBeLessThan(0.01);
  });

  it("falls back to the exact refit in a fold whose left-in outcomes are separated", () => {
    // 30 years, the only high-fire years at the largest values but one: leaving that one out separates the rest.
    const years = Array.from({ length: 30 }, (_, i) => 1800 + i);
    const values = years.map((_, i) => (i - 15) / 5);
    const fire = Uint8Array.from(years, (_, i) => (i >= 26 || i === 10 ? 1 : 0));
    const category = Uint8Array.from(fire, (outcome) => outcome * 2);
    const design = hindcastDesign({
      years,
      indexValues: new Map([["A", new Map(years.map((year, i) => [year, values[i] as number]))]]),
      indexSettings: [cutsIndex("A", [-1, 1])],
      indices: ["A"],
      exclusion: 0,
    });
    const phase = phaseRuleForecasts(design, fire, category, settings);
    const exact = curveRuleForecasts(design, fire, phase).probability;
    const oneStep = oneStepCurveForecasts(design, fire, phase, oneStepScratch(design));
    const separatedFold = Array.from(design.target).indexOf(10);
    expect(oneStep[separatedFold]).toBeCloseTo(exact[separatedFold] as number, 9);
  });
});

describe("oneStepCurveForecasts on an index far from zero (a nearly singular quadratic design)", () => {
  it("refits every fold exactly when the whole-record design is not regular with a wide margin (pressure-like values 101325 ± 100)", () => {
    const random = createRandom(11);
    const years = Array.from({ length: 60 }, (_, i) => 1800 + i);
    const values = years.map(() => Math.round(101325 + (random.nextFloat() - 0.5) * 400));
    const fire = Uint8Array.from(values, (value) => (random.nextFloat() < expit(-2 + (value - 101325) / 60) ? 1 : 0));
    const category = Uint8Array.from(fire, (outcome) => outcome * 2);
    const design = hindcastDesign({
      years,
      indexValues: new Map([["P", new Map(years.map((year, i) => [year, values[i] as number]))]]),
      indexSettings: [cutsIndex("P", [101250, 101400])],
      indices: ["P"],
      exclusion: 2,
    });
    const settings = { jointMinYears: 10, jointMaxQ: 1 };
    const phase = phaseRuleForecasts(design, fire, category, settings);
    const scratch = oneStepScratch(design);
    expect(scratch.regular[0]).toBe(0);
    const exact = curveRuleForecasts(design, fire, phase).probability;
    const oneStep = oneStepCurveForecasts(design, fire, phase, scratch);
    for (let fold = 0; fold < design.folds; fold += 1) expect(oneStep[fold]).toBeCloseTo(exact[fold] as number, 9);
  });
});
