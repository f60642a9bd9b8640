import { describe, expect, it } from "vitest";
import { hindcastExtras, modernLine, pastOutlooksView, sinceLastView, summarizeWarnings, thenAndNowView } from "../../src/briefing/briefingSections.js";
import type { Skill } from "../../src/hindcast/types.js";
import type { Review, SinceLastBriefing } from "../../src/review/types.js";
import { sampleBriefingInputs } from "./sampleBriefingInputs.js";

const inputs = sampleBriefingInputs();

describe("summarizeWarnings(messages, codes, keep)", () => {
  const pair = (a: string, b: string, km: number) => `sites ${a} and ${b} are ${km.toFixed(1)} km apart, closer than 40 km: their fire years may not be independent evidence`;
  it("keeps five or fewer close-pair warnings as they are", () => {
    const notes = summarizeWarnings([pair("A", "B", 3), "a repeated event"], ["sites-close", "repeated-event"], 5).notes;
    expect(notes).toEqual([pair("A", "B", 3), "a repeated event"]);
  });
  it("summarizes 3,527 close pairs as a count and the five closest (ties by input order), other notes kept", () => {
    const messages: string[] = [];
    const codes: string[] = [];
    for (let i = 0; i < 3527; i += 1) {
      messages.push(pair(`S${i}`, `T${i}`, 39 - ((i * 7919) % 3900) / 100));
      codes.push("sites-close");
    }
    messages.push("season 1801 misses a month");
    codes.push("season-gap");
    const notes = summarizeWarnings(messages, codes, 5).notes;
    expect(notes).toHaveLength(1 + 5 + 1);
    expect(notes[0]).toContain("3,527 pairs of sites are closer than the independence distance");
    expect(notes[0]).toContain("firephase check --json");
    // Brute force: the five smallest distances.
    const distances = messages.slice(0, 3527).map((message) => Number(/([\d.]+) km/.exec(message)![1])).sort((a, b) => a - b).slice(0, 5);
    expect(notes.slice(1, 6).map((message) => Number(/([\d.]+) km/.exec(message)![1]))).toEqual(distances);
    expect(notes[6]).toBe("season 1801 misses a month");
  });
});

describe("hindcastExtras(skill, calibration)", () => {
  const skill = inputs.outlook.hindcast;
  it("says plainly when the chance test was not run, and names scores as scores", () => {
    const extras = hindcastExtras(skill, inputs.calibration);
    expect(extras.chanceText).toBe("Chance test: not enough data.");
    expect(extras.rules).toBeNull();
    expect(extras.intervals).toEqual([]);
  });
  it("writes the permutation p, the intervals and both rules side by side when they exist", () => {
    const curveRule: Skill = { ...skill, brierSkillScore: 0.14, rocArea: 0.77, skillPValue: 0.01, permutations: 99, rpss: null, rpssReason: "the curve rule forecasts only high-fire years" };
    const full: Skill = {
      ...skill,
      brierSkillScore: 0.05,
      rocArea: 0.6,
      skillPValue: 0.001,
      permutations: 999,
      permutationBlockYears: 5,
      intervals: { brierSkillScore: [-0.01, 0.11], rpss: [0.04, 0.19], rocArea: [0.51, 0.7], method: "moving-block bootstrap", resamples: 999, blockYears: 5, level: 0.95 },
      curveRule,
    };
    const extras = hindcastExtras(full, inputs.calibration);
    expect(extras.chanceText).toContain("in 999 shuffles of the fire record across years (in blocks of 5 years)");
    expect(extras.chanceText).toContain("permutation p = 0.001 (the share of shuffles at least as good");
    expect(hindcastExtras({ ...full, skillPValue: 0.0002 }, inputs.calibration).chanceText).toContain("permutation p < 0.001");
    expect(extras.intervals[0]).toEqual({ score: "Brier skill score", value: "+0.05", interval: "\u22120.01 to +0.11" });
    expect(extras.intervals[2]?.interval).toBe("0.51 to 0.70");
    expect(extras.intervalsNote).toContain("blocks of 5 years, 999 resamples");
    expect(extras.rules?.rows[0]).toEqual({ score: "Brier skill score", phase: "+0.05", curve: "+0.14" });
    expect(extras.rules?.rows[1]?.curve).toBe("does not apply (the curve rule forecasts only high-fire years)");
    // The p with the shuffles behind it: 0.01 is the smallest p 99 shuffles can give.
    expect(extras.rules?.rows[3]).toEqual({ score: "Permutation p (shuffles)", phase: "0.001 (999)", curve: "0.01 (99)" });
    expect(extras.rules?.sentence).toContain("the curve rule did better by its Brier skill score (+0.14 against +0.05)");
  });
  it("explains in one sentence when the hindcast scores a different number of high-fire years than the calibration", () => {
    const fireYears = inputs.calibration.fireYears.years;
    const forecast = (year: number, fireYear: boolean) => ({ year, probability: 0.1, climatology: 0.1, fireYear, categoryProbabilities: [0.3, 0.3, 0.4] as const, climatologyCategories: [0.3, 0.3, 0.4] as const, observedCategory: 2 as const, basis: "single" as const });
    const fewer: Skill = { ...skill, years: 200, forecasts: [...fireYears.slice(1).map((year) => forecast(year, true)), forecast(1, false)] };
    expect(hindcastExtras(fewer, inputs.calibration).countNote).toBe(
      `The hindcast scores ${fireYears.length - 1} high-fire years against the calibration’s ${fireYears.length}: it forecasts only the 200 years that have the index values and enough past years left in around them.`,
    );
    const same: Skill = { ...skill, forecasts: fireYears.map((year) => forecast(year, true)) };
    expect(hindcastExtras(same, inputs.calibration).countNote).toContain(`the same ${fireYears.length} high-fire years as the calibration`);
  });
});

