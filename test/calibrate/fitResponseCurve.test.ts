import { describe, expect, it } from "vitest";
import jStat from "jstat";
import { CURVE_POINTS, fitResponseCurve, readResponseCurve } from "../../src/calibrate/fitResponseCurve.js";
import { runCalibration } from "../../src/calibrate/runCalibration.js";
import { createRandom } from "../../src/stats/createRandom.js";
import { logisticPrediction } from "../../src/stats/logisticPrediction.js";
import { logisticRegression } from "../../src/stats/logisticRegression.js";
import { shuttleOringAnyDistress } from "../fixtures/published/logisticRegressionExamples.js";
import { syntheticWorkspace } from "../helpers/syntheticWorkspace.js";

const oringValues = [...shuttleOringAnyDistress.temperature];
const oringOutcomes = shuttleOringAnyDistress.damaged.map((count) => count > 0);

/**
 * Newton–Raphson for the straight logit written here from the textbook formulas (Agresti 2013, Categorical Data
 * Analysis, 3rd ed., §5.1 / McCullagh & Nelder 1989, §2.5): fixed 100 sweeps, 2 × 2 information inverted by hand.
 */
function independentFit(x: readonly number[], y: readonly boolean[]) {
  let b0 = 0;
  let b1 = 0;
  let i00 = 0;
  let i01 = 0;
  let i11 = 0;
  for (let sweep = 0; sweep < 100; sweep += 1) {
    let g0 = 0;
    let g1 = 0;
    i00 = 0;
    i01 = 0;
    i11 = 0;
    x.forEach((value, i) => {
      const p = 1 / (1 + Math.exp(-(b0 + b1 * value)));
      const w = p * (1 - p);
      const r = (y[i] ? 1 : 0) - p;
      g0 += r;
      g1 += r * value;
      i00 += w;
      i01 += w * value;
      i11 += w * value * value;
    });
    const det = i00 * i11 - i01 * i01;
    b0 += (i11 * g0 - i01 * g1) / det;
    b1 += (-i01 * g0 + i00 * g1) / det;
  }
  const det = i00 * i11 - i01 * i01;
  return { b0, b1, covariance: [[i11 / det, -i01 / det], [-i01 / det, i00 / det]] };
}

describe("fitResponseCurve(values, outcomes) — published worked example", () => {
  // Dalal, Fowlkes & Hoadley (1989) JASA 84:945–957 data; Agresti (2007) An Introduction to Categorical Data
  // Analysis, 2nd ed., Table 5.10: R glm prints intercept 15.0429 (SE 7.3786), slope −0.2322 (SE 0.1082);
  // deviances 28.267 and 20.315 (from memory), so the likelihood-ratio statistic is 7.952.
  const result = fitResponseCurve(oringValues, oringOutcomes);
  const curve = result.curve!;

  it("O-ring distress on launch temperature → intercept 15.0429, slope −0.2322, SE 7.3786 and 0.1082", () => {
    expect(curve.intercept).toBeCloseTo(15.0429, 4);
    expect(curve.slope).toBeCloseTo(-0.2322, 4);
    expect(curve.standardErrors[0]).toBeCloseTo(7.3786, 4);
    expect(curve.standardErrors[1]).toBeCloseTo(0.1082, 4);
    expect(curve.likelihoodRatio).toBeCloseTo(28.267 - 20.315, 2);
    expect(curve.pValue).toBeCloseTo(1 - jStat.chisquare.cdf(curve.likelihoodRatio, 1), 10);
    expect(curve.method).toBe("maximum likelihood");
    expect(curve.separation).toBe(false);
    expect(curve.aic).toBeCloseTo(20.315 + 4, 2);
    expect(curve.range).toEqual({ min: 53, max: 81 });
    expect(curve.years).toBe(23);
    expect(curve.fireYears).toBe(7);
  });

  it("reports 41 points from the smallest to the largest value with a Wald band that agrees with an independent fit and jStat's normal quantile", () => {
    expect(curve.points).toHaveLength(CURVE_POINTS);
    expect(curve.points[0]!.value).toBe(53);
    expect(curve.points[CURVE_POINTS - 1]!.value).toBe(81);
    const independent = independentFit(oringValues, oringOutcomes);
    const z = jStat.normal.inv(0.975, 0, 1);
    for (const point of curve.points) {
      const eta = independent.b0 + independent.b1 * point.value;
      const c = independent.covariance;
      const se = Math.sqrt(c[0]![0]! + 2 * point.value * c[0]![1]! + point.value * point.value * c[1]![1]!);
      expect(point.estimate).toBeCloseTo(1 / (1 + Math.exp(-eta)), 8);
      expect(point.lower).toBeCloseTo(1 / (1 + Math.exp(-(eta - z * se))), 8);
      expect(point.upper).toBeCloseTo(1 / (1 + Math.exp(-(eta + z * se))), 8);
      expect(point.lower).toBeLessThanOrEqual(point.estimate);
      expect(point.upper).toBeGreaterThanOrEqual(point.estimate);
    }
  });

  it("readResponseCurve agrees with logisticPrediction inside the range and does not read beyond it", () => {
    const fit = logisticRegression(oringValues.map((t) => [t]), oringOutcomes);
    const inside = readResponseCurve(curve, 66);
    const expected = logisticPrediction(fit, [66]);
    expect(inside.estimate).toBeCloseTo(expected.estimate, 10);
    expect(inside.lower).toBeCloseTo(expected.lower, 10);
    expect(inside.upper).toBeCloseTo(expected.upper, 10);
    expect(inside.beyondRange).toBeNull();
    // 31 °F lies below the coldest launch (53 °F): read at 53, flagged, never extrapolated to Agresti's 0.9996.
    const cold = readResponseCurve(curve, 31);
    expect(cold.beyondRange).toBe("below");
    expect(cold.readAt).toBe(53);
    expect(cold.estimate).toBeCloseTo(logisticPrediction(fit, [53]).estimate, 10);
    expect(cold.estimate).toBeLessThan(0.9996);
    // expit(15.0429 − 0.2322 × 53) = 0.939 from R's printed coefficients.
    expect(cold.estimate).toBeCloseTo(1 / (1 + Math.exp(-(15.0429 - 0.2322 * 53))), 2);
    expect(readResponseCurve(curve, 90)).toEqual(expect.objectContaining({ beyondRange: "above", readAt: 81 }));
  });
});

