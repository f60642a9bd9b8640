// firephase benchmark (plain Node on the built dist/): `npm run build && npm run bench`.
//
// Headline (what a user pays): whole processes started from the shell, in alternating pairs
// (A B, B A, A B, …, so neither side always runs first on a warmed machine), each run a new process
// (both sides cold: nothing is shared between runs but the operating system's file cache), timed
// from spawn to exit, with the peak memory from `/usr/bin/time -v` where it exists:
//   a. `node -e 0` against `firephase check demo-region` (target: check ≤ 2.5× node -e 0),
//      and `firephase --version`;
//   b. the browser floor — a plain script that starts the same bundled browser through
//      puppeteer-core, prints a trivial page to PDF and closes — against `firephase brief
//      demo-region` (target: brief ≤ 1.5× the floor); and the print floor — the same script
//      printing the briefing's own HTML with brief's print options — against both: how much of
//      brief is the printing of its document, and what reading, computing and rendering add; and
//      the text floor — the same with every chart taken out — against the browser floor: what the
//      briefing's text alone costs to print;
//   c. a batch: `firephase brief r01 … r20` on 20 regions generated from the demo into a temp
//      folder (each a copy with its own seed and name, and every 20th fire event left out at its own
//      offset, so no two are the same), against one `brief`: regions per minute and the marginal
//      cost of a region, (batch − single) ÷ 19.
// Each ratio is the median of the per-pair ratios. BENCH_PAIRS (default 7) sets the number of
// pairs, BENCH_SECTIONS=check,brief,batch,detail which sections run (default all).
//
// Detail (in-process, after one warm-up, median of BENCH_REPEATS runs):
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
//      intervals and CORP band; the curve rule with 99 shuffles) and on 3,000 invented years,
// and prints brief ÷ floor (target: at most 1.5). Each figure is the median of several runs
// after one warm-up. Figures belong in the README's Performance section, never in tests.
import { spawnSync } from "node:child_process";
import { cpSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync } from "node:fs";
import { createRequire } from "node:module";
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
const { buildOutlook, outlookHindcastInput } = await import(dist("outlook/buildOutlook.js"));
const { runBrief } = await import(dist("cli/brief.js"));
const { findBrowser } = await import(dist("briefing/findBrowser.js"));
const { PdfPrinter, BROWSER_ARGS } = await import(dist("briefing/printPdf.js"));
const { embeddedFontCss } = await import(dist("briefing/embeddedFonts.js"));
const { runHindcast } = await import(dist("hindcast/runHindcast.js"));
const { createRandom } = await import(dist("stats/createRandom.js"));

const REPEATS = Number(process.env.BENCH_REPEATS ?? 5);
const PAIRS = Number(process.env.BENCH_PAIRS ?? 7);
const SECTIONS = new Set((process.env.BENCH_SECTIONS ?? "check,brief,batch,detail").split(",").map((name) => name.trim()));
const BIN = join(root, "dist", "bin", "main.js");
const TIME = existsSync("/usr/bin/time") ? "/usr/bin/time" : null;
const demo = join(root, "demo-region");
const scratch = mkdtempSync(join(tmpdir(), "firephase-bench-"));

/** Pages of a PDF, from its page-tree count (the largest /Count; enough for the PDFs Chromium writes). */
function pdfPages(path) {
  const text = readFileSync(path).toString("latin1");
  let pages = 0;
  for (const match of text.matchAll(/\/Type\s*\/Pages\b[^>]*?\/Count\s+(\d+)/g)) pages = Math.max(pages, Number(match[1]));
  return pages === 0 ? "?" : String(pages);
}

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
  const values = Object.fromEntries(workspace.settings.indices.map((index) => [index.name, 0]));
  return outlookHindcastInput(workspace, calibration, { values, issued: "2027-03-10", season: 2027 });
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

/**
 * Run one whole process (`node <args>`) to its end: wall time from spawn to exit (ms) and, with
 * /usr/bin/time -v, the peak resident memory (MB). A non-zero exit stops the bench.
 */
