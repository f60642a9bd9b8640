/**
 * The chance audit (scripts/chance-audit.mjs), small and fast: the same code run on src/ through vitest.
 * The full audit (200 replicates per design, `npm run audit:chance`) is in the README; here 40 shuffles of
 * the demo region's fire record, on a shortened calibration (1871–1990) with 1,000 SEA draws and the
 * smallest permutation and bootstrap counts (199; the curve rule's own test 99), so it takes well under a minute.
 */
import jStat from "jstat";
import { beforeAll, describe, expect, it } from "vitest";
import { runCalibration } from "../../src/calibrate/runCalibration.js";
import * as calibrationPeriodModule from "../../src/calibrate/calibrationPeriod.js";
import { resolveOutlookRequest } from "../../src/cli/outlookRequest.js";
import * as buildOutlookModule from "../../src/outlook/buildOutlook.js";
import * as compositeModule from "../../src/record/composite.js";
import * as blockPermutationModule from "../../src/stats/blockPermutation.js";
import * as createRandomModule from "../../src/stats/createRandom.js";
import * as wilsonIntervalModule from "../../src/stats/wilsonInterval.js";
import * as defaultsModule from "../../src/workspace/defaults.js";
import { loadWorkspace } from "../../src/workspace/loadWorkspace.js";
import type { Calibration } from "../../src/calibrate/types.js";
import type { OutlookRequest } from "../../src/outlook/buildOutlook.js";
import type { RandomSource } from "../../src/stats/createRandom.js";
import type { Workspace } from "../../src/workspace/types.js";

interface Verdict {
  readonly key: string;
  readonly label: string;
  readonly nominal: number | null;
}

interface AuditScript {
  binomialUpperTail(k: number, n: number, p: number): number;
  shuffledWorkspace(modules: object, workspace: Workspace, random: RandomSource, blockYears: number): Workspace;
  auditDesign(
    modules: object,
    options: {
      replicate: (random: RandomSource, r: number) => Workspace;
      request: OutlookRequest;
      indexNames: readonly string[];
      shuffles: number;
      seed: number;
      methods?: object;
    },
  ): { verdicts: readonly Verdict[]; counts: Record<string, number>; shuffles: number };
}

const modules = {
  ...compositeModule,
  ...calibrationPeriodModule,
  runCalibration,
  ...buildOutlookModule,
  ...createRandomModule,
  ...blockPermutationModule,
  ...wilsonIntervalModule,
  ...defaultsModule,
};

// A path held in a variable, so that the type checker does not look for declarations of the plain script.
const scriptPath = "../../scripts/chance-audit.mjs";
let script: AuditScript;
let demo: Workspace;
let request: OutlookRequest;

beforeAll(async () => {
  script = (await import(scriptPath)) as AuditScript;
  const loaded = await loadWorkspace("demo-region");
  demo = { ...loaded, settings: { ...loaded.settings, calibration: { first: 1871, last: 1990 } } };
  request = resolveOutlookRequest(demo, {}, new Date("2027-03-10T12:00:00Z"));
});

/** Calibration numbers that any shuffle could change: chi-square p, curve p and SEA p per index. */
function fingerprint(calibration: Calibration): string {
  return JSON.stringify(calibration.indices.map((index) => [index.contingency.pValue, index.curve?.pValue ?? null, index.sea.pValue]));
}

