/**
 * Printing HTML to PDF with a headless Chromium driven by puppeteer-core.
 *
 * One browser and one page per printer: the CLI starts the browser while the statistics are
 * computed, and a batch of regions prints every briefing with the same page (print calls queue).
 * The page runs no JavaScript and loads nothing: every request other than `data:` URLs is
 * aborted, and the document itself is set with `page.setContent`, so there is no initial request
 * to let through.
 *
 * Nothing is left behind on any exit path. While a printer is open (from the moment its launch
 * begins) the process handles SIGINT, SIGTERM and SIGHUP: it closes every open browser (a close
 * that hangs is cut short by killing the browser's process group), removes the temporary
 * profile folders and exits with the conventional code 128 + signal number (130, 143, 129). A
 * second signal during that cleanup does the rest at once, synchronously, and exits. On any other
 * exit (`process.exit`, an uncaught error) an `exit` listener kills what is still running and
 * removes the folders.
 */
import type { ChildProcess } from "node:child_process";
import { mkdtempSync, readdirSync, readFileSync, rmSync } from "node:fs";
import { constants as osConstants, tmpdir } from "node:os";
import { join } from "node:path";
import puppeteer, { type Browser, type HTTPRequest, type Page, type PDFOptions } from "puppeteer-core";
import { BrowserLaunchError, findBrowser, type FindBrowserOptions, type FoundBrowser } from "./findBrowser.js";

/** Paper sizes the briefing supports. */
export type PaperSize = "a4" | "letter";

/** Options of {@link PdfPrinter.print}. */
export interface PrintOptions {
  readonly paper: PaperSize;
  /**
   * Footer HTML fragment placed left of "page x of y" (already escaped by the caller, e.g. with
   * `escapeHtml`); it runs in the footer's own document, so it carries its own font CSS.
   */
  readonly footerHtml: string;
  /** `@font-face` rules for the footer document (the page's fonts are not visible there). */
  readonly footerFontCss: string;
}

/** The printed document and what the page tried to load. */
export interface PrintResult {
  readonly pdf: Uint8Array;
  /** URLs of every request the page made and that was aborted (none is ever let through). */
  readonly blockedRequests: readonly string[];
}

/** Anything that prints an HTML document to PDF (a {@link PdfPrinter}, or a batch's shared one). */
export interface HtmlPrinter {
  print(html: string, options: PrintOptions): Promise<PrintResult>;
}

/** Command-line switches used for every launch (headless mode is set through puppeteer). */
export const BROWSER_ARGS: readonly string[] = Object.freeze([
  "--no-sandbox",
  "--disable-gpu",
  "--no-first-run",
  "--no-default-browser-check",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
  "--disable-extensions",
  "--disable-default-apps",
  "--mute-audio",
  "--font-render-hinting=none",
]);

/** Prefix of every temporary profile folder (in the system temp folder). */
export const PROFILE_PREFIX = "firephase-browser-";

/**
 * How long a launch may take before the program is judged not to be a browser: a Chromium
 * prints its DevTools address within a second or two even on a busy machine.
 */
export const LAUNCH_TIMEOUT_MS = 20_000;

/** How long a polite `Browser.close()` may take before the process group is killed. */
export const CLOSE_TIMEOUT_MS = 3_000;

/** Page margins in millimetres; the bottom one holds the footer. */
const MARGIN = Object.freeze({ top: "14mm", right: "15mm", bottom: "16mm", left: "15mm" });

/** What `Page.pdf` is given for a document: paper, background colours, tagged PDF, the footer. */
function pdfOptions(options: PrintOptions): PDFOptions {
  const footerTemplate =
    `<style>${options.footerFontCss}</style>` +
    `<div style="font-family:'Source Sans 3',sans-serif;font-size:8pt;color:#4a5058;width:100%;` +
    `margin:0 15mm;display:flex;justify-content:space-between;">` +
    `<span>${options.footerHtml}</span>` +
    `<span>page <span class="pageNumber"></span> of <span class="totalPages"></span></span></div>`;
  return {
    format: options.paper === "letter" ? "Letter" : "A4",
    printBackground: true,
    tagged: true,
    displayHeaderFooter: true,
    headerTemplate: "<span></span>",
    footerTemplate,
    margin: { ...MARGIN },
    preferCSSPageSize: false,
  };
}

