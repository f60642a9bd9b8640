/**
 * A hand-made, fully typed Workspace + Calibration + Outlook for briefing tests, independent of
 * the calibration and outlook stages. The numbers are plausible but invented (not computed from
 * the invented record they sit beside); only their shape and formatting matter to these tests.
 */
import type { Calibration, IndexCalibration, ProbabilityEstimate } from "../../src/calibrate/types.js";
import type { Skill } from "../../src/hindcast/types.js";
import type { Outlook } from "../../src/outlook/types.js";
import type { ActivityCategory } from "../../src/record/types.js";
import { DEFAULT_FIRE_YEARS, DEFAULT_METHODS } from "../../src/workspace/defaults.js";
import type { Workspace } from "../../src/workspace/types.js";

export interface SampleOptions {
  readonly regionName?: string;
  readonly description?: string | null;
  /** Hindcast without skill (the first page must say so). */
  readonly noSkill?: boolean;
  /** Every optional statistic null with a reason (the page must say "not enough data"). */
  readonly degenerate?: boolean;
  /** Phase labels of ENSO (default cold / neutral / warm), e.g. text that looks like markup. */
  readonly ensoLabels?: readonly [string, string, string];
  /** No current index values: the outlook is the average year and its verdict says no skill score applies. */
  readonly noCurrentValues?: boolean;
  /** The outlook's plain-language warnings. */
  readonly outlookWarnings?: readonly { readonly code: string; readonly message: string }[];
  /** A tie rule that ends with a full stop, as the calibration writes it. */
  readonly tieRule?: string;
  /** Both current values provisional (part of their Dec–Feb window), with the outlook's two provisional warnings. */
  readonly provisional?: boolean;
}

export interface SampleBriefingInputs {
  readonly workspace: Workspace;
  readonly calibration: Calibration;
  readonly outlook: Outlook;
}

export const SAMPLE_SAFETY_MARKDOWN = [
  "# Safety",
  "",
  "firephase gives **statistical** odds from past records. It is *not* a fire-danger forecast.",
  "",
  "- Always follow official agency outlooks and fire-danger forecasts.",
  "- Small samples give wide intervals: read them with care.",
  "  A continuation line of the second item.",
  "",
  "Inline HTML stays text: <b>not bold</b> & `code`.",
].join("\n");

/** A small deterministic generator (Park–Miller minimal standard), test data only. */
function generator(seed: number): () => number {
  let state = seed % 2147483647;
  return () => {
    state = (state * 48271) % 2147483647;
    return state / 2147483647;
  };
}

function estimate(k: number, n: number, degenerate: boolean): ProbabilityEstimate {
  if (n === 0 || degenerate) return { estimate: null, lower: null, upper: null, reason: "no years in this phase" };
  const p = k / n;
  const z = 1.959963984540054;
  const centre = (p + (z * z) / (2 * n)) / (1 + (z * z) / n);
  const half = (z * Math.sqrt((p * (1 - p)) / n + (z * z) / (4 * n * n))) / (1 + (z * z) / n);
  return { estimate: p, lower: Math.max(0, centre - half), upper: Math.min(1, centre + half) };
}

