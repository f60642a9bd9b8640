// firephase chance audit (plain Node on the built dist/): `npm run build && npm run audit:chance`.
//
// Every statement the tool makes that claims a link or skill is counted on records that have no
// link left: (a) the demo region with its fire record shuffled across the calibration years, once
// year by year ("permute": an ordinary random permutation, which also removes the record's
// persistence) and once in blocks of 5 consecutive years ("block5": keeps the year-to-year
// persistence inside each block); the modern agency record is shuffled the same way among the
// modern years, independently, so both eras of the two-era test have no link; and (b) a second,
// synthetic region whose fire and modern records are drawn afresh for every replicate from a seeded
// generator that never looks at the indices (a persistent latent fire driver, AR(1) phi = 0.4).
// The indices and this season's values stay as they are, so the tool sees the same climate every
// time and only the link is gone. Each verdict's firing rate gets a Wilson 95% interval and is set
// beside its nominal rate; a verdict whose interval lies wholly above its nominal rate is flagged.
//
// Inside each replicate the outlook runs with methods.permutations = 199 and
// methods.bootstrapResamples = 199 (the smallest allowed; the curve rule's own test then runs 99
// shuffles), and the superposed epoch analysis with its configured draws (10,000 by default).
//
// Settings (environment): AUDIT_SHUFFLES (replicates per design, default 200), AUDIT_SEED (default
// 20271), AUDIT_DESIGNS (comma list of demo-permute, demo-block5, synthetic; default all),
// AUDIT_OUT (also write the report there, default /tmp/chance-audit.txt; "-" for stdout only).
//
// The audit functions take the firephase modules as an argument, so the test
// (test/audit/chanceAudit.test.ts) runs the same code on src/ through vitest.
import { writeFileSync, existsSync } from "node:fs";
import { join, resolve } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";

/** Inside-replicate method settings: the smallest permutation and bootstrap counts the schema allows. */
export const AUDIT_METHODS = Object.freeze({ permutations: 199, bootstrapResamples: 199 });

/** Chance that a Binomial(n, p) count is at least k (exact sum; for the test's stated bound). */
export function binomialUpperTail(k, n, p) {
  let total = 0;
  let term = Math.pow(1 - p, n); // P(X = 0)
  for (let x = 0; x <= n; x += 1) {
    if (x >= k) total += term;
    term = (term * (n - x) * p) / ((x + 1) * (1 - p));
  }
  return Math.min(1, total);
}

/**
 * The verdicts audited, with where each is decided and its nominal rate under no link.
 * `perIndex` verdicts are counted per index and as "any index" (the family a reader sees).
 * Each `fires(ctx)` reads the calibration and the outlook of one replicate.
 */