describe("thenAndNowView and modernLine without a modern record", () => {
  it("say why there is no modern check", () => {
    const calibration = { ...inputs.calibration, modern: null, modernReason: "the region has no modern fire record" };
    expect(thenAndNowView(calibration).missingText).toBe("not enough data (the region has no modern fire record)");
    expect(modernLine(calibration, inputs.outlook)).toBe("Modern record check: not enough data (the region has no modern fire record).");
  });
});

describe("pastOutlooksView(review) and sinceLastView(since)", () => {
  it("with nothing kept, both say so plainly", () => {
    expect(pastOutlooksView(null).available).toBe(false);
    expect(pastOutlooksView(undefined).missingText).toContain("No outlook of this region has been kept yet");
    expect(sinceLastView(null).available).toBe(false);
  });
  it("lists kept outlooks with their outcomes and scores, and the small-sample warning", () => {
    const review: Review = {
      schema: "firephase.review/1",
      region: "Invented",
      outlooks: [
        { season: 2025, issued: "2025-03-10", file: "r/issued/2025-2025-03-10.json", probability: 0.3, outcome: true, source: "modern record", detail: "", categories: null, category: null, squaredError: 0.49, saidHigher: true, scored: true },
        { season: 2026, issued: "2026-03-12", file: "r/issued/2026-2026-03-12.json", probability: 0.05, outcome: null, source: null, detail: "", categories: null, category: null, squaredError: null, saidHigher: false, scored: true },
      ],
      known: 1,
      unknown: 1,
      brierScore: 0.49,
      reference: { rate: 0.1, source: "modern base rate" },
      brierScoreReference: 0.81,
      brierSkillScore: 0.395,
      rps: { value: null, seasons: 0, reason: "no kept categories" },
      rpsEqualOdds: null,
      rpss: { value: null, seasons: 0 },
      hitRate: { value: 1, seasons: 1, hits: 1, highFireYears: 1 },
      falseAlarmRatio: { value: 0, seasons: 1, falseAlarms: 0, saidHigher: 1 },
      meanProbability: 0.3,
      observedFrequency: 1,
      warnings: [{ code: "few-seasons", message: "only 1 season is known so far: with fewer than 10, these scores cannot tell skill from luck" }],
    };
    const view = pastOutlooksView(review);
    expect(view.rows.map((row) => [row.season, row.chance, row.outcome])).toEqual([["2025", "30%", "high-fire year"], ["2026", "5%", "not known yet"]]);
    expect(view.scores.find((score) => score.label.startsWith("Brier skill score"))?.value).toBe("+0.40");
    expect(view.scores[0]?.value).toBe("1 of 2");
    expect(view.warnings[0]).toMatch(/^Only 1 season is known so far/);
  });
  it("tabulates what changed since the last kept outlook", () => {
    const since: SinceLastBriefing = {
      previous: { season: 2026, issued: "2026-03-12", file: "r/issued/2026-2026-03-12.json" },
      relation: "previous season",
      values: [{ index: "PMI", before: 1.14, now: -1.65 }],
      phases: [{ index: "PMI", before: "wet", now: "dry" }],
      fireYear: { before: 0.03, now: 0.22 },
      categories: null,
      sentence: "Since the outlook of 2026-03-12 for the 2026 season: PMI moved from wet to dry; the chance of a high-fire year rose from 3% to 22%.",
    };
    const view = sinceLastView(since);
    expect(view.text).toBe(`${since.sentence} (Compared with last season's outlook.)`);
    expect(view.rows).toEqual([
      { what: "Chance of a high-fire year", before: "3%", now: "22%" },
      { what: "PMI phase", before: "wet", now: "dry" },
      { what: "PMI value", before: "1.14", now: "\u22121.65" },
    ]);
  });
});
