/**
 * `firephase brief <region> <region> …`: many regions in one run with one browser.
 *
 * The browser starts once, before anything else. Regions are briefed in the order given, each
 * exactly as `brief <region>` would (same PDF name, same kept outlook, same checks), but the next
 * region's computation starts as soon as the previous one hands its HTML to the printer, so the
 * browser prints one region while the next is computed (at most two briefings wait for the
 * printer at a time). A region that fails is reported with its problems and the others go on.
 * At the end an overview (CSV and a one-page PDF) lists every region's headline odds.
 */
import { availableParallelism } from "node:os";
import { mkdir, readFile, stat } from "node:fs/promises";
import type { Worker } from "node:worker_threads";
import { basename, dirname, isAbsolute, join, normalize, resolve } from "node:path";
import { findBrowser } from "../briefing/findBrowser.js";
import type { HtmlPrinter, PdfPrinter, PrintOptions, PrintResult } from "../briefing/printPdf.js";
import { PACKAGE_SAFETY_PATH, rehearsalOf, runBrief, type BriefContext, type BriefOptions, type BriefResult } from "./brief.js";
import { UsageError } from "./errors.js";
import { handleError } from "./handleError.js";
import { firephaseVersion } from "./version.js";
import type { BriefWorkerData, FromBriefWorker, ToBriefWorker } from "./briefWorker.js";
import { checkOutputTargets, OutputPathError, writeFilesAtomic } from "./writeFileAtomic.js";

/** How one region of a batch ended. */
export type BatchRegionOutcome =
  | { readonly region: string; readonly ok: true; readonly result: BriefResult; readonly seconds: number }
  | { readonly region: string; readonly ok: false; readonly problems: readonly string[]; readonly seconds: number };

/** What a batch wrote. */
export interface BriefBatchResult {
  /** One outcome per region, in the order given. */
  readonly regions: readonly BatchRegionOutcome[];
  /** The overview PDF and CSV (absolute paths), or null when no region was briefed. */
  readonly overviewPdf: string | null;
  readonly overviewCsv: string | null;
  /** How many regions failed. */
  readonly failed: number;
}

/** What a batch needs beyond a single briefing's context. */
export interface BriefBatchContext extends BriefContext {
  /** Called with each region's progress line (default: none). */
  readonly onProgress?: (line: string) => void;
}

/**
 * File names of the overview, beside the briefings: `briefing-overview-<season>-<issue date>`
 * with `.pdf` and `.csv`, from the first region briefed (regions of one run normally share both).
 *
 * @example
 * overviewNames(2027, "2027-03-10"); // => { pdf: "briefing-overview-2027-2027-03-10.pdf", csv: "briefing-overview-2027-2027-03-10.csv" }
 */
export function overviewNames(season: number, issued: string): { readonly pdf: string; readonly csv: string } {
  const stem = `briefing-overview-${season}-${issued}`;
  return { pdf: `${stem}.pdf`, csv: `${stem}.csv` };
}

/**
 * The lines `brief <region>` would print on stderr for an error (file:line problems, or firephase: …).
 *
 * @param error - what a region's briefing threw.
 * @returns the lines, without line ends.
 * @example
 * problemLines(new UsageError("--paper must be a4 or letter")); // => ["firephase: --paper must be a4 or letter"]
 */
export function problemLines(error: unknown): string[] {
  const lines: string[] = [];
  const saved = process.exitCode;
  handleError(error, { writeErr: (text) => lines.push(...text.split("\n").filter((line) => line !== "")), debug: process.env.FIREPHASE_DEBUG === "1" });
  process.exitCode = saved;
  return lines;
}

/** Refuse options that name one file, duplicate regions and regions whose briefings would share a name. */
function checkBatchUsage(regions: readonly string[], options: BriefOptions, cwd: string): void {
  if (options.out !== undefined) {
    throw new UsageError("--out names one PDF: with several regions give --out-dir FOLDER (each region's PDF keeps its own name there)");
  }
  if (options.html !== undefined) throw new UsageError("--html writes one region's HTML: give it with one region only");
  const seen = new Map<string, string>();
  const names = new Map<string, string>();
  for (const region of regions) {
    const full = resolve(cwd, region);
    const earlier = seen.get(full);
    if (earlier !== undefined) throw new UsageError(`the region ${region} is given twice (also as ${earlier})`);
    seen.set(full, region);
    const name = basename(full);
    const sameName = names.get(name);
    if (sameName !== undefined) {
      throw new UsageError(`the regions ${sameName} and ${region} have the same folder name ${name}, so their briefings would have the same file name: brief them in separate runs with different --out-dir folders`);
    }
    names.set(name, region);
  }
}