/** A browser being launched or running: what must be killed and removed if the process ends. */
interface OpenBrowser {
  readonly userDataDir: string;
  process: ChildProcess | null;
}

const openBrowsers = new Set<OpenBrowser>();
const HANDLED_SIGNALS = ["SIGINT", "SIGTERM", "SIGHUP"] as const;
type HandledSignal = (typeof HANDLED_SIGNALS)[number];
let interruptedBy: HandledSignal | null = null;

/** Exit code of a process ended by `signal`: 128 + its number (SIGINT 130, SIGTERM 143, SIGHUP 129). */
export function signalExitCode(signal: HandledSignal): number {
  return 128 + osConstants.signals[signal];
}

function isRunning(child: ChildProcess | null): boolean {
  return child !== null && child.pid !== undefined && child.exitCode === null && child.signalCode === null;
}

/**
 * Kill, at once, every process of a browser: its process group (puppeteer starts the browser as
 * a group leader) and, on Linux, any process whose command line names the profile folder (this
 * also covers a browser whose launch had not yet reported back).
 */
function killNow(entry: OpenBrowser): void {
  const pid = entry.process?.pid;
  if (pid !== undefined) {
    try {
      process.kill(-pid, "SIGKILL");
    } catch {
      try {
        entry.process?.kill("SIGKILL");
      } catch {
        /* already gone */
      }
    }
  }
  for (const other of processesUsingProfile(entry.userDataDir)) {
    try {
      process.kill(other, "SIGKILL");
    } catch {
      /* already gone */
    }
  }
}

/**
 * Process ids whose command line contains `--user-data-dir=<folder>` (Linux `/proc`; elsewhere
 * an empty list).
 *
 * @param userDataDir - a profile folder path.
 * @returns the matching process ids, excluding this process.
 * @example
 * processesUsingProfile("/tmp/firephase-browser-abc123"); // => [4711, 4722] while that browser runs
 */
export function processesUsingProfile(userDataDir: string): number[] {
  const needle = `--user-data-dir=${userDataDir}`;
  let entries: string[];
  try {
    entries = readdirSync("/proc");
  } catch {
    return [];
  }
  const found: number[] = [];
  for (const name of entries) {
    if (!/^\d+$/.test(name) || Number(name) === process.pid) continue;
    try {
      const args = readFileSync(`/proc/${name}/cmdline`, "latin1").split("\0");
      if (args.includes(needle)) found.push(Number(name));
    } catch {
      /* the process ended meanwhile, or is not ours to read */
    }
  }
  return found;
}

function removeProfile(userDataDir: string): void {
  try {
    rmSync(userDataDir, { recursive: true, force: true, maxRetries: 5, retryDelay: 50 });
  } catch {
    /* nothing more can be done; the folder name carries the prefix for a manual clean-up */
  }
}

/** Synchronous last resort: kill every open browser and remove every profile folder. */
function cleanUpAllNow(): void {
  for (const entry of openBrowsers) {
    killNow(entry);
    removeProfile(entry.userDataDir);
  }
  openBrowsers.clear();
}

function onExit(): void {
  cleanUpAllNow();
}

function onSignal(signal: HandledSignal): void {
  if (interruptedBy !== null) {
    // A second signal while cleaning up: finish the job synchronously and leave.
    cleanUpAllNow();
    process.exit(signalExitCode(interruptedBy));
  }
  interruptedBy = signal;
  const entries = [...openBrowsers];
  const closing = entries.map((entry) => closeEntry(entry, Math.min(CLOSE_TIMEOUT_MS, 1_500)));
  void Promise.allSettled(closing).then(() => {
    // Once more, synchronously: a launch that was under way may have started a process meanwhile.
    for (const entry of entries) openBrowsers.add(entry);
    cleanUpAllNow();
    process.exit(signalExitCode(signal));
  });
}