describe("fitResponseCurve — degenerate and small cases", () => {
  it("no years, no high-fire year, every year high-fire, or one index value → null with a reason", () => {
    expect(fitResponseCurve([], [])).toEqual({ curve: null, reason: expect.stringContaining("no calibration years") });
    expect(fitResponseCurve([1, 2, 3], [false, false, false])).toEqual({ curve: null, reason: expect.stringContaining("no high-fire year") });
    expect(fitResponseCurve([1, 2, 3], [true, true, true])).toEqual({ curve: null, reason: expect.stringContaining("every calibration year") });
    expect(fitResponseCurve([2, 2, 2], [true, false, false])).toEqual({ curve: null, reason: expect.stringContaining("same value") });
  });

  it("complete separation (all high-fire years above every other year) → the Firth fit, said so, with finite numbers", () => {
    const result = fitResponseCurve([-2, -1, -0.5, 0, 0.5, 1, 1.5, 2], [false, false, false, false, true, true, true, true]);
    expect(result.curve).not.toBeNull();
    expect(result.curve!.separation).toBe(true);
    expect(result.curve!.method).toBe("Firth penalized likelihood");
    expect(Number.isFinite(result.curve!.slope)).toBe(true);
    expect(result.curve!.slope).toBeGreaterThan(0);
  });

  it("few events: the quadratic form is not tried and the reason says why", () => {
    const result = fitResponseCurve(oringValues, oringOutcomes);
    expect(result.curve!.quadratic).toBeNull();
    expect(result.curve!.quadraticReason).toMatch(/rarer outcome has 7 years/);
  });

  it("a planted U-shaped response (odds high at both extremes) → the quadratic is reported; a straight one → it is not", () => {
    const random = createRandom(5);
    const x: number[] = [];
    const uShaped: boolean[] = [];
    const straight: boolean[] = [];
    for (let i = 0; i < 600; i += 1) {
      const value = -2 + (4 * i) / 599;
      x.push(value);
      uShaped.push(random.nextFloat() < 1 / (1 + Math.exp(-(-2 + 1.2 * value * value))));
      straight.push(random.nextFloat() < 1 / (1 + Math.exp(-(-1 + 1 * value))));
    }
    const u = fitResponseCurve(x, uShaped).curve!;
    expect(u.quadratic).not.toBeNull();
    expect(u.quadratic!.pValue).toBeLessThan(0.05);
    expect(u.quadratic!.aic).toBeLessThan(u.aic);
    expect(u.quadratic!.coefficients[2]).toBeGreaterThan(0);
    // The reading uses the quadratic: higher odds at both ends than in the middle.
    expect(readResponseCurve(u, 1.9).estimate).toBeGreaterThan(readResponseCurve(u, 0).estimate);
    expect(readResponseCurve(u, -1.9).estimate).toBeGreaterThan(readResponseCurve(u, 0).estimate);
    expect(readResponseCurve(u, 0).form).toBe("quadratic");
    const s = fitResponseCurve(x, straight).curve!;
    expect(s.quadratic).toBeNull();
    expect(s.quadraticReason).toMatch(/not clearly better/);
  });
});

describe("runCalibration: indices.<NAME>.curve on a planted dose-response region", () => {
  const calibration = runCalibration(syntheticWorkspace({ effect: 1.6, seed: 11 }));
  it("index A (planted slope 1.6) gets a positive slope with p < 0.001; noise index B a slope with p > 0.01", () => {
    const a = calibration.indices.find((index) => index.name === "A")!;
    const b = calibration.indices.find((index) => index.name === "B")!;
    expect(a.curve!.slope).toBeGreaterThan(0.5);
    expect(a.curve!.pValue).toBeLessThan(0.001);
    expect(b.curve!.pValue).toBeGreaterThan(0.01);
    // Within the high phase (≥ 0.5) a strong value gives higher odds than a weak one.
    expect(readResponseCurve(a.curve!, 2).estimate).toBeGreaterThan(readResponseCurve(a.curve!, 0.6).estimate);
  });
});
