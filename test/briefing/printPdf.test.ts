import { existsSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { createServer, type Server } from "node:http";
import { tmpdir } from "node:os";
import { join } from "node:path";
import type { AddressInfo } from "node:net";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { buildBriefingView } from "../../src/briefing/buildBriefingView.js";
import { embeddedFontCss } from "../../src/briefing/embeddedFonts.js";
import { escapeHtml } from "../../src/briefing/escapeHtml.js";
import { BrowserLaunchError, BrowserNotFoundError } from "../../src/briefing/findBrowser.js";
import { launchFailureReason, launchPrinter, PdfPrinter, processesUsingProfile, PROFILE_PREFIX, signalExitCode } from "../../src/briefing/printPdf.js";
import { rehearsalHtml, renderBriefingHtml } from "../../src/briefing/renderBriefingHtml.js";
import { rehearsalOf } from "../../src/cli/brief.js";
import { formatPercent } from "../../src/outlook/describeChance.js";
import { toOutlookJson } from "../../src/outlook/toOutlookJson.js";
import { flatText, pdfPageTexts } from "./pdfText.js";
import { SAMPLE_SAFETY_MARKDOWN, sampleBriefingInputs } from "./sampleBriefingInputs.js";

// One browser for the whole file (the machine has two cores).
let printer: PdfPrinter;
let server: Server;
let serverHits = 0;
let serverUrl = "";

const footer = { footerHtml: escapeHtml("Issued 10 March 2027"), footerFontCss: embeddedFontCss([{ weight: 400, style: "normal" }], ["latin"]) };

beforeAll(async () => {
  printer = await launchPrinter({});
  server = createServer((_request, response) => {
    serverHits += 1;
    response.end("x");
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  serverUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});

afterAll(async () => {
  await printer?.close();
  await new Promise((resolve) => server?.close(resolve));
});

async function printSample(options: Parameters<typeof sampleBriefingInputs>[0], paper: "a4" | "letter" = "a4") {
  const inputs = sampleBriefingInputs(options);
  const view = buildBriefingView({ ...inputs, toolVersion: "9.8.7", safetyMarkdown: SAFETY, paper });
  const html = renderBriefingHtml(view);
  const printed = await printer.print(html, { paper, ...footer });
  return { inputs, view, html, printed, pages: await pdfPageTexts(printed.pdf) };
}

const SAFETY = `${SAMPLE_SAFETY_MARKDOWN}\n\nAlways defer to the official outlook of your agency.`;

describe("PdfPrinter.print(briefing html)", () => {
  it("loads no network resource and runs no script even when the HTML asks for them", async () => {
    const before = serverHits;
    const html =
      `<!DOCTYPE html><html><head><link rel="stylesheet" href="${serverUrl}/style.css"></head><body>` +
      `<p id="t">static text</p><img src="${serverUrl}/x.png"><img src="data:image/gif;base64,R0lGODlhAQABAAAAACw=">` +
      `<script>document.getElementById("t").textContent = "script ran";</script></body></html>`;
    const printed = await printer.print(html, { paper: "a4", ...footer });
    const text = flatText(await pdfPageTexts(printed.pdf));
    expect(serverHits - before).toBe(0);
    // This runs first on the fresh page: once a briefing (with its Content-Security-Policy meta)
    // has been set, document.open() keeps that policy and the browser refuses such requests before
    // interception sees them; the server count above covers both layers.
    expect(printed.blockedRequests).toEqual(expect.arrayContaining([`${serverUrl}/style.css`, `${serverUrl}/x.png`]));
    expect(printed.blockedRequests.some((url) => url.startsWith("data:"))).toBe(false);
    expect(text).toContain("static text");
    expect(text).not.toContain("script ran");
  });

  it("prints region, issue date, headline probability, cautions, citations and page x of y", async () => {
    const { inputs, pages, html } = await printSample({});
    const text = flatText(pages);
    // Only the detail part and the appendix force a new page; other sections follow on.
    expect(html.match(/<section class="page\b/g)).toHaveLength(2);
    const first = (pages[0] ?? "").replace(/\s+/g, " ");
    expect(first).toContain("Larkspur Hollow District (invented)");
    expect(first).toContain("Issued 10 March 2027");
    expect(first).toContain("for the 2027 fire season");
    // Same rule as the JSON: the outlook JSON's fireYear.estimate, formatted by formatPercent.
    const json = toOutlookJson(inputs.outlook) as { fireYear: { estimate: number } };
    expect(first).toContain(`This season: ${formatPercent(json.fireYear.estimate)}`);
    expect(formatPercent(json.fireYear.estimate)).toBe("20%"); // 17 of 83 in the fixture
    expect(first).toContain("About 1 in 5 chance of a high-fire year (20%, 95% interval 13–30%); in an average year about 1 in 10 (10%).");
    expect(first).toContain("Official agency seasonal outlooks and daily fire-danger forecasts come first");
    expect(first).toContain(`page 1 of ${pages.length}`);
    for (const citation of [
      "Wilson E.B. (1927)",
      "Brown L.D., Cai T.T., DasGupta A. (2001)",
      "Woolf B. (1955)",
      "Haurwitz M.W., Brier G.W. (1981)",
      "Prager M.H., Hoenig J.M. (1989)",
      "Adams J.B., Mann M.E., Ammann C.M. (2003)",
      "Bretherton C.S.",
      "Benjamini Y., Hochberg Y. (1995)",
      "Hyndman R.J., Fan Y. (1996)",
      "Brier G.W. (1950)",
      "Epstein E.S. (1969)",
      "Murphy A.H. (1971)",
      "Hanley J.A., McNeil B.J. (1982)",
      "Phipson B., Smyth G.K. (2010)",
      "Fisher R.A. (1935)",
      "Agresti A. (2007)",
    ]) {
      expect(text).toContain(citation);
    }
    expect(text).toContain("Always defer to the official outlook of your agency.");
    expect(text).toContain("Inline HTML stays text: <b>not bold</b> & code");
    expect(text).toContain("a0".repeat(32)); // SHA-256 of an input file
    expect(text).toContain("firephase 9.8.7");
    // Chart labels on a halo are printed once: a stroked halo would put each of them in the text layer twice.
    const scatterPage = pages.find((page) => page.includes("Phase space")) ?? "";
    expect(scatterPage.replace(/\s+/g, " ").match(/This season/g)).toHaveLength(1);
    expect(text).not.toMatch(/ENSO phase ENSO phase/);
  });

  it("says on page 1 that a method without skill has none", async () => {
    const { pages } = await printSample({ noSkill: true });
    const first = (pages[0] ?? "").replace(/\s+/g, " ");
    expect(first).toContain("Hindcast. No skill: in the hindcast");
    expect(first).toContain("Treat these odds as no better than the average year.");
  });

  it("prints 'not enough data' with the reason for null statistics, on Letter paper", async () => {
    const { pages, printed } = await printSample({ degenerate: true }, "letter");
    const text = flatText(pages);
    expect(text).toContain("not enough data (no past year shares this phase)");
    expect(text).toContain("not enough data (no fire year has its whole window covered)");
    expect(text).toContain("not enough data (fewer than 10 hindcast years)");
    const header = Buffer.from(printed.pdf).toString("latin1");
    expect(header).toMatch(/\/MediaBox \[0 0 612 792\]/); // US Letter, 8.5 × 11 in at 72 pt/in
  });

  it("keeps the cautions on page 1 and leaves no near-empty page on Letter paper", async () => {
    const { pages } = await printSample({ outlookWarnings: [{ code: "small-basis", message: "the odds rest on only 12 past years: treat them as rough" }] }, "letter");
    const first = (pages[0] ?? "").replace(/\s+/g, " ");
    expect(first).toContain("Read with care");
    expect(first).toContain("The odds rest on only 12 past years: treat them as rough.");
    expect(first).toContain("Official agency seasonal outlooks and daily fire-danger forecasts come first");
    // Each page carries more than its footer (about 90 characters) and a stray bullet.
    for (const page of pages) expect(page.replace(/\s+/g, " ").length).toBeGreaterThan(400);
  });

  it("shows a hostile region name as text and runs nothing", async () => {
    const hostile = `<script>document.title='owned'</script><img src=file:///etc/passwd onerror=alert(1)> & "Ridge"`;
    const { pages, html, printed } = await printSample({ regionName: hostile, description: "<iframe src=http://127.0.0.1:9/>" });
    expect(html).not.toContain("<script>document.title");
    expect(html).not.toContain("<img src=file");
    const first = (pages[0] ?? "").replace(/\s+/g, " ");
    expect(first).toContain(hostile);
    expect(first).toContain("<iframe src=http://127.0.0.1:9/>");
    expect(printed.blockedRequests).toEqual([]);
  });

  it("embeds Source Sans 3 and no other font for latin text", async () => {
    const printed = await printer.print(
      `<!DOCTYPE html><html><head><style>${embeddedFontCss()} body{font-family:'Source Sans 3'}</style></head><body><p>Plain text − 10%</p><p style="font-weight:600">Semibold</p></body></html>`,
      { paper: "a4", ...footer },
    );
    const names = [...Buffer.from(printed.pdf).toString("latin1").matchAll(/\/BaseFont\s*\/([A-Za-z0-9+\-_]+)/g)].map((match) => match[1] ?? "");
    expect(names.length).toBeGreaterThan(0);
    for (const name of names) expect(name).toMatch(/SourceSans3/);
  });
});

// Messages exactly as puppeteer-core 24 wrote them for these programs (captured on Linux).
const PUPPETEER_MESSAGES = {
  falseProgram: "Failed to launch the browser process:  Code: 1\n\nstderr:\n\n\nTROUBLESHOOTING: https://pptr.dev/troubleshooting\n",
  usage: "Failed to launch the browser process:  Code: 3\n\nstderr:\nusage: thing [options]\n\nTROUBLESHOOTING: https://pptr.dev/troubleshooting\n",
  echo: "Failed to launch the browser process:  Code: 0\n\nstderr:\n--allow-pre-commit-input --disable-background-networking --remote-debugging-port=0 --user-data-dir=/tmp/x\n\nTROUBLESHOOTING: https://pptr.dev/troubleshooting\n",
  folder: "Failed to launch the browser process:  spawn /tmp EACCES\n\nstderr:\n\n\nTROUBLESHOOTING: https://pptr.dev/troubleshooting\n",
  timeout: "Timed out after 20000 ms while waiting for the WS endpoint URL to appear in stdout!",
  missing: "Browser was not found at the configured executablePath (/no/such)",
};

describe("launchFailureReason(puppeteer's error)", () => {
  it("says what happened in plain words and drops the troubleshooting link", () => {
    expect(launchFailureReason(new Error(PUPPETEER_MESSAGES.falseProgram))).toBe("it exited with code 1 before it was ready");
    expect(launchFailureReason(new Error(PUPPETEER_MESSAGES.usage))).toBe('it exited with code 3 before it was ready, saying "usage: thing [options]"');
    expect(launchFailureReason(new Error(PUPPETEER_MESSAGES.echo))).toBe("it exited with code 0 before it was ready");
    expect(launchFailureReason(new Error(PUPPETEER_MESSAGES.folder))).toBe("it cannot be run (permission denied, or it is a folder)");
    expect(launchFailureReason(new Error(PUPPETEER_MESSAGES.timeout))).toBe("it did not report a DevTools address within 20 s: it is probably not a Chrome or Chromium");
    expect(launchFailureReason(new Error(PUPPETEER_MESSAGES.missing))).toBe("no such file");
    for (const message of Object.values(PUPPETEER_MESSAGES)) expect(launchFailureReason(new Error(message))).not.toMatch(/https?:|TROUBLESHOOTING/);
  });

  it("escapes control characters a program printed", () => {
    const reason = launchFailureReason(new Error("Failed to launch the browser process:  Code: 2\n\nstderr:\n\u001b]0;owned\u0007oops\n"));
    expect(reason).toBe('it exited with code 2 before it was ready, saying "\\u{1b}]0;owned\\u{7}oops"');
  });
});

describe("PdfPrinter.launch(a program that is not a browser)", () => {
  it("/bin/false and a script that prints its usage give BrowserLaunchError naming the program, and leave no profile folder", async () => {
    const folder = mkdtempSync(join(tmpdir(), "firephase-notbrowser-"));
    const script = join(folder, "not-a-browser.sh");
    writeFileSync(script, '#!/bin/sh\necho "usage: thing [options]" >&2\nexit 3\n', { mode: 0o755 });
    const before = readdirSync(tmpdir()).filter((name) => name.startsWith(PROFILE_PREFIX)).length;
    try {
      await expect(PdfPrinter.launch({ executablePath: "/bin/false", source: "flag" })).rejects.toThrow(
        "could not start the browser /bin/false (it exited with code 1 before it was ready): choose another with --browser PATH or FIREPHASE_BROWSER",
      );
      const error = await PdfPrinter.launch({ executablePath: script, source: "flag" }).catch((caught: unknown) => caught);
      expect(error).toBeInstanceOf(BrowserLaunchError);
      expect(error).toBeInstanceOf(BrowserNotFoundError); // so the CLI maps it to a usage error (exit 2)
      expect((error as Error).message).toBe(
        `could not start the browser ${script} (it exited with code 3 before it was ready, saying "usage: thing [options]"): choose another with --browser PATH or FIREPHASE_BROWSER`,
      );
      expect(readdirSync(tmpdir()).filter((name) => name.startsWith(PROFILE_PREFIX)).length).toBeLessThanOrEqual(before);
    } finally {
      rmSync(folder, { recursive: true, force: true });
    }
  });

  it("signalExitCode is 128 + the signal number; the printer's profile folder is gone after close()", async () => {
    expect([signalExitCode("SIGINT"), signalExitCode("SIGTERM"), signalExitCode("SIGHUP")]).toEqual([130, 143, 129]);
    const own = await launchPrinter({});
    const folder = own.userDataDir;
    expect(existsSync(folder)).toBe(true);
    expect(processesUsingProfile(folder).length).toBeGreaterThan(0);
    await own.close();
    await own.close(); // twice is safe
    expect(existsSync(folder)).toBe(false);
    expect(processesUsingProfile(folder)).toEqual([]);
  });

  it("queues prints made at the same time on its one page (each PDF has its own text)", async () => {
    const texts = ["first document", "second document", "third document"];
    const printed = await Promise.all(texts.map((text) => printer.print(`<!DOCTYPE html><p>${text}</p>`, { paper: "a4", ...footer })));
    const pages = await Promise.all(printed.map((result) => pdfPageTexts(result.pdf)));
    pages.forEach((page, position) => expect(flatText(page)).toContain(texts[position]));
  });
});

describe("PdfPrinter.warmUp(rehearsal): a first print with the briefing's style sheet, thrown away", () => {
  it("the briefing printed after the rehearsal has the briefing's text and pages, nothing of the rehearsal, and loads nothing", async () => {
    const rehearsed = await launchPrinter({});
    try {
      const html = rehearsalHtml();
      expect(html).toContain("@font-face");
      await rehearsed.warmUp({ html, options: { paper: "a4", ...footer } });
      const inputs = sampleBriefingInputs({});
      const view = buildBriefingView({ ...inputs, toolVersion: "9.8.7", safetyMarkdown: SAFETY, paper: "a4" });
      const after = await rehearsed.print(renderBriefingHtml(view), { paper: "a4", ...footer });
      const pages = await pdfPageTexts(after.pdf);
      expect(flatText(pages)).not.toContain("Rehearsal");
      expect(flatText(pages)).toContain("Statistical outlook from past records — not an official forecast or fire-danger rating");
      expect(flatText(pages)).toContain("Issued 10 March 2027 for the 2027 fire season");
      expect(after.blockedRequests).toEqual([]);
      // The same document on the file's printer, which never rehearsed: the same pages, the same text.
      const plain = await pdfPageTexts((await printer.print(renderBriefingHtml(view), { paper: "a4", ...footer })).pdf);
      expect(pages).toEqual(plain);
    } finally {
      await rehearsed.close();
    }
  }, 60_000);
});

describe("PdfPrinter.warmUp(a rehearsal that fails)", () => {
  it("does not fail itself; the briefing's own print then reports the broken browser", async () => {
    const own = await launchPrinter({});
    try {
      await own.warmUp(); // the page is open
      // The browser dies: the rehearsal cannot print, but it was only a head start.
      for (const pid of processesUsingProfile(own.userDataDir)) process.kill(pid, "SIGKILL");
      await new Promise((resolve) => setTimeout(resolve, 200));
      await expect(own.warmUp({ html: "<!DOCTYPE html><p>rehearsal</p>", options: { paper: "a4", ...footer } })).resolves.toBeUndefined();
      await expect(own.print("<!DOCTYPE html><p>briefing</p>", { paper: "a4", ...footer })).rejects.toThrow();
    } finally {
      await own.close();
    }
    expect(existsSync(own.userDataDir)).toBe(false);
  }, 60_000);

  it("rehearsalOf: a rehearsal that cannot be made is none, not an error", () => {
    expect(
      rehearsalOf(() => {
        throw new Error("no style sheet");
      }),
    ).toBeUndefined();
    const made = { html: "<p>r</p>", options: { paper: "a4" as const, footerHtml: "", footerFontCss: "" } };
    expect(rehearsalOf(() => made)).toBe(made);
  });
});

describe("PdfPrinter.closeNow(): the browser ended at once once every PDF is written", () => {
  it("leaves no browser process and no profile folder, is safe to call twice and after close(), and a print after it fails", async () => {
    const own = await launchPrinter({});
    const folder = own.userDataDir;
    const printed = await own.print("<!DOCTYPE html><p>written before closing</p>", { paper: "a4", ...footer });
    expect(flatText(await pdfPageTexts(printed.pdf))).toContain("written before closing");
    expect(processesUsingProfile(folder).length).toBeGreaterThan(0);
    await own.closeNow();
    await own.closeNow();
    await own.close();
    expect(existsSync(folder)).toBe(false);
    expect(processesUsingProfile(folder)).toEqual([]);
    await expect(own.print("<p>late</p>", { paper: "a4", ...footer })).rejects.toThrow(/closed/);
  }, 60_000);
});