describe("binomialUpperTail(k, n, p) (the bound stated in the audit test's title)", () => {
  it("binomialUpperTail(3, 20, 0.05) → 0.0755 (cumulative binomial table, n = 20, p = 0.05: P(X ≤ 2) = 0.9245; from memory)", () => {
    expect(script.binomialUpperTail(3, 20, 0.05)).toBeCloseTo(0.0755, 4);
  });

  it("binomialUpperTail(k, n, p) = 1 − jStat.binomial.cdf(k − 1, n, p) for k = 0 … n (n = 40, p = 0.05 and 0.3)", () => {
    for (const p of [0.05, 0.3]) {
      for (let k = 0; k <= 40; k += 1) {
        const expected = k === 0 ? 1 : 1 - jStat.binomial.cdf(k - 1, 40, p);
        expect(Math.abs(script.binomialUpperTail(k, 40, p) - expected)).toBeLessThan(1e-9); // jStat sums log-gamma terms: about 1e-11 apart
      }
    }
  });

  it("binomialUpperTail(5, 40, 0.05) = 0.0480 < 0.05 ≤ binomialUpperTail(4, 40, 0.05); binomialUpperTail(7, 40, 0.05) = 0.0034", () => {
    expect(script.binomialUpperTail(5, 40, 0.05)).toBeCloseTo(0.048, 3);
    expect(script.binomialUpperTail(4, 40, 0.05)).toBeGreaterThanOrEqual(0.05);
    expect(script.binomialUpperTail(7, 40, 0.05)).toBeCloseTo(0.0034, 4);
  });
});

describe("shuffledWorkspace(modules, workspace, random, blockYears)", () => {
  it("a block as long as the record leaves the calibration unchanged (the shuffle itself distorts nothing)", () => {
    const same = script.shuffledWorkspace(modules, demo, createRandomModule.createRandom(1), 1_000_000);
    expect(fingerprint(runCalibration(same))).toBe(fingerprint(runCalibration(demo)));
  });

  it("a shuffle moves the same calibration-year activities to other years (same values, other order)", () => {
    const record = compositeModule.compositeFireRecord(demo.fireRecord, demo.settings.fireYears.minSitesRecording);
    const shuffled = script.shuffledWorkspace(modules, demo, createRandomModule.createRandom(5), 5);
    const before = record.years.map((row) => `${row.sitesRecording}/${row.sitesBurned}`);
    const after = shuffled.fireRecord.kind === "activity" ? shuffled.fireRecord.rows.map((row) => `${row.sitesRecording}/${row.sitesBurned}`) : [];
    expect([...after].sort()).toEqual([...before].sort());
    expect(after).not.toEqual(before);
  });
});

describe("chance audit on the demo region, fire record shuffled year by year (40 shuffles)", () => {
  // The verdicts that claim a link or skill at a stated 5% level (see the README's "Checked against chance").
  const bounded = [
    "hindcastSkill",
    "curveSkill",
    "joint",
    "headlineClear",
    "comparedWithBase",
    "clearLink:any",
    "curveQ:any",
    "headlineCurve",
    "twoEra:any",
    "seaQ:PMI",
    "seaQ:ENSO",
    "seaQ:WSI",
  ];
  let result: ReturnType<AuditScript["auditDesign"]>;

  beforeAll(() => {
    result = script.auditDesign(modules, {
      replicate: (random) => script.shuffledWorkspace(modules, demo, random, 1),
      request,
      indexNames: demo.settings.indices.map((index) => index.name),
      shuffles: 40,
      seed: 40,
      methods: { seaDraws: 1000 },
    });
  });

  it(`each of ${bounded.join(", ")} fires in at most 6 of 40 shuffles (P(X ≥ 7) = 0.34% at a 5% rate, so about 4% that one of the twelve does by chance)`, () => {
    expect(script.binomialUpperTail(7, 40, 0.05)).toBeLessThan(0.005);
    const over = bounded.filter((key) => (result.counts[key] ?? Number.NaN) > 6 || !Number.isInteger(result.counts[key]));
    expect(over.map((key) => `${key}: ${result.counts[key]} of 40`)).toEqual([]);
    // The counts are real counts of a real run: every verdict was evaluated on every shuffle.
    expect(result.shuffles).toBe(40);
    for (const verdict of result.verdicts) expect(result.counts[verdict.key]).toBeLessThanOrEqual(40);
  });

  it("strengthNote(…) is never written for a curve without a clear link (q > 0.05) on shuffled records: 0 of 40", () => {
    expect(result.counts["strengthNoteNoLink"]).toBe(0);
  });

  it("the audit sees an uncorrected family: some SEA lag (of 7, each at a raw 5%) is below p 0.05 for some index in more than 6 of 40 shuffles (about 1 − 0.95^21 ≈ 66% expected)", () => {
    expect(result.counts["seaRaw:any"]).toBeGreaterThan(6);
  });
});
