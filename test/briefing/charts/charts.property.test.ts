import fc from "fast-check";
import { describe, it } from "vitest";
import {
  activityTimeline,
  categoryOddsBar,
  oddsByPhaseChart,
  phaseSpaceScatter,
  reliabilityDiagram,
  rocCurveChart,
  seaChart,
  stabilityChart,
} from "../../../src/briefing/charts/index.js";
import { checkChartSvg } from "./svgAssertions.js";

// Any number a buggy upstream stage could hand over: ordinary values, NaN, ±Infinity and null.
const value = fc.oneof(
  fc.constant(null),
  fc.constant(Number.NaN),
  fc.constant(Number.POSITIVE_INFINITY),
  fc.double({ min: -1e6, max: 1e6, noNaN: true }),
  fc.double({ min: 0, max: 1, noNaN: true }),
);
const number = value.map((entry) => entry ?? Number.NaN);
const text = fc.string({ maxLength: 30 });
const interval = fc.record({ estimate: value, lower: value, upper: value });
const runs = { numRuns: 150 };

describe("every chart, for arbitrary inputs with nulls, NaN, infinities and hostile text", () => {
  it("oddsByPhaseChart returns well-formed SVG without NaN or undefined", () => {
    fc.assert(
      fc.property(text, fc.array(fc.record({ label: text, estimate: value, lower: value, upper: value, years: fc.nat(500), smallSample: fc.boolean() }), { maxLength: 8 }), interval, (indexName, phases, baseRate) => {
        checkChartSvg(oddsByPhaseChart({ indexName, phases, baseRate }));
      }),
      runs,
    );
  });

  it("seaChart returns well-formed SVG without NaN or undefined", () => {
    const limits = fc.oneof(fc.constant(null), fc.tuple(number, number));
    fc.assert(
      fc.property(text, fc.array(fc.record({ lag: fc.integer({ min: -10, max: 10 }), mean: value, ci95: limits, ci99: limits }), { maxLength: 12 }), (indexName, rows) => {
        checkChartSvg(seaChart({ indexName, lags: rows.map((row) => row.lag), mean: rows.map((row) => row.mean), ci95: rows.map((row) => row.ci95), ci99: rows.map((row) => row.ci99) }));
      }),
      runs,
    );
  });

  it("phaseSpaceScatter returns well-formed SVG without NaN or undefined", () => {
    fc.assert(
      fc.property(
        text,
        text,
        fc.array(fc.record({ x: value, y: value, fireYear: fc.boolean(), year: fc.integer({ min: 1000, max: 2100 }) }), { maxLength: 40 }),
        fc.oneof(fc.constant(null), fc.record({ x: value, y: value })),
        fc.array(number, { maxLength: 3 }),
        fc.array(number, { maxLength: 3 }),
        (xName, yName, points, current, xCuts, yCuts) => {
          checkChartSvg(phaseSpaceScatter({ xName, yName, points, current, xCuts, yCuts }));
        },
      ),
      runs,
    );
  });

  it("activityTimeline returns well-formed SVG without NaN or undefined", () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ year: fc.integer({ min: 1400, max: 2030 }), activity: value, sitesRecording: fc.nat(80), fireYear: fc.boolean() }), { maxLength: 60 }),
        value,
        text,
        fc.record({ first: fc.integer({ min: 1400, max: 2030 }), last: fc.integer({ min: 1400, max: 2030 }) }),
        (years, threshold, measureLabel, calibration) => {
          checkChartSvg(activityTimeline({ years, threshold, measureLabel, calibration }));
        },
      ),
      runs,
    );
  });

  it("reliabilityDiagram and rocCurveChart return well-formed SVG without NaN or undefined", () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ lower: number, upper: number, count: fc.nat(300), meanForecast: value, observedFrequency: value }), { maxLength: 10 }),
        value,
        fc.array(fc.record({ falseAlarmRate: number, hitRate: number }), { maxLength: 12 }),
        value,
        (bins, climatology, points, area) => {
          checkChartSvg(reliabilityDiagram({ bins, climatology }));
          checkChartSvg(rocCurveChart({ points, area }));
        },
      ),
      runs,
    );
  });

  it("stabilityChart and categoryOddsBar return well-formed SVG without NaN or undefined", () => {
    fc.assert(
      fc.property(
        fc.array(text, { maxLength: 6 }),
        fc.array(fc.record({ first: fc.integer({ min: 1400, max: 2000 }), last: fc.integer({ min: 1400, max: 2100 }), phases: fc.array(fc.record({ label: fc.constantFrom("a", "b", "c"), estimate: value, lower: value, upper: value }), { maxLength: 4 }) }), { maxLength: 15 }),
        value,
        interval,
        interval,
        interval,
        (labels, windows, baseRate, below, near, above) => {
          checkChartSvg(stabilityChart({ labels: [...labels, "a", "b"], windows, baseRate }));
          checkChartSvg(categoryOddsBar({ below, near, above, averageYear: { below: baseRate, near: below.estimate, above: null } }));
        },
      ),
      runs,
    );
  });
});
