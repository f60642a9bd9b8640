import { resolve, join } from "node:path";
import * as ss from "simple-statistics";
import { beforeAll, describe, expect, it } from "vitest";
import { runCalibration } from "../../src/calibrate/runCalibration.js";
import type { Calibration } from "../../src/calibrate/types.js";
import { readKeptOutlooks, reviewRegion } from "../../src/cli/keptOutlooks.js";
import { readKeptOutlook } from "../../src/review/readKeptOutlook.js";
import { FEW_KNOWN_SEASONS, reviewOutlooks } from "../../src/review/reviewOutlooks.js";
import { outcomeRecords, seasonOutcome } from "../../src/review/seasonOutcomes.js";
import type { KeptOutlook, Review, SeasonOutcome } from "../../src/review/types.js";
import { loadWorkspace } from "../../src/workspace/loadWorkspace.js";
import type { Workspace } from "../../src/workspace/types.js";

// test/fixtures/regions/review-small: the "valid" fixture's fire-scar record (usable years 1702–1710,
// three or more recording sites), a modern record 1700–1712 without 1703 (area burned, ha):
//   1700 100, 1701 200, 1702 150, 1704 900, 1705 120, 1706 80, 1707 300, 1708 1000, 1709 50,
//   1710 400, 1711 700, 1712 60
// and hand-written kept outlooks in issued/. Modern high-fire years: top 10% of the 12 modern
// years → the ceil(0.1 × 12) = 2nd highest area, 900 ha, so 1704 and 1708; modern base rate 2/12.
const REGION = resolve("test/fixtures/regions/review-small");
let workspace: Workspace;
let calibration: Calibration;
let review: Review;

beforeAll(async () => {
  workspace = await loadWorkspace(REGION);
  calibration = runCalibration(workspace);
  review = reviewRegion(workspace, calibration, await readKeptOutlooks(workspace));
});

describe("seasonOutcome(season, outcomeRecords(workspace, calibration))", () => {
  it("takes the modern record's threshold of 900 ha: 1704 (900 ha) is a high-fire year, 1711 (700 ha) is not", () => {
    expect(calibration.modern?.threshold).toBe(900);
    expect(calibration.modern?.fireYears).toEqual([1704, 1708]);
    const records = outcomeRecords(workspace, calibration);
    expect(seasonOutcome(1704, records)).toMatchObject({ highFire: true, source: "modern record", category: "above" });
    expect(seasonOutcome(1704, records).detail).toBe("area burned 900 ha ≥ modern threshold 900 ha");
    expect(seasonOutcome(1711, records)).toMatchObject({ highFire: false, source: "modern record", category: "above" });
    // Modern terciles, type 7 over the 12 sorted areas: lower 100 + (2/3)·20 = 113.3, upper 300 + (1/3)·100 = 333.3.
    expect(seasonOutcome(1705, records).category).toBe("near");
    expect(seasonOutcome(1706, records).category).toBe("below");
  });

  it("falls back on the fire-scar record for 1703 (no modern row; no site burned that year)", () => {
    const outcome = seasonOutcome(1703, outcomeRecords(workspace, calibration));
    expect(outcome).toMatchObject({ highFire: false, source: "fire-scar record" });
  });

  it("keeps a season beyond both records unknown (1713), and one before the usable fire-scar years without a modern row too", () => {
    const records = outcomeRecords(workspace, calibration);
    expect(seasonOutcome(1713, records)).toMatchObject({ highFire: null, category: null, source: null });
    expect(seasonOutcome(1699, records).highFire).toBeNull();
  });
});