export function verdictDefinitions(indexNames) {
  const families = (count, rate) => 1 - Math.pow(1 - rate, count);
  const list = [
    {
      key: "hindcastSkill",
      label: 'hindcast "Some skill" (phase rule)',
      where: "src/hindcast/skillVerdict.ts skillVerdict (BSS > 0 and permutation p ≤ 0.05)",
      nominal: 0.05,
      fires: ({ outlook }) => outlook.hindcast.hasSkill === true,
    },
    {
      key: "hindcastFew",
      label: 'briefing chance text "few scored as well" (p ≤ 0.05)',
      where: "src/briefing/briefingSections.ts hindcastExtras",
      nominal: 0.05,
      fires: ({ outlook }) => typeof outlook.hindcast.skillPValue === "number" && outlook.hindcast.skillPValue <= 0.05,
    },
    {
      key: "curveSkill",
      label: 'curve rule "some skill" (99 shuffles)',
      where: "src/hindcast/runHindcast.ts curveRule via skillVerdict",
      nominal: 0.05,
      fires: ({ outlook }) => outlook.hindcast.curveRule?.hasSkill === true,
    },
    {
      key: "joint",
      label: "joint phase used (both indices a clear link)",
      where: "src/calibrate/forecastCell.ts forecastCell (q ≤ jointMaxQ)",
      nominal: 0.05,
      fires: ({ outlook }) => (outlook.fireYear.phaseOdds?.basisIndices ?? []).length === 2,
    },
    {
      key: "headlineClear",
      label: "headline odds rest on a clear link (no no-clear-link warning)",
      where: "src/outlook/buildOutlook.ts isClear / no-clear-link warning",
      nominal: 0.05,
      fires: ({ outlook }) =>
        (outlook.fireYear.phaseOdds?.basisIndices ?? []).length > 0 && !outlook.warnings.some((warning) => warning.code === "no-clear-link"),
    },
    {
      key: "comparedWithBase",
      label: 'headline "higher/lower than an average year beyond the uncertainty of both"',
      where: "src/outlook/describeChance.ts comparedWithBase (95% intervals do not overlap)",
      nominal: 0.05,
      fires: ({ outlook }) => outlook.fireYear.comparedWithBase === "higher" || outlook.fireYear.comparedWithBase === "lower",
    },
    {
      key: "headlineCurve",
      label: "curve of the headline index shown as a clear link (its q ≤ 0.05)",
      where: "src/outlook/buildOutlook.ts curveForecast on the index the phase rule selected; src/briefing/briefingSections.ts curveView",
      nominal: 0.05,
      fires: ({ calibration, outlook }) => {
        const name = outlook.fireYear.curveOdds?.index;
        return curveClear(calibration.indices.find((index) => index.name === name)?.curve);
      },
    },
    {
      key: "headlineCurveP",
      label: "curve of the headline index at p ≤ 0.05 (raw; selected by chi-square p)",
      where: "src/calibrate/fitResponseCurve.ts pValue of the index the phase rule selected",
      nominal: 0.05,
      note: "selection: the index has the smallest chi-square p",
      fires: ({ calibration, outlook }) => {
        const name = outlook.fireYear.curveOdds?.index;
        const curve = calibration.indices.find((index) => index.name === name)?.curve;
        return curve !== undefined && curve !== null && curve.pValue <= 0.05;
      },
    },
    {
      key: "strengthNote",
      label: "strength note shown (value strong within its phase; not a test)",
      where: "src/outlook/strengthNote.ts strengthNote",
      nominal: null,
      nominalText: "none (describes the value, not a test)",
      fires: ({ outlook }) => typeof outlook.fireYear.strengthNote === "string",
    },
    {
      key: "strengthNoteNoLink",
      label: "strength note shown while the curve shows no clear link (q > 0.05)",
      where: "src/outlook/strengthNote.ts strengthNote",
      nominal: 0,
      note: "a strength reading with no shown link should not be printed",
      fires: ({ calibration, outlook }) => {
        if (typeof outlook.fireYear.strengthNote !== "string") return false;
        const name = outlook.fireYear.curveOdds?.index;
        return !curveClear(calibration.indices.find((index) => index.name === name)?.curve);
      },
    },
  ];
  const perIndex = [
    {
      key: "clearLink",
      label: 'index "clear link" (BH q ≤ jointMaxQ)',
      where: "src/calibrate/runCalibration.ts benjaminiHochberg; src/outlook/buildOutlook.ts isClear",
      nominal: 0.05,
      familyNominal: 0.05,
      familyNote: "BH controls the family-wise rate under the global null",
      fires: (index, { calibration, settings }) => {
        const q = calibration.indices.find((entry) => entry.name === index)?.contingency.qValue;
        return typeof q === "number" && q <= settings.methods.jointMaxQ;
      },
    },
    {
      key: "chiSquare",
      label: "chi-square p < 0.05 (printed, raw)",
      where: "src/calibrate/contingencyByPhase.ts",
      nominal: 0.05,
      familyNominal: families(indexNames.length, 0.05),
      familyNote: "raw p, no correction: about 1 − 0.95^k",
      fires: (index, { calibration }) => {
        const p = calibration.indices.find((entry) => entry.name === index)?.contingency.pValue;
        return typeof p === "number" && p < 0.05;
      },
    },
    {
      key: "curveQ",
      label: "response curve drawn as a clear link (q ≤ 0.05 across indices)",
      where: "src/calibrate/runCalibration.ts curve qValue; src/briefing/briefingSections.ts curveView",
      nominal: 0.05,
      familyNominal: 0.05,
      familyNote: "BH across indices",
      fires: (index, { calibration }) => curveClear(calibration.indices.find((entry) => entry.name === index)?.curve),
    },
    {
      key: "curveP",
      label: "response curve p ≤ 0.05 (printed, raw)",
      where: "src/calibrate/fitResponseCurve.ts",
      nominal: 0.05,
      familyNominal: families(indexNames.length, 0.05),
      familyNote: "no correction across indices: about 1 − 0.95^k",
      fires: (index, { calibration }) => {
        const curve = calibration.indices.find((entry) => entry.name === index)?.curve;
        return curve !== undefined && curve !== null && curve.pValue <= 0.05;
      },
    },
    {
      key: "twoEra",
      label: 'two-era "looks weaker/stronger/differs" (canTell)',
      where: "src/calibrate/modernEra.ts twoEraTest (Breslow–Day q across indices ≤ 0.05 where the code sets qValue, else p)",
      nominal: 0.05,
      familyNominal: 0.05,
      familyNote: "BH across indices",
      fires: (index, { calibration }) => {
        const entry = calibration.modern?.indices.find((candidate) => candidate.name === index);
        return entry?.homogeneity?.canTell === true;
      },
    },
    {
      key: "seaRaw",
      label: "SEA some lag at raw p < 0.05",
      where: "src/cli/calibrate.ts formatIndex (such lags are printed as 'p below 0.05 but not clear' when q > 0.05)",
      nominal: null,
      nominalText: "none stated (per lag 5%; any of 7 lags about 30%)",
      familyNominal: null,
      familyNominalText: "none stated (per lag 5%; any of L lags up to 1 − 0.95^L per index)",
      fires: (index, { calibration }) => {
        const sea = calibration.indices.find((entry) => entry.name === index)?.sea;
        return sea !== undefined && sea.reason === undefined && sea.pValue.some((p, i) => typeof p === "number" && p < 0.05 && sea.mean[i] !== null);
      },
    },
    {
      key: "seaQ",
      label: 'SEA "clear departures" (some lag q ≤ 0.05, BH across lags)',
      where: "src/calibrate/seaForIndex.ts qValue; src/cli/calibrate.ts formatIndex",
      nominal: 0.05,
      familyNominal: families(indexNames.length, 0.05),
      familyNote: "no correction across indices: about 1 − 0.95^k",
      fires: (index, { calibration }) => {
        const sea = calibration.indices.find((entry) => entry.name === index)?.sea;
        return sea !== undefined && sea.reason === undefined && (sea.qValue ?? []).some((q) => typeof q === "number" && q <= 0.05);
      },
    },
    {
      key: "aggregated",
      label: "5-year-block r at lag 0, p < 0.05 (printed)",
      where: "src/calibrate/aggregatedLagCorrelation.ts (effective n)",
      nominal: 0.05,
      familyNominal: families(indexNames.length, 0.05),
      familyNote: "no correction across indices: about 1 − 0.95^k",
      fires: (index, { calibration }) => {
        const agg = calibration.indices.find((entry) => entry.name === index)?.aggregated;
        if (agg === undefined || agg.reason !== undefined) return false;
        const p = agg.pValue[agg.lags.indexOf(0)];
        return typeof p === "number" && p < 0.05;
      },
    },
  ];
  const rows = [...list];
  for (const verdict of perIndex) {
    for (const index of indexNames) {
      rows.push({
        key: `${verdict.key}:${index}`,
        label: `${verdict.label} — ${index}`,
        where: verdict.where,
        nominal: verdict.nominal,
        nominalText: verdict.nominalText,
        fires: (ctx) => verdict.fires(index, ctx),
      });
    }
    rows.push({
      key: `${verdict.key}:any`,
      label: `${verdict.label} — any of ${indexNames.length}`,
      where: verdict.where,
      nominal: verdict.familyNominal,
      note: verdict.familyNote,
      nominalText: verdict.familyNominalText,
      fires: (ctx) => indexNames.some((index) => verdict.fires(index, ctx)),
    });
  }
  return rows;
}

