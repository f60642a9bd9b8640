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
  it("says when the interval includes the average-year chance", () => {
    expect(comparedWithBase({ estimate: 0.35, lower: 0.19, upper: 0.54 }, { estimate: 0.1 })).toBe("higher");
    expect(comparedWithBase({ estimate: 0.02, lower: 0.01, upper: 0.15 }, { estimate: 0.1 })).toBe("not distinguishable");
    expect(comparedWithBase({ estimate: 0.01, lower: 0.0, upper: 0.06 }, { estimate: 0.1 })).toBe("lower");
    expect(comparisonSentence({ estimate: 0.02, lower: 0.01, upper: 0.15 }, { estimate: 0.1 })).toMatch(/may not differ from an average year/);
  });
});
