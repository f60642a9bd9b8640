import { resolve } from "node:path";
import { describe, expect, it } from "vitest";
import { runInProcess } from "./helpers.js";

describe("firephase calibrate <region> (text)", () => {
  it("says high-fire year throughout and reports the modern record in its own units", async () => {
    const run = await runInProcess(["calibrate", resolve("test/fixtures/regions/review-small")]);
    expect(run.code).toBe(0);
    expect(run.stdout).toMatch(/^High-fire years: \d+ \(top 10%/m);
    expect(run.stdout).toMatch(/of years are high-fire years/);
    expect(run.stdout).toMatch(/phase\s+years\s+high-fire years\s+P\(high-fire year\)/);
    // The CLI's own lines (the warnings come from the other stages).
    expect(run.stdout.split("\nWarnings:")[0]).not.toMatch(/(?<!high-)fire years?\b(?! record)/i);
    // Fixture modern record: 12 years, the two largest areas 1,000 and 900 ha (1708, 1704).
    expect(run.stdout).toContain("Modern record 1700–1712 (12 years), high-fire years by area burned: 2 (at least 900 ha; 1704, 1708)");
    expect(run.stdout).toContain("A high-fire year in hectares: median 950 ha (900 ha to 1,000 ha, 2 years)");
    expect(run.stdout).toMatch(/ENSO in the modern record \(12 years\):/);
  });
});
