import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BAND_TEXT, buildBriefingView } from "../../src/briefing/buildBriefingView.js";
import { embeddedFontCss } from "../../src/briefing/embeddedFonts.js";
import { escapeHtml } from "../../src/briefing/escapeHtml.js";
import { launchPrinter, type PdfPrinter } from "../../src/briefing/printPdf.js";
import { briefingStyleSheet, renderBriefingHtml } from "../../src/briefing/renderBriefingHtml.js";
import { flatText, pdfPageTexts } from "./pdfText.js";
import { SAMPLE_SAFETY_MARKDOWN, sampleBriefingInputs } from "./sampleBriefingInputs.js";

// One browser for the file (the machine is shared).
let printer: PdfPrinter;
beforeAll(async () => {
  printer = await launchPrinter({});
});
afterAll(async () => {
  await printer?.close();
});

async function print(options: Parameters<typeof sampleBriefingInputs>[0], paper: "a4" | "letter", madeAt?: string) {
  const view = buildBriefingView({ ...sampleBriefingInputs(options), toolVersion: "9.8.7", safetyMarkdown: SAMPLE_SAFETY_MARKDOWN, paper, ...(madeAt === undefined ? {} : { madeAt }) });
  const printed = await printer.print(renderBriefingHtml(view), {
    paper,
    footerHtml: escapeHtml(view.footerText),
    footerFontCss: embeddedFontCss([{ weight: 400, style: "normal" }], ["latin"]),
  });
  return { view, pages: await pdfPageTexts(printed.pdf) };
}

describe("the printed briefing", () => {
  it("carries the header band on every page, the 'How to read this page' box on page 1 and the moment it was made in the appendix", async () => {
    const { pages } = await print({}, "a4", "2027-03-10T08:15:42.000Z");
    expect(pages.length).toBeGreaterThan(5);
    for (const [number, text] of pages.entries()) expect(text.replace(/\s+/g, " "), `page ${number + 1}`).toContain(BAND_TEXT);
    const first = pages[0]!.replace(/\s+/g, " ");
    expect(first).toContain("How to read this page");
    expect(first).toContain("The large figure is this season's chance of a high-fire year");
    expect(first).toContain("Cautions");
    expect(flatText(pages)).toContain("Made 10 March 2027, 08:15 UTC");
  }, 120_000);

  it("keeps page 1 on one page on Letter even with a 10,000-character region name", async () => {
    const { view, pages } = await print({ regionName: "N".repeat(10_000) }, "letter");
    expect(view.header.region.length).toBeLessThanOrEqual(120);
    expect(pages[0]!.replace(/\s+/g, " ")).toContain("Cautions");
    expect(pages[1]!.replace(/\s+/g, " ")).not.toContain("Cautions");
  }, 120_000);

  it("keeps page 1, index table included, on one page on A4 and Letter with two provisional values and a near-boundary row", async () => {
    const warnings = [
      { code: "basis-near-boundary", message: "NAO = -0.46 is within 0.08 of a phase cut: a small change in it would change the odds" },
      { code: "no-clear-link", message: "NAO shows no clear link with high-fire years (chi-square q = 0.41)" },
    ];
    for (const paper of ["a4", "letter"] as const) {
      const { view, pages } = await print({ provisional: true, outlookWarnings: warnings }, paper);
      // The provisional detail is in the index table, not repeated in "Read with care".
      expect(view.readWithCare.some((line) => line.includes("provisional"))).toBe(false);
      expect(view.readWithCare[0]).toBe("NAO = \u22120.46 is within 0.08 of a phase cut: a small change in it would change the odds.");
      const first = pages[0]!.replace(/\s+/g, " ");
      expect(first, paper).toContain("Read with care");
      expect(first, paper).toContain("This winter–spring’s index phases");
      expect(first, paper).toContain("2 of 3 months so far (Dec 2026–Jan 2027)");
      // The last row of the index table and the footnote under it are on page 1 too.
      expect(first, paper).toContain("Where this season's values came from");
      expect(pages[1]!.replace(/\s+/g, " "), paper).not.toContain("Where this season's values came from");
      expect(pages[1]!.replace(/\s+/g, " "), paper).not.toContain("months so far");
    }
  }, 180_000);

  it("prints the band's words in the style sheet exactly as the view says them", () => {
    const css = briefingStyleSheet();
    const content = /@top-center\s*\{[^}]*content:\s*"([^"]+)"/.exec(css)?.[1] ?? "";
    expect(content.replace(/\\2014\s?/g, "\u2014")).toBe(BAND_TEXT);
  });
});
