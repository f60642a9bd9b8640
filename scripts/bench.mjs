// firephase benchmark (plain Node on the built dist/): `npm run build && npm run bench`.
//
// In one run it times
//   1. the computation (load + calibrate + outlook with its leave-out hindcast) on demo-region,
//   2. the same on a synthetic region four times larger, generated into a temp folder from the
//      demo: every site is copied once (the copy 1° of latitude north, so no site pair is closer
//      than the independence distance; same span and fire years) = 2× the sites, and every site's
//      record, every index series and the calibration period are extended back by the whole length
//      of the demo record, repeating its fire years and index values = 2× the years;
//      2 × 2 = 4× the site-years,
//   3. the whole `brief` of demo-region (browser launch, computation, HTML, PDF, atomic write),
//   4. the floor: the same browser launched, printing a trivial page to PDF and closed,
//   5. the hindcast alone on the demo (one pass; its permutation test with 999 shuffles; its bootstrap
//      intervals and CORP band; the curve rule with 199 shuffles) and on 3,000 invented years,
// and prints brief ÷ floor (target: at most 1.5). Each figure is the median of several runs
// after one warm-up. Figures belong in the README's Performance section, never in tests.
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { performance } from "node:perf_hooks";
import { fileURLToPath } from "node:url";

const root = resolve(fileURLToPath(new URL("..", import.meta.url)));
const dist = (path) => new URL(`../dist/${path}`, import.meta.url).href;
if (!existsSync(join(root, "dist", "cli", "brief.js"))) {
  console.error("bench: dist/ is missing; run `npm run build` first");
  process.exit(1);
}
const { loadWorkspace } = await import(dist("workspace/loadWorkspace.js"));
const { runCalibration } = await import(dist("calibrate/runCalibration.js"));
const { buildOutlook } = await import(dist("outlook/buildOutlook.js"));
const { runBrief } = await import(dist("cli/brief.js"));
const { findBrowser } = await import(dist("briefing/findBrowser.js"));
const { PdfPrinter } = await import(dist("briefing/printPdf.js"));
const { runHindcast } = await import(dist("hindcast/runHindcast.js"));
const { valuesByYear } = await import(dist("calibrate/activityByYear.js"));
const { createRandom } = await import(dist("stats/createRandom.js"));

const REPEATS = Number(process.env.BENCH_REPEATS ?? 5);
const demo = join(root, "demo-region");
const scratch = mkdtempSync(join(tmpdir(), "firephase-bench-"));

function median(values) {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}

async function timed(label, repeats, run) {
  await run(); // warm-up
  const times = [];
  for (let i = 0; i < repeats; i++) {
    const start = performance.now();
    await run();
    times.push(performance.now() - start);
  }
  const result = { label, median: median(times), min: Math.min(...times), max: Math.max(...times), runs: repeats };
  console.log(`${label.padEnd(52)} median ${result.median.toFixed(0).padStart(6)} ms  (min ${result.min.toFixed(0)}, max ${result.max.toFixed(0)}, ${repeats} runs)`);
  return result;
}

async function compute(region) {
  const workspace = await loadWorkspace(region);
  const calibration = runCalibration(workspace);
  const outlook = workspace.settings.outlook;
  return buildOutlook(workspace, calibration, {
    values: outlook.values,
    issued: outlook.issued ?? "2027-03-10",
    season: outlook.season ?? 2027,
  });
}

/** The outlook's hindcast input for a region (every index used), as buildOutlook builds it. */
async function hindcastInputOf(region) {
  const workspace = await loadWorkspace(region);
  const calibration = runCalibration(workspace);
  const { settings } = workspace;
  return {
    years: calibration.years,
    activity: calibration.activity,
    indexValues: new Map(workspace.indices.map((series) => [series.name, valuesByYear(series)])),
    indexSettings: settings.indices,
    indices: settings.indices.map((index) => index.name),
    top: settings.fireYears.top,
    measure: settings.fireYears.measure,
    exclusion: settings.methods.hindcastExclusion,
    jointMinYears: settings.methods.jointMinYears,
    jointMaxQ: settings.methods.jointMaxQ,
    seed: settings.seed,
    blockYears: settings.methods.blockYears,
  };
}