/**
 * Why `mkdir -p` of the `--out-dir` folder failed, in words.
 *
 * @param error - what `mkdir` threw.
 * @param blocking - the nearest existing folder or file on the way to the folder (see
 *   {@link nearestExisting}), as the user would write it; null when none was found.
 * @returns e.g. "briefings is not a folder (a file is in the way)", "no permission to make folders in /srv".
 * @example
 * outDirProblem(Object.assign(new Error("x"), { code: "EACCES" }), { shown: "/srv", isFolder: true }); // => "no permission to make folders in /srv"
 */
export function outDirProblem(error: unknown, blocking: { readonly shown: string; readonly isFolder: boolean } | null): string {
  const code = (error as NodeJS.ErrnoException | null)?.code;
  if (blocking !== null && !blocking.isFolder && (code === "EEXIST" || code === "ENOTDIR")) return `${blocking.shown} is not a folder (a file is in the way)`;
  if (code === "EACCES" || code === "EPERM") return `no permission to make folders${blocking === null ? "" : ` in ${blocking.shown}`}`;
  if (code === "EROFS") return "the file system is read-only";
  if (code === "ENOSPC") return "the disk is full";
  if (code === "ENAMETOOLONG") return "the name is too long";
  return error instanceof Error ? error.message : String(error);
}

/** The nearest existing path at or above `folder` (typed relative to `cwd`), written as typed, and whether it is a folder. */
async function nearestExisting(folder: string, cwd: string): Promise<{ readonly shown: string; readonly isFolder: boolean } | null> {
  let typed = normalize(folder);
  for (;;) {
    const found = await stat(resolve(cwd, typed)).catch(() => null);
    if (found !== null) return { shown: typed, isFolder: found.isDirectory() };
    const up = dirname(typed);
    if (up === typed) return null;
    typed = up;
  }
}

/**
 * Makes the `--out-dir` folder and its missing parents (as `mkdir -p`), before any work.
 *
 * @param outDir - the folder as typed.
 * @param cwd - the folder it is relative to.
 * @returns when the folder exists (it stays when a later step fails, as with `mkdir -p`).
 * @throws UsageError `--out-dir: cannot make the folder DIR: …` naming what is in the way (a file,
 *   no permission, a read-only file system).
 * @example
 * await ensureOutDir("briefings/2027", process.cwd()); // makes briefings/ and briefings/2027/ when neither exists
 */
export async function ensureOutDir(outDir: string, cwd: string): Promise<void> {
  try {
    await mkdir(resolve(cwd, outDir), { recursive: true });
  } catch (error) {
    throw new UsageError(`--out-dir: cannot make the folder ${outDir}: ${outDirProblem(error, await nearestExisting(outDir, cwd))}`);
  }
}

/**
 * Brief several regions with one browser and write the overview.
 *
 * @param regions - region folders (two or more; one works too).
 * @param options - the options of `brief`; `--out` and `--html` are refused (they name one file),
 *   `--out-dir` is where every PDF and the overview go (default `context.cwd`).
 * @param context - as for `runBrief`, plus `onProgress` for the per-region lines.
 * @returns each region's outcome and the overview's paths.
 * @throws UsageError for bad usage of the whole batch (`--out`, a region given twice, two folders
 *   of the same name, an `--out-dir` that cannot be made or written into, an overview that exists
 *   without `--force`, a browser that cannot start);
 *   a region's own problems never throw.
 * @example
 * await runBriefBatch(["north", "south"], { outDir: "out" }, { cwd: process.cwd(), today: new Date(), env: process.env });
 */