function wholeProcess(args, cwd) {
  const command = TIME === null ? [process.execPath, ...args] : [TIME, "-v", process.execPath, ...args];
  const start = performance.now();
  const run = spawnSync(command[0], command.slice(1), { cwd, encoding: "utf8", env: { ...process.env, FIREPHASE_DEBUG: "" } });
  const ms = performance.now() - start;
  if (run.status !== 0) throw new Error(`bench: ${args.join(" ")} exited with ${run.status}:\n${run.stderr}`);
  const rss = /Maximum resident set size \(kbytes\): (\d+)/.exec(run.stderr ?? "");
  const user = /User time \(seconds\): ([\d.]+)/.exec(run.stderr ?? "");
  const system = /System time \(seconds\): ([\d.]+)/.exec(run.stderr ?? "");
  // CPU time (user + system) is steadier than wall time on a busy machine; it is shown beside it.
  const cpuMs = user === null || system === null ? null : (Number(user[1]) + Number(system[1])) * 1000;
  return { ms, mb: rss === null ? null : Number(rss[1]) / 1024, cpuMs };
}

/** Alternating pairs of whole processes (A B, B A, …); medians of each side and of the per-pair ratio B ÷ A. */
function pairs(labelA, runA, labelB, runB, count) {
  runA();
  runB(); // one warm-up of each: the file cache, the unpacked browser
  const a = [];
  const b = [];
  const ratios = [];
  const cpuRatios = [];
  for (let i = 0; i < count; i++) {
    const [first, second] = i % 2 === 0 ? [runA, runB] : [runB, runA];
    const one = first();
    const two = second();
    const [x, y] = i % 2 === 0 ? [one, two] : [two, one];
    a.push(x);
    b.push(y);
    ratios.push(y.ms / x.ms);
    if (x.cpuMs !== null && y.cpuMs !== null && x.cpuMs > 0) cpuRatios.push(y.cpuMs / x.cpuMs);
  }
  const side = (label, runs) => {
    const mbs = runs.map((run) => run.mb).filter((mb) => mb !== null);
    const cpus = runs.map((run) => run.cpuMs).filter((cpu) => cpu !== null);
    const result = { label, median: median(runs.map((run) => run.ms)), min: Math.min(...runs.map((run) => run.ms)), max: Math.max(...runs.map((run) => run.ms)), mb: mbs.length === 0 ? null : median(mbs), cpu: cpus.length === 0 ? null : median(cpus) };
    console.log(`${label.padEnd(52)} median ${result.median.toFixed(0).padStart(6)} ms  (min ${result.min.toFixed(0)}, max ${result.max.toFixed(0)}${result.mb === null ? "" : `, peak ${result.mb.toFixed(0)} MB`}${result.cpu === null ? "" : `, CPU ${result.cpu.toFixed(0)} ms`})`);
    return result;
  };
  return { a: side(labelA, a), b: side(labelB, b), ratio: median(ratios), cpuRatio: cpuRatios.length === 0 ? null : median(cpuRatios) };
}

/** The floor script: the same browser, started by a plain puppeteer-core script, one trivial page printed to PDF. */
function writeFloorScript(folder, browserPath) {
  const puppeteerEntry = createRequire(join(root, "package.json")).resolve("puppeteer-core");
  const path = join(folder, "floor.cjs");
  writeFileSync(
    path,
    `const puppeteer = require(${JSON.stringify(puppeteerEntry)});
const { mkdtempSync, rmSync } = require("node:fs");
const { join } = require("node:path");
const { tmpdir } = require("node:os");
(async () => {
  const userDataDir = mkdtempSync(join(tmpdir(), "firephase-floor-"));
  const browser = await puppeteer.launch({ executablePath: ${JSON.stringify(browserPath)}, headless: true, userDataDir, args: ${JSON.stringify(BROWSER_ARGS)} });
  const page = await browser.newPage();
  await page.setContent("<!DOCTYPE html><p>floor</p>", { waitUntil: "load" });
  await page.pdf({ format: "A4" });
  await browser.close();
  rmSync(userDataDir, { recursive: true, force: true });
})().catch((error) => { console.error(error); process.exit(1); });
`,
  );
  return path;
}