function register(entry: OpenBrowser): void {
  if (openBrowsers.size === 0) {
    for (const signal of HANDLED_SIGNALS) process.on(signal, onSignal);
    process.on("exit", onExit);
  }
  openBrowsers.add(entry);
}

function unregister(entry: OpenBrowser): void {
  if (!openBrowsers.delete(entry)) return;
  // While an interrupt is being handled, keep the handlers: the process is about to exit.
  if (openBrowsers.size === 0 && interruptedBy === null) {
    for (const signal of HANDLED_SIGNALS) process.off(signal, onSignal);
    process.off("exit", onExit);
  }
}

function delay(ms: number): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, ms).unref());
}

function exited(child: ChildProcess | null, ms: number): Promise<void> {
  if (!isRunning(child) || child === null) return Promise.resolve();
  return Promise.race([new Promise<void>((resolve) => child.once("exit", () => resolve())), delay(ms)]);
}

const politeClosers = new WeakMap<OpenBrowser, () => Promise<void>>();

/** Close politely within `ms` (not at all when `ms` is 0), then kill what still runs and remove the profile folder. */
async function closeEntry(entry: OpenBrowser, ms: number): Promise<void> {
  const polite = politeClosers.get(entry);
  if (polite !== undefined && ms > 0) {
    await Promise.race([polite().catch(() => undefined), delay(ms)]);
  }
  if (isRunning(entry.process)) {
    killNow(entry);
    await exited(entry.process, 2_000);
  } else if (entry.process === null) {
    killNow(entry); // launch never reported back: find it by its profile folder
  }
  removeProfile(entry.userDataDir);
  unregister(entry);
}

