import { describe, expect, it } from "vitest";
import { calibrationPeriod } from "../../src/calibrate/calibrationPeriod.js";
import { compositeFireRecord } from "../../src/record/composite.js";
import { DEFAULT_FIRE_YEARS, DEFAULT_METHODS } from "../../src/workspace/defaults.js";
import type { IndexSeries, RegionSettings, Site } from "../../src/workspace/types.js";

// Invented record sizes far beyond any real region: the point is that nothing overflows the call
// stack (a spread such as Math.min(...array) of 130,000 items does).
describe("record and calibration period at scale", () => {
  it("compositeFireRecord(130,000 sites) counts every site without a stack overflow", () => {
    const sites: Site[] = Array.from({ length: 130_000 }, (_, i) => ({
      id: `s${i}`,
      name: null,
      latitude: 0,
      longitude: 0,
      firstYear: 1500 + (i % 300),
      lastYear: 1900 + (i % 100),
    }));
    const events = sites.map((site) => ({ site: site.id, year: site.firstYear }));
    const activity = compositeFireRecord({ kind: "sites", sites, events }, 3);
    expect(activity.years[0]?.year).toBe(1500);
    expect(activity.years[activity.years.length - 1]?.year).toBe(1999);
    const total = activity.years.reduce((sum, year) => sum + year.sitesBurned, 0);
    expect(total).toBe(130_000);
  });

  it("calibrationPeriod(…) with 12 indices × 19,999 years (239,988 values) finds the overlap with loops", () => {
    const years = Array.from({ length: 19_999 }, (_, i) => i - 9999);
    const indices: IndexSeries[] = Array.from({ length: 12 }, (_, k) => ({
      name: `I${k}`,
      years,
      values: years.map((year) => (year < -9000 + k ? null : 0)),
    }));
    const settings: RegionSettings = {
      name: "Invented",
      description: null,
      calibration: null,
      fireYears: DEFAULT_FIRE_YEARS,
      indices: [],
      outlook: { season: null, values: {}, issued: null },
      seed: 1,
      methods: DEFAULT_METHODS,
    };
    const usableYears = Array.from({ length: 19_999 }, (_, i) => i - 9999);
    const period = calibrationPeriod(settings, { years: [], usableYears, thinYears: [], minSitesRecording: 3 }, indices);
    expect(period.first).toBe(-9000);
    expect(period.last).toBe(9999);
    expect(period.years).toHaveLength(19_000);
  });
});