/**
 * The print floor: the same plain script, but printing the briefing's own HTML (saved once with
 * `brief --html`) with the options `brief` prints with (A4, tagged, background, the page footer with
 * its embedded font): what printing this document costs by itself, with nothing computed.
 */
function writePrintFloorScript(folder, browserPath, htmlPath, footerFontCss, name = "print-floor.cjs") {
  const puppeteerEntry = createRequire(join(root, "package.json")).resolve("puppeteer-core");
  const path = join(folder, name);
  const footerTemplate =
    `<style>${footerFontCss}</style><div style="font-family:'Source Sans 3',sans-serif;font-size:8pt;width:100%;margin:0 15mm;display:flex;justify-content:space-between;">` +
    `<span>floor</span><span>page <span class="pageNumber"></span> of <span class="totalPages"></span></span></div>`;
  writeFileSync(
    path,
    `const puppeteer = require(${JSON.stringify(puppeteerEntry)});
const { mkdtempSync, readFileSync, rmSync, writeFileSync } = require("node:fs");
const { join } = require("node:path");
const { tmpdir } = require("node:os");
(async () => {
  const html = readFileSync(${JSON.stringify(htmlPath)}, "utf8");
  const userDataDir = mkdtempSync(join(tmpdir(), "firephase-floor-"));
  const browser = await puppeteer.launch({ executablePath: ${JSON.stringify(browserPath)}, headless: true, userDataDir, args: ${JSON.stringify(BROWSER_ARGS)} });
  const page = await browser.newPage();
  await page.setJavaScriptEnabled(false);
  await page.setContent(html, { waitUntil: "load" });
  const pdf = await page.pdf({ format: "A4", printBackground: true, tagged: true, displayHeaderFooter: true, headerTemplate: "<span></span>",
    footerTemplate: ${JSON.stringify(footerTemplate)}, margin: { top: "14mm", right: "15mm", bottom: "16mm", left: "15mm" } });
  writeFileSync(join(userDataDir, "out.pdf"), pdf);
  await browser.close();
  rmSync(userDataDir, { recursive: true, force: true });
})().catch((error) => { console.error(error); process.exit(1); });
`,
  );
  return path;
}

/** The briefing's HTML with every chart emptied: each <svg> keeps its own box (so the pages break as before) but draws nothing. */
function withoutCharts(html) {
  return html.replace(/(<svg\b[^>]*>)[\s\S]*?<\/svg>/g, "$1</svg>");
}

/**
 * Write `count` regions generated from the demo into `folder` (r01, r02, …): each a copy of the
 * demo with its own seed and name, and every 20th fire event left out starting at its own offset,
 * so their records, odds and resamplings differ. Returns the folder names.
 */
