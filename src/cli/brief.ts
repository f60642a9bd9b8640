import { mkdir, readFile, rmdir, stat } from "node:fs/promises";
import { fileURLToPath } from "node:url";
import { basename, isAbsolute, join, resolve } from "node:path";
import { Command } from "commander";
import { escapeHtml } from "../briefing/escapeHtml.js";
import { BrowserNotFoundError, findBrowser } from "../briefing/findBrowser.js";
// Heavy modules are imported inside runBrief, after the browser launch has begun (briefModules.ts).
import type { HtmlPrinter, PaperSize, PrintOptions } from "../briefing/printPdf.js";
import { briefModules } from "./briefModules.js";
import { UsageError } from "./errors.js";
import { handleError } from "./handleError.js";
import { writeErr, writeOut } from "./terminalText.js";
import { addOutlookOptions, resolveOutlookRequest } from "./outlookRequest.js";
import { firephaseVersion } from "./version.js";
import { jsonText } from "./printJson.js";
import type { Review, SinceLastBriefing } from "../review/types.js";
import type { Calibration } from "../calibrate/types.js";
import type { Workspace } from "../workspace/types.js";
import { checkOutputTargets, OutputPathError, outputNameProblem, realTarget, writeFilesAtomic, type FileToWrite } from "./writeFileAtomic.js";
import { stageTimer } from "./stageTimings.js";

/** Options of `firephase brief`, as commander parses them. */
export interface BriefOptions {
  readonly values?: string | readonly string[];
  readonly issued?: string;
  readonly season?: string;
  readonly out?: string;
  readonly html?: string;
  readonly paper?: string;
  readonly browser?: string;
  /** `--force`: replace an existing PDF, HTML or kept outlook. */
  readonly force?: boolean;
  /** `--no-keep` sets this false: do not keep the outlook in `<region>/issued/`. */
  readonly keep?: boolean;
  /** `--out-dir`: folder for the default-named PDF (default: the working folder); not with `--out`. */
  readonly outDir?: string;
}

/** What `brief` needs from the process; tests pass their own. */
export interface BriefContext {
  /** Folder that relative --out/--html paths and the default output name refer to. */
  readonly cwd: string;
  /** The clock: today's local date for the issue date, and the moment the briefing is made (`madeAt`). */
  readonly today: Date;
  readonly env: Readonly<Record<string, string | undefined>>;
  /** Path of SAFETY.md, printed in the appendix (default: the package's own). */
  readonly safetyPath?: string;
  /** A printer shared by several briefings (a batch): used as given, never launched or closed here. */
  readonly printer?: HtmlPrinter;
}

/** The files a briefing run wrote, and the outlook's notes for the person running it. */
export interface BriefResult {
  readonly pdfPath: string;
  readonly htmlPath: string | null;
  /** The kept outlook (`<region>/issued/<season>-<issue date>.json`), or null with `--no-keep`. */
  readonly keptPath: string | null;
  readonly pages: number | null;
  /** The outlook's plain-language warnings (also printed on page 1), for stderr. */
  readonly notes: readonly string[];
  /** The outlook as `outlook --json` prints it for the same request (a batch's overview reads it). */
  readonly outlook?: unknown;
}

/** SAFETY.md of the package (two folders up from src/cli and dist/cli). */
export const PACKAGE_SAFETY_PATH = fileURLToPath(new URL("../../SAFETY.md", import.meta.url));

/** Page count of a PDF: the largest /Count of its page-tree nodes (the root's); null if none is found. */
function pdfPageCount(pdf: Uint8Array): number | null {
  const counts = [...Buffer.from(pdf).toString("latin1").matchAll(/\/Count\s+(\d+)/g)].map((match) => Number(match[1]));
  return counts.length === 0 ? null : Math.max(...counts);
}

/**
 * A path as the user typed it when the command runs in the process's own working folder (so
 * messages read like the other commands'), else joined with `cwd`; absolute paths stay as they are.
 */
function located(path: string, cwd: string): string {
  return isAbsolute(path) || resolve(cwd) === process.cwd() ? path : join(cwd, path);
}

/** A promise settled after `ms` milliseconds (a timer, so the event loop turns and I/O callbacks run). */
const pause = (ms: number): Promise<void> => new Promise((resolvePause) => setTimeout(resolvePause, ms));

