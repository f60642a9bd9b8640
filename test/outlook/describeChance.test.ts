import { describe, expect, it } from "vitest";
import { describeChance, formatPercentRange, headline } from "../../src/outlook/describeChance.js";

describe("describeChance(probability)", () => {
  it("rounds to tenths in plain words", () => {
    expect(describeChance(0.287)).toBe("about 3 in 10");
    expect(describeChance(0.1)).toBe("about 1 in 10");
    expect(describeChance(0.5)).toBe("about an even (1 in 2)");
    expect(describeChance(0.02)).toBe("less than 1 in 20");
    expect(describeChance(0.99)).toBe("more than 19 in 20");
    expect(describeChance(null)).toBe("not known (not enough data)");
  });
  it("writes the headline against the base rate", () => {
    expect(headline(0.29, 0.103)).toBe("About 3 in 10 chance of a high-fire year; in an average year about 1 in 10.");
    expect(formatPercentRange(0.191, 0.412)).toBe("19–41%");
  });
});