export async function runBriefBatch(regions: readonly string[], options: BriefOptions, context: BriefBatchContext): Promise<BriefBatchResult> {
  checkBatchUsage(regions, options, context.cwd);
  const paper = options.paper?.toLowerCase() === "letter" ? "letter" : "a4";
  const outDir = options.outDir ?? ".";
  const shownDir = (name: string): string => {
    const joined = join(outDir, name);
    return isAbsolute(joined) || resolve(context.cwd) === process.cwd() ? joined : join(context.cwd, joined);
  };
  // The folder is made (with its parents, as mkdir -p) and must take files before any work is done.
  await ensureOutDir(outDir, context.cwd);
  try {
    await checkOutputTargets([shownDir("briefing-overview-check.pdf")], { replace: true });
  } catch (error) {
    if (error instanceof OutputPathError) throw new UsageError(`--out-dir: cannot write into ${outDir}: ${error.reason}`);
    throw error;
  }
  // One browser for the whole batch, started now.
  const launching: Promise<PdfPrinter> = findBrowser({ explicit: options.browser, env: context.env }).then(async (found) => {
    const printer = await (await import("../briefing/printPdf.js")).PdfPrinter.launch(found);
    try {
      // A rehearsal print with the briefing's style sheet (see PdfPrinter.warmUp), while the first region is computed.
      const [{ rehearsalHtml }, { embeddedFontCss }] = await Promise.all([import("../briefing/renderBriefingHtml.js"), import("../briefing/embeddedFonts.js")]);
      await printer.warmUp(rehearsalOf(() => ({ html: rehearsalHtml(), options: { paper, footerHtml: "", footerFontCss: embeddedFontCss([{ weight: 400, style: "normal" }], ["latin"]) } })));
    } catch (error) {
      await printer.close();
      throw error;
    }
    return printer;
  });
  let launchFailed = false;
  launching.catch(() => {
    launchFailed = true; // observed below; the regions waiting for it are not reported one by one
  });
  // Progress lines in the order the regions were given: a region that finishes before an earlier one waits for
  // it (threads finish regions out of order, and "[3/3] … [1/3]" would read backwards).
  const finished = new Map<number, BatchRegionOutcome>();
  let nextToReport = 0;
  const report = (outcome: BatchRegionOutcome, position: number): void => {
    finished.set(position, outcome);
    while (finished.has(nextToReport)) {
      const next = finished.get(nextToReport) as BatchRegionOutcome;
      finished.delete(nextToReport);
      if (!launchFailed) context.onProgress?.(progressLine(next, nextToReport, regions.length));
      nextToReport += 1;
    }
  };
  try {
    const threads = batchThreads(regions.length, context.env);
    const outcomes =
      threads > 1 && COMPILED
        ? await briefInWorkers(regions, { ...options, outDir }, context, launching, threads, report)
        : await briefInThread(regions, { ...options, outDir }, context, launching, report);
    await launching; // rethrows a launch failure (BrowserNotFoundError → usage error in the action)
    const { coreCautions, failedOverviewRow, overviewCsv, overviewFooterText, overviewHtml, overviewRowFromOutlook } = await import("../briefing/overview.js");
    const rows = outcomes.map((outcome) =>
      outcome.ok ? overviewRowFromOutlook(outcome.result.outlook, outcome.region, outcome.result.pdfPath) : failedOverviewRow(outcome.region, outcome.problems),
    );
    const failed = outcomes.filter((outcome) => !outcome.ok).length;
    const first = rows.find((row) => row.status === "briefed" && row.season !== null && row.issued !== null);
    if (first === undefined || first.season === null || first.issued === null) return { regions: outcomes, overviewPdf: null, overviewCsv: null, failed };
    const names = overviewNames(first.season, first.issued);
    const pdfTarget = shownDir(names.pdf);
    const csvTarget = shownDir(names.csv);
    const replace = { replace: options.force === true, hint: "give --force to replace it" };
    const safetyPath = context.safetyPath ?? PACKAGE_SAFETY_PATH;
    const safety = await readFile(safetyPath, "utf8").catch(() => {
      throw new Error(`cannot read ${safetyPath}: the overview prints its cautions and must not be made without them`);
    });
    const { embeddedFontCss } = await import("../briefing/embeddedFonts.js");
    const { escapeHtml } = await import("../briefing/escapeHtml.js");
    const html = overviewHtml(rows, {
      cautions: coreCautions(safety),
      madeAt: context.today.toISOString(),
      toolVersion: firephaseVersion(),
      fontCss: embeddedFontCss([{ weight: 400, style: "normal" }, { weight: 600, style: "normal" }], ["latin"]),
    });
    const printed = await (await launching).print(html, {
      paper,
      footerHtml: escapeHtml(overviewFooterText(rows)),
      footerFontCss: embeddedFontCss([{ weight: 400, style: "normal" }], ["latin"]),
    });
    try {
      await writeFilesAtomic(
        [
          { path: pdfTarget, data: printed.pdf },
          { path: csvTarget, data: overviewCsv(rows) },
        ],
        replace,
      );
    } catch (error) {
      if (error instanceof OutputPathError) throw new UsageError(`${error.message} (the overview)`);
      throw error;
    }
    return { regions: outcomes, overviewPdf: resolve(pdfTarget), overviewCsv: resolve(csvTarget), failed };
  } finally {
    await launching.then((printer) => printer.closeNow()).catch(() => undefined);
  }
}