/** Output-path problems are usage errors: `cannot write <path>: <reason>`, exit 2. */
async function outputChecked<T>(work: () => Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (error) {
    if (error instanceof OutputPathError) throw new UsageError(error.message);
    throw error;
  }
}

const FORCE_HINT = "give --force to replace it";

/** `--out` must name a .pdf file and `--html` an .html or .htm file (any letter case). */
function checkOutputNames(options: BriefOptions): void {
  for (const [flag, name] of [["--out", options.out], ["--html", options.html]] as const) {
    if (name === undefined) continue;
    if (name.trim() === "") throw new UsageError(`${flag} is empty: give a file name${flag === "--out" ? " ending in .pdf" : ""}`);
    const problem = outputNameProblem(name);
    if (problem !== null) throw new UsageError(`cannot write ${name}: ${problem}`);
  }
  if (options.out !== undefined && options.out.trim() !== "" && !/\.pdf$/i.test(options.out)) {
    throw new UsageError(`--out must name a .pdf file (found "${options.out}")`);
  }
  if (options.html !== undefined && options.html.trim() !== "" && !/\.html?$/i.test(options.html)) {
    throw new UsageError(`--html must name an .html or .htm file (found "${options.html}")`);
  }
}

/**
 * Name of the briefing PDF when `--out` is not given: `briefing-<region folder>-<season>-<issue
 * date>.pdf`, so each season and each issue keeps its own file.
 *
 * @example
 * defaultBriefingName("demo-region", 2027, "2027-03-10"); // => "briefing-demo-region-2027-2027-03-10.pdf"
 */
export function defaultBriefingName(regionFolder: string, season: number, issued: string): string {
  return `briefing-${regionFolder}-${season}-${issued}.pdf`;
}

/**
 * Where `brief` keeps the outlook it issued: `<region>/issued/<season>-<issue date>.json`.
 *
 * @example
 * keptOutlookPath("demo-region", 2027, "2027-03-10"); // => "demo-region/issued/2027-2027-03-10.json"
 */
export function keptOutlookPath(region: string, season: number, issued: string): string {
  return join(region, "issued", `${season}-${issued}.json`);
}

/**
 * The region's memory for a briefing: the review of the outlooks kept so far (null when none is
 * kept) and what changed since the most recent kept outlook of the same or the previous season
 * (null when there is none). The outlook being issued is left out of both, also when `--force`
 * replaces its kept file.
 *
 * @param workspace - the loaded region
 * @param calibration - its calibration
 * @param outlookText - the outlook being issued, as `outlook --json` prints it
 * @param keptTarget - where it will be kept (null with --no-keep)
 * @returns the review and the changes for `buildBriefingView`
 */
export async function briefingMemory(
  workspace: Workspace,
  calibration: Calibration,
  outlookText: string,
  keptTarget: string | null,
): Promise<{ readonly review: Review | null; readonly sinceLast: SinceLastBriefing | null }> {
  const { readKeptOutlooks, reviewRegion, sinceLastBriefing, readKeptOutlook } = await briefModules();
  const read = await readKeptOutlooks(workspace);
  const earlier = keptTarget === null ? read.kept : read.kept.filter((kept) => resolve(kept.file) !== resolve(keptTarget));
  const review = earlier.length === 0 && read.problems.length === 0 ? null : reviewRegion(workspace, calibration, { kept: earlier, problems: read.problems });
  const sinceLast = sinceLastBriefing(readKeptOutlook(outlookText, keptTarget ?? "this outlook"), earlier);
  return { review, sinceLast };
}

/**
 * The rehearsal print for `PdfPrinter.warmUp`, or none when it cannot be made: a rehearsal is only a head start,
 * and a briefing that cannot be made fails with its own message later.
 *
 * @example
 * rehearsalOf(() => { throw new Error("no style sheet"); }); // => undefined
 */
export function rehearsalOf(make: () => { readonly html: string; readonly options: PrintOptions }): { readonly html: string; readonly options: PrintOptions } | undefined {
  try {
    return make();
  } catch {
    return undefined;
  }
}

function paperOption(value: string | undefined): PaperSize {
  if (value === undefined) return "a4";
  const lower = value.toLowerCase();
  if (lower === "a4" || lower === "letter") return lower;
  throw new UsageError(`--paper must be a4 or letter (got "${value}")`);
}