describe("reviewRegion(workspace, calibration, readKeptOutlooks(workspace)) on the hand-made folder", () => {
  it("lists every readable kept outlook with its outcome, the last of each season scored", () => {
    expect(review.schema).toBe("firephase.review/1");
    expect(review.outlooks.map((entry) => [entry.season, entry.issued, entry.probability, entry.outcome, entry.source, entry.scored])).toEqual([
      [1703, "1703-02-15", 0.2, false, "fire-scar record", true],
      [1704, "1704-03-01", 0.3, true, "modern record", true],
      [1706, "1706-02-01", 0.05, false, "modern record", true],
      [1711, "1711-02-01", 0.5, false, "modern record", false],
      [1711, "1711-03-01", 0.4, false, "modern record", true],
      [1713, "1713-03-01", 0.25, null, null, true],
    ]);
    expect(review.known).toBe(4);
    expect(review.unknown).toBe(1);
  });

  it("Brier score by hand: ((0.2−0)² + (0.3−1)² + (0.05−0)² + (0.4−0)²) / 4 = 0.173125; skill against 2/12", () => {
    const bs = (0.2 ** 2 + 0.7 ** 2 + 0.05 ** 2 + 0.4 ** 2) / 4;
    expect(bs).toBeCloseTo(0.173125, 15);
    expect(review.brierScore).toBeCloseTo(bs, 12);
    const rate = 2 / 12;
    expect(review.reference).toEqual({ rate: calibration.modern?.baseRate.estimate, source: "modern base rate" });
    expect(review.reference.rate).toBeCloseTo(rate, 12);
    const reference = (rate ** 2 + (1 - rate) ** 2 + rate ** 2 + rate ** 2) / 4; // = 7/36
    expect(review.brierScoreReference).toBeCloseTo(7 / 36, 12);
    expect(review.brierSkillScore).toBeCloseTo(1 - bs / reference, 12);
    expect(review.brierSkillScore).toBeCloseTo(0.10964, 5);
  });

  it("ranked probability score by hand over the two known seasons that kept their categories (both above normal)", () => {
    // 1704 [0.2, 0.3, 0.5]: (0.2 − 0)² + (0.5 − 0)² = 0.29; 1711 [0.3, 0.3, 0.4]: 0.3² + 0.6² = 0.45.
    expect(review.rps.value).toBeCloseTo((0.29 + 0.45) / 2, 12);
    expect(review.rps.seasons).toBe(2);
    // Equal odds, upper category observed: (1/3)² + (2/3)² = 5/9 (Murphy 1971 example form).
    expect(review.rpsEqualOdds).toBeCloseTo(5 / 9, 12);
    expect(review.rpss.value).toBeCloseTo(1 - 0.37 / (5 / 9), 12);
  });

  it("hit rate 1 of 1 high-fire years above the average year's odds; false alarms 2 of 3 (1703 against the reference 2/12, 1711)", () => {
    expect(review.hitRate).toMatchObject({ value: 1, hits: 1, highFireYears: 1 });
    expect(review.falseAlarmRatio).toMatchObject({ falseAlarms: 2, saidHigher: 3 });
    expect(review.falseAlarmRatio.value).toBeCloseTo(2 / 3, 12);
    expect(review.meanProbability).toBeCloseTo((0.2 + 0.3 + 0.05 + 0.4) / 4, 12);
    expect(review.observedFrequency).toBe(0.25);
  });

  it("warns per unreadable file with file:line, about few known seasons and the superseded outlook", () => {
    const messages = review.warnings.map((warning) => `${warning.code}: ${warning.message}`);
    expect(messages).toContainEqual(expect.stringMatching(/^kept-file-skipped: .*issued\/broken\.json:3: not valid JSON/));
    expect(messages).toContainEqual(
      expect.stringMatching(/^kept-file-skipped: .*issued\/old-record\.json:\d+: "fireYear\.estimate" must be a probability from 0 to 1 \(found nothing\)$/),
    );
    expect(messages).toContainEqual(`few-known-seasons: only 4 seasons are known so far: with fewer than ${FEW_KNOWN_SEASONS}, these scores cannot tell skill from luck`);
    expect(review.warnings.map((warning) => warning.code)).toContain("superseded-outlooks");
  });
});

const kept = (season: number, issued: string, probability: number, extra: Partial<KeptOutlook> = {}): KeptOutlook => ({
  file: `issued/${season}-${issued}.json`,
  schema: "firephase.outlook/1",
  issued,
  season,
  probability,
  lower: null,
  upper: null,
  baseRate: null,
  categories: null,
  phases: [],
  values: [],
  ...extra,
});
const outcome = (season: number, highFire: boolean | null): SeasonOutcome => ({
  season,
  highFire,
  category: null,
  source: highFire === null ? null : "modern record",
  detail: "",
});