/** The compiled worker script beside this module (under the TypeScript sources it does not exist, and the batch runs in this thread). */
const WORKER_URL = new URL("./briefWorker.js", import.meta.url);
const COMPILED = import.meta.url.endsWith(".js");

/**
 * How many threads compute regions: one per core the process may use (at least one, at most one
 * per region); `FIREPHASE_THREADS` sets it (1 computes every region in the main thread).
 *
 * @example
 * batchThreads(20, {}); // => 2 on a 2-core machine
 */
export function batchThreads(regions: number, env: Readonly<Record<string, string | undefined>>): number {
  const asked = Number(env["FIREPHASE_THREADS"] ?? "");
  const cores = Number.isInteger(asked) && asked >= 1 ? asked : availableParallelism();
  return Math.max(1, Math.min(regions, cores, 16));
}

type Report = (outcome: BatchRegionOutcome, position: number) => void;

/**
 * Every region in this thread: the next region's computation starts as soon as the previous one
 * hands its HTML to the printer (at most two briefings wait for the printer).
 */
async function briefInThread(
  regions: readonly string[],
  options: BriefOptions,
  context: BriefBatchContext,
  launching: Promise<PdfPrinter>,
  report: Report,
): Promise<BatchRegionOutcome[]> {
  let pending = 0;
  let pendingChanged: () => void = () => undefined;
  const outcomes: BatchRegionOutcome[] = new Array(regions.length);
  const tasks: Promise<void>[] = [];
  for (let position = 0; position < regions.length; position++) {
    const region = regions[position] as string;
    let release: () => void = () => undefined;
    const released = new Promise<void>((resolveRelease) => {
      release = resolveRelease;
    });
    const shared: HtmlPrinter = {
      async print(html: string, printOptions: PrintOptions): Promise<PrintResult> {
        pending += 1;
        release(); // this region's computation is done: the next one may start
        try {
          return await (await launching).print(html, printOptions);
        } finally {
          pending -= 1;
          pendingChanged();
        }
      },
    };
    const started = Date.now();
    const task = runBrief(region, options, { ...context, printer: shared }).then(
      (result) => {
        outcomes[position] = { region, ok: true, result, seconds: (Date.now() - started) / 1000 };
      },
      (error: unknown) => {
        outcomes[position] = { region, ok: false, problems: problemLines(error), seconds: (Date.now() - started) / 1000 };
      },
    );
    tasks.push(
      task.then(() => {
        release();
        report(outcomes[position] as BatchRegionOutcome, position);
      }),
    );
    await released;
    // A browser that cannot start stops the batch: no region could be printed.
    await Promise.race([launching.then(() => undefined), new Promise<void>((resolveNow) => setImmediate(resolveNow))]);
    while (pending >= 2) await new Promise<void>((resolveWait) => (pendingChanged = resolveWait));
  }
  await Promise.all(tasks);
  return outcomes;
}

/**
 * Regions computed by `threads` worker threads at once (see briefWorker.ts); this thread prints
 * their HTML on the one browser, in the order it arrives. A worker gets its next region when it
 * hands the previous one to the printer; at most `threads + 1` briefings wait for the printer.
 */