/**
 * Make the dated PDF briefing of a region: load, calibrate, build the outlook with its
 * hindcast, render the HTML and print it. The browser starts before the computation so both
 * run together; one page prints the document. Files are written only at the end, atomically
 * (a failure anywhere leaves no file at --out and no temporary file).
 *
 * Default output: `briefing-<region folder name>-<issue date>.pdf` in `context.cwd`.
 *
 * Output locations are checked before any work and again before printing: `--out` and `--html`
 * naming one file, a missing folder or a target that is a folder are usage errors
 * (`cannot write <path>: <reason>`). The region path is passed on as typed when `context.cwd` is
 * the process's working folder, so error messages name files as the user wrote them.
 *
 * @param region - region folder.
 * @param options - the command's options (see {@link BriefOptions}).
 * @param context - working folder, today's date, environment (FIREPHASE_BROWSER).
 * @returns the absolute paths written, the page count and the outlook's notes (for stderr).
 * @throws InputError for bad region data, UsageError for bad options, output paths that cannot be
 *   written or no usable browser.
 * @example
 * await runBrief("demo-region", { out: "brief.pdf" }, { cwd: process.cwd(), today: new Date(), env: process.env });
 */
export async function runBrief(region: string, options: BriefOptions, context: BriefContext): Promise<BriefResult> {
  const mark = stageTimer(context.env);
  mark("brief started");
  const paper = paperOption(options.paper);
  checkOutputNames(options);
  const force = options.force === true;
  const keep = options.keep !== false;
  const replace = { replace: force, hint: FORCE_HINT };
  const outGiven = options.out === undefined ? null : located(options.out, context.cwd);
  const htmlGiven = options.html === undefined ? null : located(options.html, context.cwd);
  if (outGiven !== null && htmlGiven !== null && resolve(outGiven) === resolve(htmlGiven)) {
    throw new UsageError(`--out and --html name the same file (${htmlGiven}): give the HTML another name`);
  }
  // Bad output locations fail before any work is done.
  await outputChecked(() => checkOutputTargets([outGiven, htmlGiven].filter((path): path is string => path !== null), replace));
  if (options.outDir !== undefined && outGiven !== null) throw new UsageError("--out and --out-dir cannot be given together: --out names the PDF itself");
  // --out-dir is made (mkdir -p) before any work; a batch has made it already.
  if (options.outDir !== undefined && context.printer === undefined) await (await import("./briefBatch.js")).ensureOutDir(options.outDir, context.cwd);
  // Start the browser now (unless a batch shares one): it launches while the modules load and the statistics are computed.
  // Resolves when the browser program is about to be started (its library loaded, the program found), so
  // the computation below can let it start first: the computation holds this thread, and a launch that has
  // not yet spawned the browser would wait behind it instead of running beside it.
  let launching: () => void = () => undefined;
  const aboutToLaunch = new Promise<void>((resolveLaunching) => {
    launching = resolveLaunching;
  });
  const launched =
    context.printer !== undefined
      ? null
      : findBrowser({ explicit: options.browser, env: context.env })
          .then(async (browser) => {
            const { PdfPrinter } = await import("../briefing/printPdf.js");
            launching();
            mark("browser launching");
            return PdfPrinter.launch(browser);
          })
          .then(async (printer) => {
            mark("browser started");
            try {
              // A rehearsal print with the briefing's style sheet, done while the statistics are computed.
              const modules = await briefModules();
              await printer.warmUp(rehearsalOf(() => ({ html: modules.rehearsalHtml(), options: { paper, footerHtml: "", footerFontCss: modules.embeddedFontCss([{ weight: 400, style: "normal" }], ["latin"]) } })));
              mark("browser rehearsed");
            } catch (error) {
              await printer.close();
              throw error;
            }
            return printer;
          });
  launched?.catch(() => undefined); // observed below; never an unhandled rejection
  const printerPromise: Promise<HtmlPrinter> = launched ?? Promise.resolve(context.printer as HtmlPrinter);
  try {
    const { loadWorkspace, calibrationBasis, runCalibration, startHindcastBeside, buildOutlookBeside, toOutlookJson, buildBriefingView, embeddedFontCss, renderBriefingHtml, progressReporter } =
      await briefModules();
    mark("modules loaded");
    const workspace = await loadWorkspace(located(region, context.cwd));
    mark("region read");
    // Never overwrite the region's own inputs with a briefing (real paths: links resolved).
    const inputs = await Promise.all(workspace.files.map(async (file) => ({ file, real: await realTarget(resolve(workspace.root, file.path)) })));
    for (const target of [outGiven, htmlGiven]) {
      if (target === null) continue;
      const real = await realTarget(target);
      const input = inputs.find((entry) => entry.real === real);
      if (input !== undefined) throw new UsageError(`cannot write ${target}: it is the region's input file ${input.file.path}`);
    }
    const request = resolveOutlookRequest(workspace, options, context.today);
    const shownRegion = workspace.shownRoot ?? located(region, context.cwd);
    const pdfTarget = outGiven ?? located(join(options.outDir ?? "", defaultBriefingName(basename(workspace.root), request.season, request.issued)), context.cwd);
    const keptTarget = keep ? keptOutlookPath(shownRegion, request.season, request.issued) : null;
    const issuedFolder = join(workspace.root, "issued");
    const issuedFolderExists = await stat(issuedFolder).then(
      (found) => {
        if (!found.isDirectory()) throw new UsageError(`cannot keep the outlook: ${join(shownRegion, "issued")} is not a folder (give --no-keep to skip keeping)`);
        return true;
      },
      () => false,
    );
    const targets = [pdfTarget, ...(htmlGiven === null ? [] : [htmlGiven])];
    await outputChecked(() => checkOutputTargets(targets, replace));
    if (keptTarget !== null && issuedFolderExists) {
      const kept = await stat(keptTarget).catch(() => null);
      if (kept !== null && !force) {
        throw new UsageError(
          `the outlook of the ${request.season} season issued ${request.issued} is already kept in ${keptTarget}; give --force to replace it, or --no-keep`,
        );
      }
      await outputChecked(() => checkOutputTargets([...targets, keptTarget], { replace: true }));
    }
    // A browser that has already failed to start ends the run now, not after the computation.
    if (launched !== null) {
      await Promise.race([launched.then(() => undefined), new Promise<void>((resolveNow) => setImmediate(resolveNow))]).catch((error: unknown) => {
        throw error instanceof BrowserNotFoundError ? new UsageError(error.message) : error;
      });
    }
    // The hindcast starts in its worker threads now, from the calibration years alone, and runs while the
    // browser starts and the rest is calibrated here.
    const basis = calibrationBasis(workspace);
    const hindcast = startHindcastBeside(workspace, { years: basis.period.years, activity: basis.calibrationActivity }, request);
    let calibration: Calibration;
    try {
      if (launched !== null) {
        // Let the launch reach the point where the browser process runs (a few turns of the event loop; at
        // most 50 ms, and not at all after a failed launch), so it starts up on its own during the computation.
        await Promise.race([aboutToLaunch.then(() => pause(5)).then(() => pause(5)), launched.then(() => undefined), pause(50)]).catch(() => undefined);
        mark("browser process started");
        // A launch that failed meanwhile ends the run now, as above.
        await Promise.race([launched.then(() => undefined), new Promise<void>((resolveNow) => setImmediate(resolveNow))]).catch((error: unknown) => {
          throw error instanceof BrowserNotFoundError ? new UsageError(error.message) : error;
        });
      }
      calibration = runCalibration(workspace, { onProgress: progressReporter() }, basis);
    } catch (error) {
      hindcast.stop();
      throw error;
    }
    mark("calibrated");
    const outlook = await buildOutlookBeside(workspace, calibration, request, mark, hindcast);
    mark("outlook with its hindcast");
    const safetyPath = context.safetyPath ?? PACKAGE_SAFETY_PATH;
    let safetyMarkdown: string;
    try {
      safetyMarkdown = await readFile(safetyPath, "utf8");
    } catch {
      throw new Error(`cannot read ${safetyPath}: the briefing prints its cautions and must not be made without them`);
    }
    const madeAt = context.today.toISOString();
    const outlookText = jsonText(toOutlookJson(outlook));
    const { review, sinceLast } = await briefingMemory(workspace, calibration, outlookText, keptTarget);
    const view = buildBriefingView({ workspace, calibration, outlook, toolVersion: firephaseVersion(), safetyMarkdown, paper, madeAt, review, sinceLast });
    mark("view model built");
    const html = renderBriefingHtml(view);
    mark("HTML rendered");
    await outputChecked(() => checkOutputTargets(targets, replace));
    let printer: HtmlPrinter;
    try {
      printer = await printerPromise;
    } catch (error) {
      if (error instanceof BrowserNotFoundError) throw new UsageError(error.message);
      throw error;
    }
    const printed = await printer.print(html, {
      paper,
      footerHtml: escapeHtml(view.footerText),
      footerFontCss: embeddedFontCss([{ weight: 400, style: "normal" }], ["latin"]),
    });
    mark("PDF printed");
    const files: FileToWrite[] = [{ path: pdfTarget, data: printed.pdf }];
    if (htmlGiven !== null) files.push({ path: htmlGiven, data: html });
    if (keptTarget !== null) files.push({ path: keptTarget, data: outlookText });
    let madeFolder = false;
    if (keptTarget !== null && !(await stat(issuedFolder).then(() => true, () => false))) {
      await mkdir(issuedFolder).catch((error: unknown) => {
        throw new UsageError(`cannot keep the outlook: cannot make the folder ${join(shownRegion, "issued")} (${error instanceof Error ? error.message : String(error)}); give --no-keep to skip keeping`);
      });
      madeFolder = true;
    }
    try {
      await outputChecked(() => writeFilesAtomic(files, replace));
    } catch (error) {
      if (madeFolder) await rmdir(issuedFolder).catch(() => undefined);
      throw error;
    }
    mark("files written");
    return {
      pdfPath: resolve(pdfTarget),
      htmlPath: htmlGiven === null ? null : resolve(htmlGiven),
      keptPath: keptTarget === null ? null : resolve(keptTarget),
      pages: pdfPageCount(printed.pdf),
      notes: outlook.warnings.map((warning) => warning.message),
      outlook: toOutlookJson(outlook),
    };
  } finally {
    await launched?.then((printer) => printer.closeNow()).catch(() => undefined);
    mark("browser closed");
  }
}