/** A response curve shown as a clear link: its q across indices (its p where the calibration sets no q) at most 0.05. */
function curveClear(curve) {
  if (curve === undefined || curve === null) return false;
  const q = curve.qValue ?? curve.pValue;
  return typeof q === "number" && q <= 0.05;
}

/** A workspace with the audit's method settings (and a seed of its own per replicate). */
function withAuditSettings(workspace, seed, methods = {}) {
  return {
    ...workspace,
    settings: { ...workspace.settings, seed, methods: { ...workspace.settings.methods, ...AUDIT_METHODS, ...methods } },
  };
}

/**
 * The region with its fire record shuffled across the calibration years (and the modern record across the
 * modern years): the record is composited once, and the (sites recording, sites burned) pair of each
 * calibration year is moved to another calibration year, year by year (blockYears 1) or in blocks of
 * consecutive years (blockPermutationIndices). Years outside the calibration are left as they are.
 */
export function shuffledWorkspace(modules, workspace, random, blockYears) {
  const { compositeFireRecord, calibrationPeriod, blockPermutationIndices } = modules;
  const record = compositeFireRecord(workspace.fireRecord, workspace.settings.fireYears.minSitesRecording);
  const period = calibrationPeriod(workspace.settings, record, workspace.indices);
  const byYear = new Map(record.years.map((row) => [row.year, row]));
  const years = period.years;
  const order = blockPermutationIndices(years.length, Math.min(blockYears, years.length), random);
  const moved = new Map(years.map((year, position) => [year, byYear.get(years[order[position]])]));
  const rows = record.years.map((row) => {
    const from = moved.get(row.year) ?? row;
    return { year: row.year, sitesRecording: from.sitesRecording, sitesBurned: from.sitesBurned };
  });
  let modern = workspace.modern;
  if (modern !== null && modern.length > 1) {
    const modernOrder = blockPermutationIndices(modern.length, Math.min(blockYears, modern.length), random);
    modern = modern.map((row, position) => ({ year: row.year, fires: modern[modernOrder[position]].fires, areaHa: modern[modernOrder[position]].areaHa }));
  }
  return { ...workspace, fireRecord: { kind: "activity", rows }, modern };
}