/** An invented record of `years` years: 4 indices (2 fixed cuts, 2 terciles), a planted link to the first. */
function inventedHindcastInput(years) {
  const random = createRandom(5);
  const normal = () => Math.sqrt(-2 * Math.log(Math.max(random.nextFloat(), 1e-12))) * Math.cos(2 * Math.PI * random.nextFloat());
  const names = ["A", "B", "C", "D"];
  const values = new Map(names.map((name) => [name, new Map()]));
  const activity = new Map();
  const list = [];
  for (let year = 1; year <= years; year += 1) {
    list.push(year);
    for (const name of names) values.get(name).set(year, normal());
    const high = random.nextFloat() < 1 / (1 + Math.exp(2.5 - 0.8 * values.get("A").get(year)));
    let burned = 0;
    for (let site = 0; site < 20; site += 1) if (random.nextFloat() < (high ? 0.6 : 0.03)) burned += 1;
    activity.set(year, burned / 20);
  }
  const phases = (i) => (i % 2 === 0 ? { kind: "cuts", cuts: [-0.5, 0.5], labels: ["low", "mid", "high"] } : { kind: "terciles", labels: ["low", "middle", "high"] });
  return {
    years: list,
    activity,
    indexValues: values,
    indexSettings: names.map((name, i) => ({ name, file: "indices.csv", column: name, phases: phases(i), months: null })),
    indices: names,
    top: 0.1,
    measure: "fraction",
    exclusion: 2,
    jointMinYears: 10,
    jointMaxQ: 0.05,
    seed: 1,
  };
}

// Split a CSV into header and rows (the demo files have no quoted fields).
function readCsv(path) {
  const [header, ...rows] = readFileSync(path, "utf8").replace(/^\uFEFF/, "").trim().split(/\r?\n/);
  return { header, rows: rows.map((row) => row.split(",")) };
}

/** Write the 4× region (see the header comment) into `folder`; returns its path. */
function scaleRegion(source, folder) {
  const region = JSON.parse(readFileSync(join(source, "region.json"), "utf8"));
  const sites = readCsv(join(source, "fire-sites.csv"));
  const events = readCsv(join(source, "fire-events.csv"));
  const firstYear = Math.min(...sites.rows.map((row) => Number(row[3])));
  const lastYear = Math.max(...sites.rows.map((row) => Number(row[4])), ...events.rows.map((row) => Number(row[1])));
  const span = lastYear - firstYear + 1;
  const siteRows = [];
  const eventRows = [];
  for (const copy of ["", "B"]) {
    for (const [id, latitude, longitude, first, last, ...rest] of sites.rows) {
      const name = rest.length > 0 ? [`${rest.join(",")}${copy === "" ? "" : " B"}`] : [];
      siteRows.push([`${id}${copy}`, (Number(latitude) + (copy === "" ? 0 : 1)).toFixed(4), longitude, Number(first) - span, last, ...name].join(","));
    }
    for (const [id, year] of events.rows) {
      eventRows.push(`${id}${copy},${Number(year) - span}`);
      eventRows.push(`${id}${copy},${year}`);
    }
  }
  writeFileSync(join(folder, "fire-sites.csv"), `${sites.header}\n${siteRows.join("\n")}\n`);
  writeFileSync(join(folder, "fire-events.csv"), `${events.header}\nS\n`.replace("S\n", `${eventRows.join("\n")}\n`));
  const indexFiles = new Set(Object.values(region.indices).map((index) => index.file));
  for (const file of indexFiles) {
    const table = readCsv(join(source, file));
    const earlier = table.rows.map(([year, ...values]) => [Number(year) - span, ...values].join(","));
    const later = table.rows.map((row) => row.join(","));
    writeFileSync(join(folder, file), `${table.header}\n${[...earlier, ...later].join("\n")}\n`);
  }
  if (region.fireRecord.modern !== undefined) writeFileSync(join(folder, region.fireRecord.modern), readFileSync(join(source, region.fireRecord.modern)));
  region.name = `${region.name} ×4 (bench)`;
  if (region.calibration) region.calibration = { first: region.calibration.first - span, last: region.calibration.last };
  writeFileSync(join(folder, "region.json"), `${JSON.stringify(region, null, 2)}\n`);
  return { folder, sites: siteRows.length, years: `${firstYear - span}–${lastYear}` };
}