async function briefInWorkers(
  regions: readonly string[],
  options: BriefOptions,
  context: BriefBatchContext,
  launching: Promise<PdfPrinter>,
  threads: number,
  report: Report,
): Promise<BatchRegionOutcome[]> {
  const { Worker } = await import("node:worker_threads");
  const outcomes: BatchRegionOutcome[] = new Array(regions.length);
  const data: BriefWorkerData = {
    options,
    cwd: context.cwd,
    todayMs: context.today.getTime(),
    env: { ...context.env },
    ...(context.safetyPath === undefined ? {} : { safetyPath: context.safetyPath }),
  };
  let next = 0;
  let done = 0;
  let pending = 0;
  const starving: Worker[] = [];
  const printedPositions = new Set<number>();
  const workers: Worker[] = [];
  return await new Promise<BatchRegionOutcome[]>((resolveAll, rejectAll) => {
    let failed = false;
    const fail = (error: unknown): void => {
      if (failed) return;
      failed = true;
      rejectAll(error);
    };
    const handOut = (worker: Worker): void => {
      if (next >= regions.length) return;
      if (pending > threads) {
        starving.push(worker);
        return;
      }
      const position = next++;
      worker.postMessage({ type: "region", position, region: regions[position] as string } satisfies ToBriefWorker);
    };
    const feedStarving = (): void => {
      while (starving.length > 0 && pending <= threads && next < regions.length) handOut(starving.shift() as Worker);
    };
    for (let i = 0; i < threads; i++) {
      const worker = new Worker(WORKER_URL, { workerData: data });
      workers.push(worker);
      worker.on("message", (message: FromBriefWorker) => {
        if (message.type === "print") {
          pending += 1;
          printedPositions.add(message.position);
          handOut(worker); // its computation is done: give it the next region
          launching
            .then((printer) => printer.print(message.html, message.options))
            .then(
              (printed) => worker.postMessage({ type: "printed", id: message.id, pdf: printed.pdf } satisfies ToBriefWorker),
              (error: unknown) => worker.postMessage({ type: "printed", id: message.id, error: error instanceof Error ? error.message : String(error) } satisfies ToBriefWorker),
            )
            .finally(() => {
              pending -= 1;
              feedStarving();
            });
          return;
        }
        outcomes[message.position] = message.outcome;
        report(message.outcome, message.position);
        done += 1;
        if (!printedPositions.has(message.position)) handOut(worker); // it failed before reaching the printer
        if (done === regions.length) {
          for (const each of workers) void each.terminate();
          resolveAll(outcomes);
        }
      });
      worker.on("error", (error) => {
        for (const each of workers) void each.terminate();
        fail(error);
      });
      handOut(worker);
    }
    launching.catch((error: unknown) => {
      for (const each of workers) void each.terminate();
      fail(error);
    });
  });
}

/** `[2/5] north: briefing-north-2027-2027-03-10.pdf, 12 pages (3.1 s)` and its notes, or `[3/5] south: failed (2 problems):` and the problems. */
function progressLine(outcome: BatchRegionOutcome, position: number, count: number): string {
  const head = `[${position + 1}/${count}] ${outcome.region}`;
  if (outcome.ok) {
    const pages = outcome.result.pages === null ? "" : `, ${outcome.result.pages} pages`;
    const notes = outcome.result.notes.map((note) => `\nnote: ${outcome.region}: ${note}`).join("");
    return `${head}: ${basename(outcome.result.pdfPath)}${pages} (${outcome.seconds.toFixed(1)} s)${notes}`;
  }
  return `${head}: failed (${outcome.problems.length} problem${outcome.problems.length === 1 ? "" : "s"}):\n${outcome.problems.map((line) => `  ${line}`).join("\n")}`;
}

/**
 * The action of `brief` with several regions: runs {@link runBriefBatch} with progress lines on
 * stderr, prints each PDF written and then the overview's PDF and CSV on stdout, and sets the
 * exit code to 1 when any region failed.
 *
 * @param regions - the region folders as typed.
 * @param options - the options of `brief`.
 * @returns when done; `process.exitCode` is 1 if a region failed.
 * @throws UsageError for bad usage of the batch, including a browser that cannot start.
 * @example
 * await briefBatchAction(["north", "south"], { outDir: "out" });
 */
export async function briefBatchAction(regions: readonly string[], options: BriefOptions): Promise<void> {
  const { BrowserNotFoundError } = await import("../briefing/findBrowser.js");
  const { writeErr, writeOut } = await import("./terminalText.js");
  let result: BriefBatchResult;
  try {
    result = await runBriefBatch(regions, options, {
      cwd: process.cwd(),
      today: new Date(),
      env: process.env,
      onProgress: (line) => writeErr(`${line}\n`),
    });
  } catch (error) {
    if (error instanceof BrowserNotFoundError) throw new UsageError(error.message);
    throw error;
  }
  for (const outcome of result.regions) {
    if (!outcome.ok) continue;
    writeOut(`${outcome.result.pdfPath}\n`);
  }
  if (result.overviewPdf !== null && result.overviewCsv !== null) {
    writeOut(`${result.overviewPdf}\n${result.overviewCsv}\n`);
  }
  const briefed = result.regions.length - result.failed;
  writeErr(
    `${briefed} of ${result.regions.length} regions briefed` +
      (result.failed > 0 ? `; ${result.failed} failed (listed above)` : "") +
      (result.overviewPdf === null ? "; no overview (no region was briefed)" : "") +
      "\n",
  );
  process.exitCode = result.failed > 0 ? 1 : 0;
}