function normal(random) {
  const u = Math.max(random.nextFloat(), 1e-12);
  const v = random.nextFloat();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}

function ar1(random, length, phi) {
  const out = [];
  let value = normal(random);
  for (let i = 0; i < length; i += 1) {
    out.push(value);
    value = phi * value + Math.sqrt(1 - phi * phi) * normal(random);
  }
  return out;
}

/** The synthetic no-link region's fixed part: three invented indices 1700–2026 and this season's values. */
export function syntheticClimate(modules, seed) {
  const random = modules.createRandom(seed);
  const years = [];
  for (let year = 1700; year <= 2026; year += 1) years.push(year);
  const series = [
    { name: "P", values: ar1(random, years.length, 0.3) },
    { name: "Q", values: ar1(random, years.length, 0) },
    { name: "R", values: ar1(random, years.length, 0.6) },
  ].map((entry) => ({ name: entry.name, years, values: entry.values }));
  const indexSettings = [
    { name: "P", file: "indices.csv", column: "P", phases: { kind: "cuts", cuts: [-0.5, 0.5], labels: ["low", "mid", "high"] }, months: null, missing: [], units: null },
    { name: "Q", file: "indices.csv", column: "Q", phases: { kind: "terciles", labels: ["low", "middle", "high"] }, months: null, missing: [], units: null },
    { name: "R", file: "indices.csv", column: "R", phases: { kind: "terciles", labels: ["low", "middle", "high"] }, months: null, missing: [], units: null },
  ];
  return { series, indexSettings, values: { P: -1.3, Q: 0.1, R: 1.4 } };
}

/**
 * One replicate of the synthetic no-link region: 15 sites 1700–1990 whose regional fire years follow a
 * persistent latent driver (AR(1), phi 0.4) that never looks at the indices, and a modern record 1950–2026
 * (area burned and fires) drawn the same way, independently.
 */