describe("reviewOutlooks(kept, outcomes, options)", () => {
  it("gives null scores with reasons when no season is known", () => {
    const result = reviewOutlooks([kept(2030, "2030-03-01", 0.4)], new Map([[2030, outcome(2030, null)]]), {
      region: "R",
      reference: { rate: 0.1, source: "modern base rate" },
    });
    expect(result.known).toBe(0);
    expect(result.brierScore).toBeNull();
    expect(result.brierReason).toBe("no kept outlook's season is known yet");
    expect(result.brierSkillScore).toBeNull();
    expect(result.rps.value).toBeNull();
    expect(result.warnings.map((warning) => warning.code)).toEqual(["no-known-season"]);
  });

  it("ten seasons: the Brier score is the mean squared error (simple-statistics), and the few-seasons warning is gone", () => {
    const probabilities = [0.1, 0.3, 0.2, 0.6, 0.05, 0.15, 0.4, 0.25, 0.1, 0.7];
    const happened = [false, true, false, true, false, false, false, true, false, true];
    const list = probabilities.map((p, i) => kept(2000 + i, `${2000 + i}-03-01`, p));
    const outcomes = new Map(happened.map((h, i) => [2000 + i, outcome(2000 + i, h)]));
    const result = reviewOutlooks(list, outcomes, { region: "R", reference: { rate: 0.4, source: "modern base rate" } });
    let sum = 0;
    for (let i = 0; i < 10; i += 1) sum += ((probabilities[i] as number) - (happened[i] ? 1 : 0)) ** 2;
    expect(result.brierScore).toBeCloseTo(sum / 10, 12);
    expect(result.brierScore).toBeCloseTo(ss.mean(probabilities.map((p, i) => (p - (happened[i] ? 1 : 0)) ** 2)), 12);
    expect(result.brierScoreReference).toBeCloseTo((4 * 0.6 ** 2 + 6 * 0.4 ** 2) / 10, 12);
    expect(result.warnings).toEqual([]);
    // Said higher than 0.4: 0.6 (hit) and 0.7 (hit); high-fire years 2001, 2003, 2007, 2009 → 2 of 4.
    expect(result.hitRate).toMatchObject({ hits: 2, highFireYears: 4, value: 0.5 });
    expect(result.falseAlarmRatio).toMatchObject({ falseAlarms: 0, saidHigher: 2, value: 0 });
  });

  it("says the skill is undefined when the reference forecast is perfect", () => {
    const result = reviewOutlooks([kept(2001, "2001-03-01", 0.2)], new Map([[2001, outcome(2001, false)]]), {
      region: "R",
      reference: { rate: 0, source: "modern base rate" },
    });
    expect(result.brierScore).toBeCloseTo(0.04, 12);
    expect(result.brierSkillScore).toBeNull();
    expect(result.brierSkillReason).toMatch(/scored 0/);
  });
});

describe("readKeptOutlook(text, file)", () => {
  it("reads the minimal hand-written record and leaves the optional fields null", () => {
    const read = readKeptOutlook('{"schema":"firephase.outlook/1","issued":"2026-03-01","season":2026,"fireYear":{"estimate":0.2}}', "a.json");
    expect(read).toEqual({
      file: "a.json",
      schema: "firephase.outlook/1",
      issued: "2026-03-01",
      season: 2026,
      probability: 0.2,
      lower: null,
      upper: null,
      baseRate: null,
      categories: null,
      phases: [],
      values: [],
    });
  });

  it("names the line of each bad required field", () => {
    const text = '{\n  "schema": "firephase.outlook/1",\n  "issued": "2026-02-30",\n  "season": "2026",\n  "fireYear": { "estimate": 1.5 }\n}\n';
    expect(() => readKeptOutlook(text, join("r", "issued", "x.json"))).toThrow(/r\/issued\/x\.json:3: "issued" must be a date YYYY-MM-DD \(found "2026-02-30"\) \(and 2 more\)/);
  });

  it("rescales category odds that sum to 1 within 0.01 and ignores ones that do not", () => {
    const base = '"schema":"firephase.outlook/1","issued":"2026-03-01","season":2026,"fireYear":{"estimate":0.2}';
    const near = readKeptOutlook(`{${base},"categories":{"below":{"estimate":0.33},"near":{"estimate":0.33},"above":{"estimate":0.33}}}`, "a.json");
    expect(near.categories?.below).toBeCloseTo(1 / 3, 12);
    const off = readKeptOutlook(`{${base},"categories":{"below":{"estimate":0.5},"near":{"estimate":0.5},"above":{"estimate":0.5}}}`, "a.json");
    expect(off.categories).toBeNull();
  });

  it("reads index names that are built-in property names as plain names", () => {
    const text = '{"schema":"firephase.outlook/1","issued":"2026-03-01","season":2026,"fireYear":{"estimate":0.2},"phases":{"constructor":"warm","__proto__":"cold"},"current":[{"index":"toString","value":1}]}';
    const read = readKeptOutlook(text, "a.json");
    expect(read.phases).toEqual([
      { index: "constructor", label: "warm" },
      { index: "__proto__", label: "cold" },
    ]);
    expect(read.values).toEqual([{ index: "toString", value: 1 }]);
  });
});
