/**
 * Printing HTML to PDF with a headless Chromium driven by puppeteer-core.
 *
 * One browser and one page per printer: the CLI starts the browser while the statistics are
 * computed, and the bench and tests print several documents with the same page. The page runs
 * no JavaScript and loads nothing: every request other than `data:` URLs is aborted, and the
 * document itself is set with `page.setContent`, so there is no initial request to let through.
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import puppeteer, { type Browser, type HTTPRequest, type Page } from "puppeteer-core";
import { findBrowser, type FindBrowserOptions, type FoundBrowser } from "./findBrowser.js";

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

/** Page margins in millimetres; the bottom one holds the footer. */
const MARGIN = Object.freeze({ top: "14mm", right: "15mm", bottom: "16mm", left: "15mm" });

/**
 * A headless browser with one reusable page that prints HTML strings to tagged PDF.
 *
 * @example
 * const printer = await PdfPrinter.launch(await findBrowser());
 * const { pdf } = await printer.print("<p>hello</p>", { paper: "a4", footerHtml: "Issued 10 March 2027", footerFontCss: "" });
 * await printer.close();
 * @see puppeteer-core `Page.pdf` documentation (footerTemplate classes `pageNumber`, `totalPages`).
 */
export class PdfPrinter {
  readonly browserInfo: FoundBrowser;
  readonly #browser: Browser;
  readonly #userDataDir: string;
  #page: Page | null = null;
  #blocked: string[] = [];
  #closed = false;

  private constructor(browser: Browser, info: FoundBrowser, userDataDir: string) {
    this.#browser = browser;
    this.browserInfo = info;
    this.#userDataDir = userDataDir;
  }

  /**
   * Start the browser with a fresh temporary profile folder.
   *
   * @param info - the executable, from {@link findBrowser}.
   * @returns a printer; call {@link PdfPrinter.close} when done (it removes the profile folder).
   * @throws Error when the browser cannot be started.
   */
  static async launch(info: FoundBrowser): Promise<PdfPrinter> {
    const userDataDir = mkdtempSync(join(tmpdir(), "firephase-browser-"));
    try {
      const browser = await puppeteer.launch({
        executablePath: info.executablePath,
        headless: true,
        userDataDir,
        args: [...BROWSER_ARGS],
        // Leave the process signal handlers to the CLI; close() is always awaited.
        handleSIGINT: false,
        handleSIGTERM: false,
        handleSIGHUP: false,
      });
      return new PdfPrinter(browser, info, userDataDir);
    } catch (error) {
      rmSync(userDataDir, { recursive: true, force: true });
      throw error;
    }
  }

  /**
   * Open and configure the printing page ahead of time (JavaScript off, request blocking), so
   * that work overlaps the caller's computation.
   *
   * @returns when the page is ready.
   * @throws Error when the browser fails.
   */
  async warmUp(): Promise<void> {
    await this.#preparedPage();
  }

  async #preparedPage(): Promise<Page> {
    if (this.#page !== null) return this.#page;
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
    this.#page = page;
    return page;
  }

  /**
   * Print one HTML document to PDF.
   *
   * @param html - a complete HTML document; it may only refer to `data:` URLs.
   * @param options - paper size and footer (see {@link PrintOptions}).
   * @returns the PDF bytes and the URLs that were blocked while loading this document.
   * @throws Error when the printer is closed or the browser fails.
   */
  async print(html: string, options: PrintOptions): Promise<PrintResult> {
    if (this.#closed) throw new Error("PdfPrinter.print: the printer is closed");
    const page = await this.#preparedPage();
    this.#blocked = [];
    await page.setContent(html, { waitUntil: "load" });
    const footerTemplate =
      `<style>${options.footerFontCss}</style>` +
      `<div style="font-family:'Source Sans 3',sans-serif;font-size:8pt;color:#4a5058;width:100%;` +
      `margin:0 15mm;display:flex;justify-content:space-between;">` +
      `<span>${options.footerHtml}</span>` +
      `<span>page <span class="pageNumber"></span> of <span class="totalPages"></span></span></div>`;
    const pdf = await page.pdf({
      format: options.paper === "letter" ? "Letter" : "A4",
      printBackground: true,
      tagged: true,
      displayHeaderFooter: true,
      headerTemplate: "<span></span>",
      footerTemplate,
      margin: { ...MARGIN },
      preferCSSPageSize: false,
    });
    return { pdf, blockedRequests: [...this.#blocked] };
  }

  /** Close the browser and remove its temporary profile; safe to call twice. */
  async close(): Promise<void> {
    if (this.#closed) return;
    this.#closed = true;
    try {
      await this.#browser.close();
    } finally {
      rmSync(this.#userDataDir, { recursive: true, force: true });
    }
  }
}

/**
 * Find a browser (see {@link findBrowser}) and start a {@link PdfPrinter} with it.
 *
 * @param options - browser discovery options (explicit path, environment).
 * @returns a started printer.
 * @throws BrowserNotFoundError when no browser is found; Error when it cannot start.
 * @example
 * const printer = await launchPrinter({ explicit: process.env.CHROME });
 */
export async function launchPrinter(options: FindBrowserOptions = {}): Promise<PdfPrinter> {
  return PdfPrinter.launch(await findBrowser(options));
}