export function syntheticWorkspace(modules, climate, random) {
  const sites = 15;
  const fireYears = [];
  for (let year = 1700; year <= 1990; year += 1) fireYears.push(year);
  const driver = ar1(random, fireYears.length, 0.4);
  const rows = fireYears.map((year, i) => {
    const regional = random.nextFloat() < 1 / (1 + Math.exp(-(-2.3 + 0.8 * driver[i])));
    const perSite = regional ? 0.55 : 0.04;
    let burned = 0;
    for (let site = 0; site < sites; site += 1) if (random.nextFloat() < perSite) burned += 1;
    return { year, sitesRecording: sites, sitesBurned: burned };
  });
  const modernDriver = ar1(random, 2026 - 1950 + 1, 0.4);
  const modern = modernDriver.map((value, i) => {
    const area = Math.round(Math.exp(7 + 1.4 * value + 0.6 * normal(random)));
    return { year: 1950 + i, fires: Math.max(1, Math.round(area / 40)), areaHa: area };
  });
  const { DEFAULT_METHODS, DEFAULT_FIRE_YEARS } = modules;
  return {
    root: "/synthetic-no-link",
    settings: {
      name: "Synthetic no-link region (invented)",
      description: null,
      calibration: null,
      fireYears: DEFAULT_FIRE_YEARS,
      indices: climate.indexSettings,
      outlook: { season: 2027, values: climate.values, issued: "2027-03-10" },
      seed: 1,
      methods: DEFAULT_METHODS,
      preparedBy: null,
      contact: null,
    },
    fireRecord: { kind: "activity", rows },
    modern,
    indices: climate.series,
    files: [],
    warnings: [],
  };
}

/** Runs the tool on one workspace and says which verdicts fire. */
export function auditOnce(modules, workspace, request, verdicts) {
  const calibration = modules.runCalibration(workspace);
  const outlook = modules.buildOutlook(workspace, calibration, request);
  const ctx = { calibration, outlook, settings: workspace.settings };
  const fired = {};
  for (const verdict of verdicts) fired[verdict.key] = verdict.fires(ctx) === true;
  return fired;
}

/**
 * The audit of one design: `shuffles` replicates, each a workspace made by `replicate(random, r)`, every
 * verdict counted. Returns counts per verdict key.
 */
export function auditDesign(modules, { replicate, request, indexNames, shuffles, seed, methods = {}, onProgress }) {
  const verdicts = verdictDefinitions(indexNames);
  const counts = Object.fromEntries(verdicts.map((verdict) => [verdict.key, 0]));
  const random = modules.createRandom(seed);
  for (let r = 0; r < shuffles; r += 1) {
    const workspace = withAuditSettings(replicate(random, r), seed + 1 + r, methods);
    const fired = auditOnce(modules, workspace, request, verdicts);
    for (const key of Object.keys(counts)) if (fired[key]) counts[key] += 1;
    onProgress?.(r + 1);
  }
  return { verdicts, counts, shuffles };
}

function percent(value) {
  return `${(100 * value).toFixed(1)}%`;
}

/** The table of one design: verdict, fired / shuffles, rate with Wilson 95% interval, nominal, flag. */
export function formatDesign(modules, title, result) {
  const lines = [title, ""];
  const header = ["verdict", "fired", "rate (Wilson 95%)", "nominal", "flag"];
  const rows = result.verdicts.map((verdict) => {
    const k = result.counts[verdict.key];
    const interval = modules.wilsonInterval(k, result.shuffles);
    const flag =
      verdict.nominal === null ? "" : interval.lower > verdict.nominal ? "ABOVE NOMINAL" : "";
    const nominal = verdict.nominal === null ? `— ${verdict.nominalText ?? "(not a test)"}` : `${percent(verdict.nominal)}${verdict.note ? ` (${verdict.note})` : ""}`;
    return [verdict.label, `${k} / ${result.shuffles}`, `${percent(k / result.shuffles)} (${percent(interval.lower)}–${percent(interval.upper)})`, nominal, flag];
  });
  const widths = header.map((_, column) => Math.max(header[column].length, ...rows.map((row) => row[column].length)));
  const line = (cells) => cells.map((cell, column) => cell.padEnd(widths[column])).join("  ").trimEnd();
  lines.push(line(header));
  for (const row of rows) lines.push(line(row));
  const flagged = result.verdicts.filter((verdict, i) => rows[i][4] !== "");
  lines.push("");
  lines.push(flagged.length === 0 ? "No verdict fires clearly more often than its nominal rate." : "Fires clearly more often than nominal:");
  for (const verdict of flagged) lines.push(`  - ${verdict.label}: ${verdict.where}`);
  return lines.join("\n");
}