/** Control characters shown as escapes so a program's output cannot steer the terminal. */
function visible(text: string): string {
  return text.replace(/[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/g, (c) => `\\u{${c.charCodeAt(0).toString(16)}}`);
}

/**
 * What happened when a browser failed to start, in plain words, from puppeteer's error (its
 * troubleshooting link and the long list of switches are left out).
 *
 * @param error - what `puppeteer.launch` threw.
 * @returns e.g. "it exited with code 1 before it was ready", "it did not report a DevTools address
 *   within 20 s: it is probably not a Chrome or Chromium", or the first line of an unknown error.
 * @example
 * launchFailureReason(new Error("Failed to launch the browser process:  Code: 3\n\nstderr:\nusage: thing\n\nTROUBLESHOOTING: https://pptr.dev/troubleshooting\n"));
 * // => 'it exited with code 3 before it was ready, saying "usage: thing"'
 */
export function launchFailureReason(error: unknown): string {
  const message = error instanceof Error ? error.message : String(error);
  const withoutLinks = message.replace(/TROUBLESHOOTING:.*$/gms, "").replace(/https?:\/\/\S+/g, "").trim();
  const code = /Code:\s*(-?\d+|null)/.exec(withoutLinks);
  const stderr = /stderr:\s*\n([\s\S]*)$/.exec(withoutLinks)?.[1]?.trim() ?? "";
  const firstLine = stderr.split(/\r?\n/).find((line) => line.trim() !== "")?.trim() ?? "";
  // A program that echoes its arguments repeats our switches: that is not a message worth showing.
  const said = firstLine === "" || firstLine.includes("--remote-debugging") ? "" : `, saying "${visible(firstLine.length > 120 ? `${firstLine.slice(0, 119)}…` : firstLine)}"`;
  if (code !== null) return `it exited with code ${code[1]} before it was ready${said}`;
  if (/Timed out after \d+ ms while waiting for the WS endpoint/i.test(withoutLinks)) {
    return `it did not report a DevTools address within ${Math.round(LAUNCH_TIMEOUT_MS / 1000)} s: it is probably not a Chrome or Chromium`;
  }
  const spawn = /spawn \S+ (E[A-Z]+)/.exec(withoutLinks);
  if (spawn !== null) return spawn[1] === "ENOENT" ? "no such file" : spawn[1] === "EACCES" ? "it cannot be run (permission denied, or it is a folder)" : `it cannot be run (${spawn[1]})`;
  if (/was not found at the configured executablePath/i.test(withoutLinks)) return "no such file";
  const line = withoutLinks.split(/\r?\n/).find((text) => text.trim() !== "")?.trim() ?? "no reason given";
  return visible(line.replace(/^Failed to launch the browser process:?\s*/i, "").slice(0, 160));
}

/**
 * A headless browser with one reusable page that prints HTML strings to tagged PDF.
 *
 * @example
 * const printer = await PdfPrinter.launch(await findBrowser());
 * const { pdf } = await printer.print("<p>hello</p>", { paper: "a4", footerHtml: "Issued 10 March 2027", footerFontCss: "" });
 * await printer.close();
 * @see puppeteer-core `Page.pdf` documentation (footerTemplate classes `pageNumber`, `totalPages`).
 */
export class PdfPrinter implements HtmlPrinter {
  readonly browserInfo: FoundBrowser;
  readonly #browser: Browser;
  readonly #entry: OpenBrowser;
  #page: Promise<Page> | null = null;
  #blocked: string[] = [];
  #queue: Promise<unknown> = Promise.resolve();
  #closing: Promise<void> | null = null;

  private constructor(browser: Browser, info: FoundBrowser, entry: OpenBrowser) {
    this.#browser = browser;
    this.browserInfo = info;
    this.#entry = entry;
    politeClosers.set(entry, () => browser.close());
  }

  /** The temporary profile folder of this browser (removed by {@link PdfPrinter.close}). */
  get userDataDir(): string {
    return this.#entry.userDataDir;
  }

  /**
   * Start the browser with a fresh temporary profile folder. From this moment until
   * {@link PdfPrinter.close} finishes, an interrupt (SIGINT, SIGTERM, SIGHUP) or any exit of the
   * process closes the browser and removes the folder (see the module comment).
   *
   * @param info - the executable, from {@link findBrowser}.
   * @returns a printer; call {@link PdfPrinter.close} when done (it removes the profile folder).
   * @throws BrowserLaunchError when the program does not start as a browser: "could not start the
   *   browser <path> (<what happened>): choose another with --browser PATH or FIREPHASE_BROWSER".
   */
  static async launch(info: FoundBrowser): Promise<PdfPrinter> {
    const entry: OpenBrowser = { userDataDir: mkdtempSync(join(tmpdir(), PROFILE_PREFIX)), process: null };
    register(entry);
    let browser: Browser;
    try {
      browser = await puppeteer.launch({
        executablePath: info.executablePath,
        headless: true,
        userDataDir: entry.userDataDir,
        args: [...BROWSER_ARGS],
        timeout: LAUNCH_TIMEOUT_MS,
        // The handlers above clean up; puppeteer's own would exit before the folder is removed.
        handleSIGINT: false,
        handleSIGTERM: false,
        handleSIGHUP: false,
      });
    } catch (error) {
      await closeEntry(entry, 0);
      throw new BrowserLaunchError(info.executablePath, launchFailureReason(error), info.source);
    }
    entry.process = browser.process();
    if (interruptedBy !== null) {
      // Interrupted while launching: the signal handler is already cleaning up.
      await closeEntry(entry, 0);
      throw new Error("interrupted");
    }
    return new PdfPrinter(browser, info, entry);
  }

  /**
   * Open and configure the printing page ahead of time (JavaScript off, request blocking), so
   * that work overlaps the caller's computation; with `rehearsal`, also print that small document
   * once and throw the PDF away. A fresh browser's first print decodes the embedded fonts and sets
   * up its layout and PDF machinery; a rehearsal with the briefing's own style sheet does that
   * while the statistics are computed, so the real print is the second one (measured on the demo:
   * the briefing's print 490 ms → 270 ms, for a rehearsal of about 70 ms done beforehand).
   *
   * @param rehearsal - a small HTML document (e.g. {@link PdfPrinter} users pass the briefing's
   *   style sheet with a line of text) and the options to print it with; omitted: no rehearsal.
   * @returns when the page is ready and the rehearsal printed or failed (a rehearsal is only a head start: its
   *   failure is not reported; a browser that really fails will fail the briefing's own print, which says so).
   * @throws Error when the page cannot be opened.
   */
  async warmUp(rehearsal?: { readonly html: string; readonly options: PrintOptions }): Promise<void> {
    const page = await this.#preparedPage();
    if (rehearsal === undefined) return;
    const run = this.#queue.then(async () => {
      await page.setContent(rehearsal.html, { waitUntil: "load" });
      await page.pdf(pdfOptions(rehearsal.options));
    });
    this.#queue = run.catch(() => undefined);
    await this.#queue;
  }

  #preparedPage(): Promise<Page> {
    this.#page ??= (async () => {
      const page = await this.#browser.newPage();
      await page.setJavaScriptEnabled(false);
      await page.setRequestInterception(true);
      page.on("request", (request: HTTPRequest) => {
        if (request.isInterceptResolutionHandled()) return;
        const url = request.url();
        if (url.startsWith("data:")) {
          void request.continue();
        } else {
          this.#blocked.push(url);
          void request.abort("blockedbyclient");
        }
      });
      return page;
    })();
    return this.#page;
  }

  /**
   * Print one HTML document to PDF. Calls made while another print runs wait their turn (one
   * page prints every document).
   *
   * @param html - a complete HTML document; it may only refer to `data:` URLs.
   * @param options - paper size and footer (see {@link PrintOptions}).
   * @returns the PDF bytes and the URLs that were blocked while loading this document.
   * @throws Error when the printer is closed or the browser fails.
   */
  print(html: string, options: PrintOptions): Promise<PrintResult> {
    const run = this.#queue.then(() => this.#printNow(html, options));
    this.#queue = run.catch(() => undefined);
    return run;
  }

  async #printNow(html: string, options: PrintOptions): Promise<PrintResult> {
    if (this.#closing !== null) throw new Error("PdfPrinter.print: the printer is closed");
    const page = await this.#preparedPage();
    this.#blocked = [];
    await page.setContent(html, { waitUntil: "load" });
    const pdf = await page.pdf(pdfOptions(options));
    return { pdf, blockedRequests: [...this.#blocked] };
  }

  /**
   * Close the browser and remove its temporary profile; safe to call twice. A close that does
   * not finish within {@link CLOSE_TIMEOUT_MS} is cut short by killing the browser's process group.
   *
   * @returns when the browser has exited (or was killed) and the folder is gone.
   */
  close(): Promise<void> {
    this.#closing ??= closeEntry(this.#entry, CLOSE_TIMEOUT_MS);
    return this.#closing;
  }

  /**
   * End the browser at once, without the polite close: disconnect, kill its processes and remove the
   * temporary profile. For when every PDF is written: the profile is thrown away, so there is nothing for a
   * polite close to save, and it takes 50–90 ms the user would wait for. Safe to call twice, and after close().
   *
   * @returns when the browser's processes are gone (or were killed) and the folder is removed.
   */
  closeNow(): Promise<void> {
    this.#closing ??= (async () => {
      await this.#browser.disconnect().catch(() => undefined);
      await closeEntry(this.#entry, 0);
    })();
    return this.#closing;
  }
}

/**
 * Find a browser (see {@link findBrowser}) and start a {@link PdfPrinter} with it.
 *
 * @param options - browser discovery options (explicit path, environment).
 * @returns a started printer.
 * @throws BrowserNotFoundError when no browser is found; BrowserLaunchError when it cannot start.
 * @example
 * const printer = await launchPrinter({ explicit: process.env.CHROME });
 */
export async function launchPrinter(options: FindBrowserOptions = {}): Promise<PdfPrinter> {
  return PdfPrinter.launch(await findBrowser(options));
}