/**
 * `firephase brief <region> [--values …] [--issued DATE] [--season YEAR] [--out FILE.pdf]
 * [--html FILE.html] [--paper a4|letter] [--browser PATH]`: writes the dated PDF briefing and
 * prints its path.
 *
 * @returns the commander command.
 * @example
 * program.addCommand(briefCommand());
 */
export function briefCommand(): Command {
  return addOutlookOptions(
    new Command("brief")
      .description("write the dated PDF briefing: odds, phases, skill, charts, methods and cautions")
      .argument("<regions...>", "region folder(s) (each holds region.json); several share one browser and get an overview"),
  )
    .option("--out <file>", "PDF to write, ending in .pdf (default: briefing-<region>-<season>-<issue date>.pdf here); one region only")
    .option("--out-dir <folder>", "folder for the PDFs (default names) and, with several regions, the overview (default: here)")
    .option("--html <file>", "also write the briefing as one self-contained HTML file")
    .option("--paper <size>", "a4 or letter", "a4")
    .option("--browser <path>", "Chrome or Chromium to print with (default: FIREPHASE_BROWSER, a system browser, then the bundled one)")
    .option("--force", "replace an existing PDF, HTML or kept outlook of the same name")
    .option("--no-keep", "do not keep this outlook in <region>/issued/ (kept outlooks are what firephase review scores)")
    .action(async (regions: readonly string[], options: BriefOptions) => {
      try {
        if (regions.length > 1) {
          await (await import("./briefBatch.js")).briefBatchAction(regions, options);
          return;
        }
        const region = regions[0] as string;
        const result = await runBrief(region, options, { cwd: process.cwd(), today: new Date(), env: process.env });
        for (const note of result.notes) writeErr(`note: ${note}\n`);
        writeOut(`${result.pdfPath}\n`);
        if (result.htmlPath !== null) writeOut(`${result.htmlPath}\n`);
        if (result.keptPath !== null) writeErr(`note: kept this outlook as ${result.keptPath} (firephase review scores it)\n`);
      } catch (error) {
        handleError(error, undefined, "brief");
      }
    });
}