async function main() {
  const root = resolve(fileURLToPath(new URL("..", import.meta.url)));
  if (!existsSync(join(root, "dist", "outlook", "buildOutlook.js"))) {
    console.error("audit:chance: dist/ is missing; run `npm run build` first");
    process.exitCode = 1;
    return;
  }
  const dist = async (path) => import(pathToFileURL(join(root, "dist", path)).href);
  const modules = {
    ...(await dist("record/composite.js")),
    ...(await dist("calibrate/calibrationPeriod.js")),
    ...(await dist("calibrate/runCalibration.js")),
    ...(await dist("outlook/buildOutlook.js")),
    ...(await dist("stats/createRandom.js")),
    ...(await dist("stats/blockPermutation.js")),
    ...(await dist("stats/wilsonInterval.js")),
    ...(await dist("workspace/defaults.js")),
  };
  const { loadWorkspace } = await dist("workspace/loadWorkspace.js");
  const { resolveOutlookRequest } = await dist("cli/outlookRequest.js");
  const shuffles = Number(process.env.AUDIT_SHUFFLES ?? 200);
  const seed = Number(process.env.AUDIT_SEED ?? 20271);
  const designs = new Set((process.env.AUDIT_DESIGNS ?? "demo-permute,demo-block5,synthetic").split(",").map((name) => name.trim()));
  const outPath = process.env.AUDIT_OUT ?? "/tmp/chance-audit.txt";
  if (!Number.isInteger(shuffles) || shuffles < 1 || !Number.isSafeInteger(seed)) {
    console.error("audit:chance: AUDIT_SHUFFLES must be a positive integer and AUDIT_SEED an integer");
    process.exitCode = 2;
    return;
  }
  const output = [];
  const say = (text) => {
    output.push(text);
    process.stdout.write(`${text}\n`);
    if (outPath !== "-") writeFileSync(outPath, `${output.join("\n")}\n`);
  };
  const progress = (name) => (done) => {
    if (done % 10 === 0 || done === shuffles) process.stderr.write(`${name}: ${done} / ${shuffles}\n`);
  };
  say(`firephase chance audit: ${shuffles} replicates per design, seed ${seed}, inside each replicate methods.permutations ${AUDIT_METHODS.permutations}, bootstrapResamples ${AUDIT_METHODS.bootstrapResamples} (curve rule 99 shuffles), SEA draws as configured.`);
  say("A flag means the Wilson 95% interval of the firing rate lies wholly above the nominal rate.");
  const started = Date.now();
  const demo = await loadWorkspace(join(root, "demo-region"));
  const demoRequest = resolveOutlookRequest(demo, {}, new Date(`${demo.settings.outlook.issued ?? "2027-03-10"}T12:00:00Z`));
  const demoNames = demo.settings.indices.map((index) => index.name);
  const valuesWords = (values) => Object.entries(values).map(([name, value]) => `${name} = ${Number(value.toPrecision(3))}`).join(", ");
  for (const [name, blockYears, words] of [
    ["demo-permute", 1, "years permuted one by one (persistence removed)"],
    ["demo-block5", 5, "years permuted in blocks of 5 (persistence kept within blocks)"],
  ]) {
    if (!designs.has(name)) continue;
    const result = auditDesign(modules, {
      replicate: (random) => shuffledWorkspace(modules, demo, random, blockYears),
      request: demoRequest,
      indexNames: demoNames,
      shuffles,
      seed,
      onProgress: progress(name),
    });
    say("");
    say(formatDesign(modules, `Design ${name}: demo-region, fire record (and modern record) shuffled across years, ${words}; this season's values ${valuesWords(demoRequest.values)}`, result));
  }
  if (designs.has("synthetic")) {
    const climate = syntheticClimate(modules, seed + 7);
    const result = auditDesign(modules, {
      replicate: (random) => syntheticWorkspace(modules, climate, random),
      request: { values: climate.values, issued: "2027-03-10", season: 2027 },
      indexNames: climate.series.map((series) => series.name),
      shuffles,
      seed: seed + 13,
      onProgress: progress("synthetic"),
    });
    say("");
    say(formatDesign(modules, `Design synthetic: invented no-link region (291 years, 3 invented indices, a persistent fire driver independent of them, drawn afresh each replicate); this season's values ${valuesWords(climate.values)}`, result));
  }
  say("");
  say(`Done in ${((Date.now() - started) / 1000).toFixed(0)} s.`);
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) {
  await main();
}
