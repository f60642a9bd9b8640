import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { activityByYear, valuesByYear } from "../../src/calibrate/activityByYear.js";
import { runHindcast, type HindcastInput } from "../../src/hindcast/runHindcast.js";
import { compositeFireRecord } from "../../src/record/composite.js";
import { syntheticWorkspace, type SyntheticOptions } from "../helpers/syntheticWorkspace.js";

function hindcastInput(options: SyntheticOptions): HindcastInput {
  const workspace = syntheticWorkspace(options);
  const record = compositeFireRecord(workspace.fireRecord, 3);
  return {
    years: record.usableYears,
    activity: activityByYear(record, "fraction"),
    indexValues: new Map(workspace.indices.map((series) => [series.name, valuesByYear(series)])),
    indexSettings: workspace.settings.indices,
    indices: ["A", "B"],
    top: 0.1,
    measure: "fraction",
    exclusion: 2,
    jointMinYears: 10,
    jointMaxQ: 0.05,
  };
}

describe("runHindcast(input)", () => {
  it("finds skill in an invented region with a planted index–fire link", () => {
    const skill = runHindcast(hindcastInput({ effect: 1.6, seed: 11 }));
    expect(skill.years).toBe(290);
    expect(skill.brierSkillScore).toBeGreaterThan(0);
    expect(skill.rocArea).toBeGreaterThan(0.65);
    expect(skill.hasSkill).toBe(true);
    expect(skill.verdict).toMatch(/^Some skill/);
  });

  it("applies the q gate of the joint phase in every held-out calibration", () => {
    const input = hindcastInput({ effect: 1.6, seed: 11 });
    // The noise index B never reaches q ≤ 1e-12, so no held-out forecast may come from a joint phase…
    expect(runHindcast({ ...input, jointMaxQ: 1e-12 }).forecasts.some((forecast) => forecast.basis === "joint")).toBe(false);
    // …while without the gate B joins A whenever the joint cell is large enough.
    expect(runHindcast({ ...input, jointMaxQ: 1 }).forecasts.every((forecast) => forecast.basis === "joint")).toBe(true);
  });

  it("says plainly that a pure-noise region has no skill", () => {
    for (const seed of [3, 5, 8]) {
      const skill = runHindcast(hindcastInput({ effect: 0, seed }));
      expect(skill.hasSkill).toBe(false);
      expect(skill.verdict).toMatch(/^No skill/);
    }
  });

  it("leaves every year out with two years either side: nothing about those years reaches the held-out forecast", () => {
    const base = hindcastInput({ effect: 1, seed: 21, first: 1801, last: 1900 });
    const before = runHindcast(base);
    const own = (skill: typeof before, year: number) => skill.forecasts.find((forecast) => forecast.year === year);
    fc.assert(
      fc.property(
        fc.integer({ min: 1801, max: 1900 }),
        fc.array(fc.tuple(fc.integer({ min: -2, max: 2 }), fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: -4, max: 4, noNaN: true })), {
          minLength: 1,
          maxLength: 5,
        }),
        (target, changes) => {
          // Change the fire activity of the target and its neighbours, and the index values of the
          // neighbours (the target's own index values are its predictors and stay as they are).
          const activity = new Map(base.activity);
          const indexValues = new Map([...base.indexValues].map(([name, values]) => [name, new Map(values)]));
          for (const [offset, newActivity, newIndex] of changes) {
            const year = target + offset;
            if (!activity.has(year)) continue;
            activity.set(year, newActivity);
            if (offset !== 0) for (const values of indexValues.values()) values.set(year, newIndex);
          }
          const after = runHindcast({ ...base, activity, indexValues });
          expect(own(after, target)?.probability).toBe(own(before, target)?.probability);
          expect(own(after, target)?.categoryProbabilities).toEqual(own(before, target)?.categoryProbabilities);
          expect(own(after, target)?.climatology).toBe(own(before, target)?.climatology);
        },
      ),
      { numRuns: 15, seed: 4 },
    );
  });

  it("reports null scores with a reason when there are too few years", () => {
    const skill = runHindcast(hindcastInput({ effect: 1, first: 1901, last: 1906 }));
    expect(skill.brierSkillScore).toBeNull();
    expect(skill.reason).toMatch(/hindcast years/);
    expect(skill.hasSkill).toBe(false);
  });
});
