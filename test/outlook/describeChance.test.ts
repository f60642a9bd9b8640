import { describe, expect, it } from "vitest";
import { comparedWithBase, comparisonSentence, describeChance, formatPercentRange, headline } from "../../src/outlook/describeChance.js";

describe("describeChance(probability)", () => {
  it("names the nearest simple odds", () => {
    expect(describeChance(0.35)).toBe("about 1 in 3");
    expect(describeChance(0.287)).toBe("about 3 in 10");
    expect(describeChance(0.1)).toBe("about 1 in 10");
    expect(describeChance(0.12)).toBe("about 1 in 10");
    expect(describeChance(0.5)).toBe("about 1 in 2");
    expect(describeChance(0.69)).toBe("about 2 in 3");
    expect(describeChance(0.02)).toBe("less than 1 in 20");
    expect(describeChance(0.99)).toBe("more than 19 in 20");
    expect(describeChance(null)).toBe("not known (not enough data)");
  });
});

describe("headline(fireYear, baseRate)", () => {
  it("gives the estimate, its interval and the average year", () => {
    expect(headline({ estimate: 0.346, lower: 0.194, upper: 0.537 }, { estimate: 0.103 })).toBe(
      "About 1 in 3 chance of a high-fire year (35%, 95% interval 19–54%); in an average year about 1 in 10 (10%).",
    );
    expect(formatPercentRange(0.191, 0.412)).toBe("19–41%");
  });
  it("calls a season higher or lower only when the two intervals do not overlap", () => {
    const base = { estimate: 0.103, lower: 0.073, upper: 0.143 };
    expect(comparedWithBase({ estimate: 0.35, lower: 0.19, upper: 0.54 }, base)).toBe("higher");
    expect(comparedWithBase({ estimate: 0.04, lower: 0.02, upper: 0.102 }, base)).toBe("not distinguishable");
    expect(comparedWithBase({ estimate: 0.01, lower: 0.0, upper: 0.06 }, base)).toBe("lower");
    expect(comparisonSentence({ estimate: 0.02, lower: 0.01, upper: 0.15 }, base)).toMatch(/may not differ from an average year/);
  });

  it("does not print 0% for a phase with no high-fire year", () => {
    expect(headline({ estimate: 0, lower: 0, upper: 0.117, years: 29, fireYears: 0 }, { estimate: 0.103 })).toBe(
      "None of the 29 past years like this season was a high-fire year (95% interval up to 12%); in an average year about 1 in 10 (10%).",
    );
  });
});
