import { readFile } from "node:fs/promises";
import { fileURLToPath } from "node:url";
import { basename, isAbsolute, join, resolve } from "node:path";
import { Command } from "commander";
import { buildBriefingView } from "../briefing/buildBriefingView.js";
import { embeddedFontCss } from "../briefing/embeddedFonts.js";
import { escapeHtml } from "../briefing/escapeHtml.js";
import { BrowserNotFoundError, findBrowser } from "../briefing/findBrowser.js";
import { PdfPrinter, type PaperSize } from "../briefing/printPdf.js";
import { renderBriefingHtml } from "../briefing/renderBriefingHtml.js";
import { runCalibration } from "../calibrate/runCalibration.js";
import { buildOutlook } from "../outlook/buildOutlook.js";
import { loadWorkspace } from "../workspace/loadWorkspace.js";
import { progressReporter } from "./calibrate.js";
import { UsageError } from "./errors.js";
import { handleError } from "./handleError.js";
import { addOutlookOptions, resolveOutlookRequest } from "./outlookRequest.js";
import { firephaseVersion } from "./version.js";
import { checkOutputTargets, OutputPathError, writeFilesAtomic, type FileToWrite } from "./writeFileAtomic.js";

/** Options of `firephase brief`, as commander parses them. */
export interface BriefOptions {
  readonly values?: string | readonly string[];
  readonly issued?: string;
  readonly season?: string;
  readonly out?: string;
  readonly html?: string;
  readonly paper?: string;
  readonly browser?: string;
}

/** What `brief` needs from the process; tests pass their own. */
export interface BriefContext {
  /** Folder that relative --out/--html paths and the default output name refer to. */
  readonly cwd: string;
  readonly today: Date;
  readonly env: Readonly<Record<string, string | undefined>>;
  /** Path of SAFETY.md, printed in the appendix (default: the package's own). */
  readonly safetyPath?: string;
}

/** The files a briefing run wrote, and the outlook's notes for the person running it. */
export interface BriefResult {
  readonly pdfPath: string;
  readonly htmlPath: string | null;
  readonly pages: number | null;
  /** The outlook's plain-language warnings (also printed on page 1), for stderr. */
  readonly notes: readonly string[];
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

/** Output-path problems are usage errors: `cannot write <path>: <reason>`, exit 2. */
async function outputChecked<T>(work: () => Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (error) {
    if (error instanceof OutputPathError) throw new UsageError(error.message);
    throw error;
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
  const paper = paperOption(options.paper);
  const outGiven = options.out === undefined ? null : located(options.out, context.cwd);
  const htmlGiven = options.html === undefined ? null : located(options.html, context.cwd);
  if (outGiven !== null && htmlGiven !== null && resolve(outGiven) === resolve(htmlGiven)) {
    throw new UsageError(`--out and --html name the same file (${htmlGiven}): give the HTML another name`);
  }
  // Bad output locations fail before any work is done.
  await outputChecked(() => checkOutputTargets([outGiven, htmlGiven].filter((path): path is string => path !== null)));
  // Start the browser now: it launches while the statistics are computed.
  const printerPromise = findBrowser({ explicit: options.browser, env: context.env })
    .then((browser) => PdfPrinter.launch(browser))
    .then(async (printer) => {
      try {
        await printer.warmUp();
      } catch (error) {
        await printer.close();
        throw error;
      }
      return printer;
    });
  printerPromise.catch(() => undefined); // observed below; never an unhandled rejection
  try {
    const workspace = await loadWorkspace(located(region, context.cwd));
    // Never overwrite the region's own inputs with a briefing.
    for (const target of [outGiven, htmlGiven]) {
      if (target === null) continue;
      const input = workspace.files.find((file) => resolve(workspace.root, file.path) === resolve(target));
      if (input !== undefined) throw new UsageError(`cannot write ${target}: it is the region's input file ${input.path}`);
    }
    const request = resolveOutlookRequest(workspace, options, context.today);
    const calibration = runCalibration(workspace, { onProgress: progressReporter() });
    const outlook = buildOutlook(workspace, calibration, request);
    const safetyPath = context.safetyPath ?? PACKAGE_SAFETY_PATH;
    let safetyMarkdown: string;
    try {
      safetyMarkdown = await readFile(safetyPath, "utf8");
    } catch {
      throw new Error(`cannot read ${safetyPath}: the briefing prints its cautions and must not be made without them`);
    }
    const view = buildBriefingView({ workspace, calibration, outlook, toolVersion: firephaseVersion(), safetyMarkdown, paper });
    const html = renderBriefingHtml(view);
    const pdfTarget = outGiven ?? located(`briefing-${basename(workspace.root)}-${outlook.issued}.pdf`, context.cwd);
    await outputChecked(() => checkOutputTargets(htmlGiven === null ? [pdfTarget] : [pdfTarget, htmlGiven]));
    let printer: PdfPrinter;
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
    const files: FileToWrite[] = [{ path: pdfTarget, data: printed.pdf }];
    if (htmlGiven !== null) files.push({ path: htmlGiven, data: html });
    await outputChecked(() => writeFilesAtomic(files));
    return {
      pdfPath: resolve(pdfTarget),
      htmlPath: htmlGiven === null ? null : resolve(htmlGiven),
      pages: pdfPageCount(printed.pdf),
      notes: outlook.warnings.map((warning) => warning.message),
    };
  } finally {
    await printerPromise.then((printer) => printer.close()).catch(() => undefined);
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
      .argument("<region>", "region folder (holds region.json)"),
  )
    .option("--out <file>", "PDF to write (default: briefing-<region>-<issue date>.pdf here)")
    .option("--html <file>", "also write the briefing as one self-contained HTML file")
    .option("--paper <size>", "a4 or letter", "a4")
    .option("--browser <path>", "Chrome or Chromium to print with (default: FIREPHASE_BROWSER, a system browser, then the bundled one)")
    .action(async (region: string, options: BriefOptions) => {
      try {
        const result = await runBrief(region, options, { cwd: process.cwd(), today: new Date(), env: process.env });
        for (const note of result.notes) process.stderr.write(`note: ${note}\n`);
        process.stdout.write(`${result.pdfPath}\n`);
        if (result.htmlPath !== null) process.stdout.write(`${result.htmlPath}\n`);
      } catch (error) {
        handleError(error);
      }
    });
}