try {
  const browser = await findBrowser({ env: process.env });
  console.log(`firephase bench — Node ${process.version}, browser ${browser.executablePath} (${browser.source})`);
  const bigFolder = join(scratch, "region-x4");
  (await import("node:fs")).mkdirSync(bigFolder);
  const big = scaleRegion(demo, bigFolder);
  console.log(`synthetic region: ${big.sites} sites, years ${big.years}`);

  const computeDemo = await timed("compute demo-region (load+calibrate+outlook)", REPEATS, () => compute(demo));
  const computeBig = await timed("compute 4× region", Math.max(1, Math.ceil(REPEATS / 2)), () => compute(bigFolder));
  // Hindcast alone (its permutation test, intervals and curve rule), on the demo and on 3,000 invented years.
  const demoHindcast = await hindcastInputOf(demo);
  const lean = { permutations: 0, bootstrapResamples: 0, curveRule: false };
  await timed("hindcast demo: one pass, no shuffles", REPEATS, () => runHindcast({ ...demoHindcast, ...lean }));
  await timed("hindcast demo: permutation test, 999 shuffles", REPEATS, () => runHindcast({ ...demoHindcast, ...lean, permutations: 999 }));
  await timed("hindcast demo: bootstrap intervals + CORP, 999", REPEATS, () => runHindcast({ ...demoHindcast, ...lean, bootstrapResamples: 999 }));
  await timed("hindcast demo: curve rule + 199 shuffles", Math.max(1, Math.ceil(REPEATS / 2)), () =>
    runHindcast({ ...demoHindcast, permutations: 199, curvePermutations: 199, bootstrapResamples: 0 }),
  );
  const longHindcast = inventedHindcastInput(3000);
  await timed("hindcast 3,000 years: one pass, no shuffles", Math.max(1, Math.ceil(REPEATS / 2)), () => runHindcast({ ...longHindcast, ...lean }));
  await timed("hindcast 3,000 years: permutation test, 999", 1, () => runHindcast({ ...longHindcast, ...lean, permutations: 999 }));

  const trivial = "<!DOCTYPE html><html><body><p>floor</p></body></html>";
  const floor = await timed("floor: launch browser, print trivial page, close", REPEATS, async () => {
    const printer = await PdfPrinter.launch(browser);
    try {
      await printer.print(trivial, { paper: "a4", footerHtml: "", footerFontCss: "" });
    } finally {
      await printer.close();
    }
  });
  const out = join(scratch, "bench.pdf");
  const brief = await timed("whole brief demo-region (PDF written)", REPEATS, () =>
    // --force: each repeat replaces the last PDF; --no-keep: the bench never adds to demo-region/issued/.
    runBrief(demo, { out, browser: browser.executablePath, force: true, keep: false }, { cwd: scratch, today: new Date(), env: {} }),
  );
  console.log("");
  console.log(`4× region / demo computation: ${(computeBig.median / computeDemo.median).toFixed(2)}×`);
  console.log(`brief / floor: ${(brief.median / floor.median).toFixed(2)}× (target ≤ 1.5×); brief − floor = ${(brief.median - floor.median).toFixed(0)} ms`);
} finally {
  rmSync(scratch, { recursive: true, force: true });
}