export function sampleBriefingInputs(options: SampleOptions = {}): SampleBriefingInputs {
  const regionName = options.regionName ?? "Larkspur Hollow District (invented)";
  const degenerate = options.degenerate ?? false;
  const random = generator(20270310);
  const first = 1700;
  const last = 1990;
  const years: number[] = [];
  const rows: { year: number; sitesRecording: number; sitesBurned: number }[] = [];
  const enso: number[] = [];
  const nao: number[] = [];
  const indexYears: number[] = [];
  for (let year = 1600; year <= 1995; year++) {
    const sitesRecording = Math.min(30, 2 + Math.floor((year - 1600) / 12));
    const ensoValue = Math.round((random() * 3 - 1.5) * 100) / 100;
    const burnedShare = Math.min(1, Math.max(0, random() * 0.25 + (ensoValue > 0.5 ? 0.15 : 0)));
    rows.push({ year, sitesRecording, sitesBurned: Math.round(burnedShare * sitesRecording) });
    if (year >= first) {
      indexYears.push(year);
      enso.push(ensoValue);
      nao.push(Math.round((random() * 2.4 - 1.2) * 100) / 100);
    }
    if (year >= first && year <= last) years.push(year);
  }
  const activity = new Map(rows.filter((row) => row.year >= first && row.year <= last).map((row) => [row.year, row.sitesBurned / row.sitesRecording]));
  const sorted = [...activity.entries()].sort((a, b) => b[1] - a[1]);
  const fireYears = sorted.slice(0, 30).map(([year]) => year).sort((a, b) => a - b);
  const byYear = new Map<number, ActivityCategory>();
  sorted.forEach(([year], rank) => byYear.set(year, rank < 97 ? "above" : rank < 194 ? "near" : "below"));
  const baseRate = estimate(fireYears.length, years.length, false);

  const indexCalibration = (name: string, labels: readonly string[], counts: readonly [number, number][], q: number | null): IndexCalibration => {
    const lags = [-6, -5, -4, -3, -2, -1, 0, 1, 2, 3, 4];
    return {
      name,
      definition: { index: name, labels, cuts: [-0.5, 0.5], rule: name === "ENSO" ? "cuts" : "terciles" },
      years: years.length,
      phases: counts.map(([n, k], i) => {
        const probability = estimate(k, n, degenerate && i === 0);
        return {
          label: labels[i] ?? `phase ${i}`,
          years: n,
          fireYears: k,
          probability,
          ratioToBase: probability.estimate === null || baseRate.estimate === null ? null : probability.estimate / baseRate.estimate,
          categories: { below: Math.round(n / 3), near: Math.round(n / 3), above: n - 2 * Math.round(n / 3) },
          smallSample: n < 20,
        };
      }),
      contingency: degenerate
        ? { chiSquare: null, df: 2, pValue: null, qValue: null, smallExpectedShare: 0.5, perPhase: [], reason: "a phase has no years" }
        : {
            chiSquare: 11.84,
            df: 2,
            pValue: 0.0027,
            qValue: q,
            smallExpectedShare: 0,
            perPhase: labels.map((label, i) => ({
              label,
              fisherPValue: [0.21, 0.048, 0.0009][i] ?? null,
              residual: [-1.3, -1.9, 3.4][i] ?? null,
              oddsRatio: { estimate: [0.6, 0.5, 3.1][i] ?? null, lower: [0.25, 0.2, 1.5][i] ?? null, upper: [1.4, 1.1, 6.6][i] ?? null, haldaneCorrected: false },
            })),
          },
      sea: {
        lags,
        mean: lags.map((lag) => (degenerate ? null : lag === 0 ? 0.62 : Math.round(Math.sin(lag) * 20) / 100)),
        ci95: lags.map(() => (degenerate ? null : ([-0.31, 0.32] as [number, number]))),
        ci99: lags.map(() => (degenerate ? null : ([-0.42, 0.44] as [number, number]))),
        pValue: lags.map((lag) => (degenerate ? null : lag === 0 ? 0.0012 : 0.4)),
        qValue: lags.map((lag) => (degenerate ? null : lag === 0 ? 0.013 : 0.6)),
        eventYears: fireYears,
        poolYears: 281,
        draws: 10000,
        seed: 42,
        baseline: "mean of all pool years",
        sampling: "without replacement",
        percentileRule: "Hyndman & Fan type 7 percentiles of the random composites",
        ...(degenerate ? { reason: "no fire year has its whole window covered" } : {}),
      },
      aggregated: {
        blockYears: 5,
        blocks: 58,
        lags: [-2, -1, 0, 1, 2],
        r: degenerate ? [null, null, null, null, null] : [0.05, 0.12, 0.41, 0.1, -0.03],
        pValue: degenerate ? [null, null, null, null, null] : [0.71, 0.38, 0.003, 0.46, 0.83],
        effectiveN: degenerate ? [null, null, null, null, null] : [52.1, 52.3, 53.0, 52.2, 51.9],
        ...(degenerate ? { reason: "fewer than three blocks" } : {}),
      },
      stability: {
        window: 100,
        step: 10,
        windows: Array.from({ length: 20 }, (_, w) => ({
          first: first + 10 * w,
          last: first + 10 * w + 99,
          years: 100,
          phases: labels.map((label, i) => ({ label, years: 33, fireYears: 2 + i * 3, probability: estimate(2 + i * 3 + (w % 3), 33, false) })),
        })),
      },
      mean: 0,
      sd: 0.86,
    };
  };

  const indices = [
    indexCalibration("ENSO", options.ensoLabels ?? ["cold", "neutral", "warm"], [[88, 5], [120, 8], [83, 17]], 0.0054),
    indexCalibration("NAO", ["negative", "neutral", "positive"], [[97, 8], [97, 9], [97, 13]], 0.31),
  ];
  const calibration: Calibration = {
    region: { name: regionName },
    period: { first, last, years: years.length },
    years,
    activity,
    fireYears: { top: 0.1, measure: "fraction", threshold: sorted[29]?.[1] ?? null, years: fireYears, realisedShare: fireYears.length / years.length, calibrationYears: years.length },
    categories: {
      lowerCut: 0.08,
      upperCut: 0.16,
      quantileRule: "Hyndman & Fan type 7",
      tieRule: options.tieRule ?? "ties at a cut go to the lower category",
      byYear,
      realisedShares: { below: 97 / 291, near: 97 / 291, above: 97 / 291 },
    },
    baseRate,
    indices,
    interval: "wilson",
    seed: 42,
    warnings: [{ code: "small-phase-sample", message: "ENSO cold: only 18 calibration year(s) — its odds are very uncertain" }],
  };

  const skill: Skill = degenerate
    ? {
        years: 0, exclusion: 2, brierScore: null, brierScoreClimatology: null, brierSkillScore: null, rps: null, rpsClimatology: null, rpss: null,
        rpsForm: "sum over 3 categories, not divided by K−1", rocArea: null, rocStandardError: null, rocCurve: [], reliability: [],
        hasSkill: false, verdict: "No skill shown: the hindcast has too little data.", rule: "BSS > 0 and ROC lower limit > 0.5", forecasts: [],
        reason: "fewer than 10 hindcast years",
      }
    : {
        years: 291,
        exclusion: 2,
        brierScore: options.noSkill ? 0.0951 : 0.0842,
        brierScoreClimatology: 0.0928,
        brierSkillScore: options.noSkill ? -0.025 : 0.093,
        rps: 0.401,
        rpsClimatology: 0.444,
        rpss: options.noSkill ? -0.01 : 0.097,
        rpsForm: "sum over 3 categories, not divided by K−1",
        rocArea: options.noSkill ? 0.52 : 0.68,
        rocStandardError: 0.052,
        rocCurve: [
          { falseAlarmRate: 0, hitRate: 0 },
          { falseAlarmRate: 0.12, hitRate: 0.3 },
          { falseAlarmRate: 0.35, hitRate: 0.63 },
          { falseAlarmRate: 1, hitRate: 1 },
        ],
        reliability: [
          { lower: 0, upper: 0.1, count: 150, meanForecast: 0.07, observedFrequency: 0.06 },
          { lower: 0.1, upper: 0.2, count: 110, meanForecast: 0.14, observedFrequency: 0.12 },
          { lower: 0.2, upper: 0.3, count: 31, meanForecast: 0.21, observedFrequency: 0.23 },
        ],
        hasSkill: !options.noSkill,
        verdict: options.noSkill
          ? "No skill: in the hindcast this method did not forecast high-fire years better than the long-term average. Treat these odds as no better than the average year."
          : "Some skill: in the hindcast this method forecast high-fire years better than the long-term average, but a good hindcast is no guarantee for any single season.",
        rule: "BSS > 0 and ROC area − 1.96 SE > 0.5",
        forecasts: [],
      };

  const fireYearEstimate = degenerate ? { estimate: null, lower: null, upper: null, reason: "no past year shares this phase" } : estimate(17, 83, false);
  const outlook: Outlook = {
    issued: "2027-03-10",
    season: 2027,
    region: regionName,
    baseRate,
    current: options.noCurrentValues
      ? []
      : [
          {
            index: "ENSO",
            value: 1.2,
            label: options.ensoLabels?.[2] ?? "warm",
            nearBoundary: false,
            z: 1.4,
            source: "region.json",
            ...(options.provisional === true ? { provisional: true, months: ["2026-12", "2027-01"], window: "Dec-Feb" } : {}),
          },
          {
            index: "NAO",
            value: 0.46,
            label: "positive",
            nearBoundary: true,
            z: 0.5,
            source: "--values",
            nearBoundaryMargin: 0.08,
            ...(options.provisional === true ? { provisional: true, months: ["2026-12", "2027-01"], window: "Dec-Feb" } : {}),
          },
        ],
    missing: options.noCurrentValues ? ["ENSO", "NAO"] : [],
    fireYear: { ...fireYearEstimate, basis: "the ENSO warm phase", basisIndices: ["ENSO"], years: 83, fireYears: 17, comparedWithBase: "not distinguishable" },
    perIndex: [
      { index: "ENSO", label: "warm", probability: estimate(17, 83, false), years: 83, fireYears: 17 },
      { index: "NAO", label: "positive", probability: estimate(13, 97, false), years: 97, fireYears: 13 },
    ],
    categories: degenerate
      ? { below: { estimate: null, lower: null, upper: null, reason: "no years" }, near: { estimate: null, lower: null, upper: null, reason: "no years" }, above: { estimate: null, lower: null, upper: null, reason: "no years" } }
      : { below: estimate(17, 83, false), near: estimate(25, 83, false), above: estimate(41, 83, false) },
    analogs: degenerate
      ? []
      : [1878, 1903, 1735, 1941, 1812].map((year, i) => ({
          year,
          distance: 0.21 + i * 0.13,
          fireYear: i % 2 === 0,
          activity: 0.3 - i * 0.04,
          category: i % 2 === 0 ? ("above" as const) : ("near" as const),
          values: { ENSO: 1.1 + i * 0.05, NAO: 0.4 - i * 0.03 },
        })),
    analogFireShare: degenerate ? { estimate: null, lower: null, upper: null, reason: "no analogs" } : estimate(3, 5, false),
    hindcast: options.noCurrentValues
      ? {
          ...skill,
          hasSkill: false,
          verdict: "No current index values were given, so these are the long-term average odds; a skill score does not apply to them.",
        }
      : skill,
    warnings: [
      ...(options.provisional === true
        ? [
            { code: "value-provisional", message: "ENSO = 1.2 is provisional: computed from Dec 2026–Jan 2027 of its Dec-Feb window, which is not complete yet; the odds may change when it is" },
            { code: "value-provisional", message: "NAO = 0.4612 is provisional: computed from Dec 2026–Jan 2027 of its Dec-Feb window, which is not complete yet; the odds may change when it is" },
          ]
        : []),
      ...(options.outlookWarnings ?? []),
    ],
  };

  const workspace: Workspace = {
    root: "/regions/larkspur-hollow",
    settings: {
      name: regionName,
      description: options.description === undefined ? "An invented region for tests." : options.description,
      calibration: { first, last },
      fireYears: DEFAULT_FIRE_YEARS,
      indices: [
        { name: "ENSO", file: "indices.csv", column: "ENSO", phases: { kind: "cuts", cuts: [-0.5, 0.5], labels: ["cold", "neutral", "warm"] }, months: null },
        { name: "NAO", file: "indices.csv", column: "NAO", phases: { kind: "terciles", labels: ["negative", "neutral", "positive"] }, months: null },
      ],
      outlook: { season: 2027, values: { ENSO: 1.2, NAO: 0.46 }, issued: "2027-03-10" },
      seed: 42,
      methods: DEFAULT_METHODS,
    },
    fireRecord: { kind: "activity", rows },
    modern: null,
    indices: [
      { name: "ENSO", years: indexYears, values: enso },
      { name: "NAO", years: indexYears, values: nao },
    ],
    files: [
      { role: "region", path: "region.json", sha256: "3f".repeat(32), bytes: 812 },
      { role: "activity", path: "fire-activity.csv", sha256: "a0".repeat(32), bytes: 7421 },
      { role: "index:ENSO", path: "indices.csv", sha256: "5c".repeat(32), bytes: 6120 },
    ],
    warnings: [],
  };
  return { workspace, calibration, outlook };
}