function batchRegions(source, folder, count) {
  const names = [];
  const events = readFileSync(join(source, "fire-events.csv"), "utf8").replace(/^\uFEFF/, "").trim().split(/\r?\n/);
  for (let k = 1; k <= count; k++) {
    const name = `r${String(k).padStart(2, "0")}`;
    const target = join(folder, name);
    cpSync(source, target, { recursive: true, dereference: true });
    rmSync(join(target, "issued"), { recursive: true, force: true });
    const region = JSON.parse(readFileSync(join(source, "region.json"), "utf8"));
    region.name = `Bench unit ${k} (generated from the invented demo)`;
    region.seed = 1000 + k;
    writeFileSync(join(target, "region.json"), `${JSON.stringify(region, null, 2)}\n`);
    const kept = [events[0], ...events.slice(1).filter((_, i) => (i + k) % 20 !== 0)];
    writeFileSync(join(target, "fire-events.csv"), `${kept.join("\n")}\n`);
    names.push(name);
  }
  return names;
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

const headline = [];
try {
  const browser = await findBrowser({ env: process.env });
  console.log(`firephase bench — Node ${process.version}, browser ${browser.executablePath} (${browser.source})`);
  // The demo as a scratch copy: briefs keep nothing in demo-region/ and replace only their own files.
  const demoCopy = join(scratch, "demo-region");
  cpSync(demo, demoCopy, { recursive: true, dereference: true });
  rmSync(join(demoCopy, "issued"), { recursive: true, force: true });
  const briefArgs = (regions, extra) => [BIN, "brief", ...regions, "--issued", "2027-03-10", "--no-keep", "--force", "--browser", browser.executablePath, ...extra];
  let single = null;
  if (SECTIONS.has("check")) {
    console.log(`\nCold start: whole processes, ${PAIRS} alternating pairs`);
    const check = pairs("node -e 0", () => wholeProcess(["-e", "0"], scratch), "firephase check demo-region", () => wholeProcess([BIN, "check", demoCopy], scratch), PAIRS);
    const version = pairs("node -e 0", () => wholeProcess(["-e", "0"], scratch), "firephase --version", () => wholeProcess([BIN, "--version"], scratch), Math.max(3, Math.ceil(PAIRS / 2)));
    headline.push(
      `check demo-region ÷ node -e 0: ${check.ratio.toFixed(2)}× (target ≤ 2.5×; ${check.b.median.toFixed(0)} ms against ${check.a.median.toFixed(0)} ms)${check.cpuRatio === null ? "" : `; CPU time ${check.cpuRatio.toFixed(2)}×`}`,
      `--version ÷ node -e 0: ${version.ratio.toFixed(2)}× (${version.b.median.toFixed(0)} ms)`,
    );
  }
  if (SECTIONS.has("brief")) {
    console.log(`\nBrief: whole processes, ${PAIRS} alternating pairs`);
    const floorScript = writeFloorScript(scratch, browser.executablePath);
    const out = join(scratch, "cold.pdf");
    const brief = pairs("browser floor (plain script, trivial page)", () => wholeProcess([floorScript], scratch), "firephase brief demo-region", () => wholeProcess(briefArgs([demoCopy], ["--out", out]), scratch), PAIRS);
    single = brief.b;
    // The same browser printing the briefing's own document: what no computation or load order can remove.
    const htmlPath = join(scratch, "briefing.html");
    wholeProcess(briefArgs([demoCopy], ["--out", join(scratch, "for-html.pdf"), "--html", htmlPath]), scratch);
    const footerFontCss = embeddedFontCss([{ weight: 400, style: "normal" }], ["latin"]);
    const printFloorScript = writePrintFloorScript(scratch, browser.executablePath, htmlPath, footerFontCss);
    const printed = pairs("print floor (plain script, the briefing's HTML)", () => wholeProcess([printFloorScript], scratch), "firephase brief demo-region", () => wholeProcess(briefArgs([demoCopy], ["--out", out]), scratch), PAIRS);
    const floorOnly = pairs("browser floor (plain script, trivial page)", () => wholeProcess([floorScript], scratch), "print floor (plain script, the briefing's HTML)", () => wholeProcess([printFloorScript], scratch), Math.max(3, Math.ceil(PAIRS / 2)));
    // The same again with every chart taken out (each <svg> emptied but keeping its box,
    // so the pages break as before): what printing the briefing's text alone costs.
    const textPath = join(scratch, "briefing-text.html");
    writeFileSync(textPath, withoutCharts(readFileSync(htmlPath, "utf8")));
    const textFloorScript = writePrintFloorScript(scratch, browser.executablePath, textPath, footerFontCss, "text-floor.cjs");
    const textOnly = pairs("browser floor (plain script, trivial page)", () => wholeProcess([floorScript], scratch), "text floor (the briefing's HTML, no charts)", () => wholeProcess([textFloorScript], scratch), Math.max(3, Math.ceil(PAIRS / 2)));
    // One more cold brief with its stage timings (FIREPHASE_TIMINGS=1): where the user's wait goes.
    const staged = spawnSync(process.execPath, briefArgs([demoCopy], ["--out", out]), { cwd: scratch, encoding: "utf8", env: { ...process.env, FIREPHASE_TIMINGS: "1" } });
    const stages = [...(staged.stderr ?? "").matchAll(/^firephase: timing (\d+) ms (.+)$/gm)].map((match) => `${match[1].padStart(6)} ms  ${match[2]}`);
    console.log(`\nOne cold brief, time since process start at the end of each stage (FIREPHASE_TIMINGS=1):\n${stages.join("\n")}`);
    headline.push(
      `brief demo-region ÷ browser floor: ${brief.ratio.toFixed(2)}× (target ≤ 1.5×; ${brief.b.median.toFixed(0)} ms against ${brief.a.median.toFixed(0)} ms)${brief.cpuRatio === null ? "" : `; CPU time of the node process ${brief.cpuRatio.toFixed(2)}×`}`,
      `  of which printing the briefing's own ${pdfPages(out)}-page document: print floor ÷ browser floor ${floorOnly.ratio.toFixed(2)}× (${floorOnly.b.median.toFixed(0)} ms against ${floorOnly.a.median.toFixed(0)} ms)`,
      `  and its text alone, every chart taken out: text floor ÷ browser floor ${textOnly.ratio.toFixed(2)}× (${textOnly.b.median.toFixed(0)} ms against ${textOnly.a.median.toFixed(0)} ms)`,
      `  brief demo-region ÷ print floor: ${printed.ratio.toFixed(2)}× (${printed.b.median.toFixed(0)} ms against ${printed.a.median.toFixed(0)} ms): what reading, computing and rendering add to printing the document`,
    );
  }
  if (SECTIONS.has("batch")) {
    const count = 20;
    const batchFolder = join(scratch, "batch");
    mkdirSync(batchFolder);
    const names = batchRegions(demo, batchFolder, count);
    const outDir = join(batchFolder, "out");
    mkdirSync(outDir);
    console.log(`\nBatch: ${count} regions generated from the demo, one process, one browser`);
    if (single === null) {
      const singleRuns = [0, 1, 2].map(() => wholeProcess(briefArgs([join(batchFolder, names[0])], ["--out", join(scratch, "single.pdf")]), scratch));
      single = { median: median(singleRuns.map((run) => run.ms)) };
    }
    const runs = [0, 1].map(() => wholeProcess(briefArgs(names, ["--out-dir", outDir]), batchFolder));
    const batch = median(runs.map((run) => run.ms));
    const perMinute = (count * 60_000) / batch;
    const marginal = (batch - single.median) / (count - 1);
    console.log(`${`brief of ${count} regions`.padEnd(52)} median ${batch.toFixed(0).padStart(6)} ms  (${runs.length} runs${runs[0].mb === null ? "" : `, peak ${median(runs.map((run) => run.mb)).toFixed(0)} MB`})`);
    headline.push(
      `batch of ${count}: ${perMinute.toFixed(1)} regions per minute (${(perMinute * 60).toFixed(0)} per hour); marginal cost ${marginal.toFixed(0)} ms per region = ${(marginal / single.median).toFixed(2)}× one whole brief (${single.median.toFixed(0)} ms)`,
    );
  }
  if (!SECTIONS.has("detail")) throw new Error("skip-detail");
  console.log("\nDetail: in-process");
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
  await timed("hindcast demo: curve rule + 99 shuffles", Math.max(1, Math.ceil(REPEATS / 2)), () =>
    runHindcast({ ...demoHindcast, permutations: 99, curvePermutations: 99, bootstrapResamples: 0 }),
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
  console.log(`in-process brief / floor: ${(brief.median / floor.median).toFixed(2)}×; brief − floor = ${(brief.median - floor.median).toFixed(0)} ms`);
} catch (error) {
  if (!(error instanceof Error && error.message === "skip-detail")) throw error;
} finally {
  rmSync(scratch, { recursive: true, force: true });
  if (headline.length > 0) console.log(`\nHeadline (whole processes, medians of alternating pairs)\n${headline.map((line) => `  ${line}`).join("\n")}`);
}
