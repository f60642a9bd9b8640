import { readFileSync, readdirSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { buildBriefingView, describePhaseRule } from "../../src/briefing/buildBriefingView.js";
import { formatCount, formatDecimal, formatLongDate, formatPValue } from "../../src/briefing/formatValues.js";
import { inlineRuns, markdownBlocks } from "../../src/briefing/markdownBlocks.js";
import { renderBriefingHtml, TEMPLATES_DIR } from "../../src/briefing/renderBriefingHtml.js";
import { trustCss, trustSvg } from "../../src/briefing/trustedMarkup.js";
import { escapeHtml } from "../../src/briefing/escapeHtml.js";
import { SAMPLE_SAFETY_MARKDOWN, sampleBriefingInputs } from "./sampleBriefingInputs.js";

describe("formatValues", () => {
  it("formatDecimal(-0.4236, 2) uses a true minus sign and never prints −0.00", () => {
    expect(formatDecimal(-0.4236, 2)).toBe("\u22120.42");
    expect(formatDecimal(-0.001, 2)).toBe("0.00");
    expect(formatDecimal(1.2, 2)).toBe("1.20");
    expect(() => formatDecimal(Number.NaN, 2)).toThrow(RangeError);
  });
  it("formatPValue(p) prints <0.001, three decimals below 0.01, two above", () => {
    // Agresti (2007) p. 39 party identification × gender: p = 2.954e-07 (REFERENCES.md §3).
    expect(formatPValue(2.954e-7)).toBe("<0.001");
    expect(formatPValue(0.0027)).toBe("0.003");
    // Ross, chi-square 2×3 worked example: p = 0.04010 (REFERENCES.md §3, C).
    expect(formatPValue(0.0401)).toBe("0.04");
    expect(() => formatPValue(1.2)).toThrow(RangeError);
  });
  it("formatCount(10000) groups thousands", () => {
    expect(formatCount(10000)).toBe("10,000");
    expect(formatCount(999)).toBe("999");
    expect(formatCount(-1234567)).toBe("\u22121,234,567");
  });
  it('formatLongDate("2027-03-10") is "10 March 2027" and rejects impossible dates', () => {
    expect(formatLongDate("2027-03-10")).toBe("10 March 2027");
    expect(formatLongDate("2028-02-29")).toBe("29 February 2028");
    expect(() => formatLongDate("2027-02-29")).toThrow(RangeError);
    expect(() => formatLongDate("10/03/2027")).toThrow(RangeError);
  });
  it("escapeHtml('<img src=\"x\">') escapes all five special characters", () => {
    expect(escapeHtml(`<img src="x" alt='&'>`)).toBe("&lt;img src=&quot;x&quot; alt=&#39;&amp;&#39;&gt;");
  });
});

describe("markdownBlocks(markdown)", () => {
  it("reads headings, paragraphs, bullets with continuation lines and inline emphasis", () => {
    const blocks = markdownBlocks(SAMPLE_SAFETY_MARKDOWN);
    expect(blocks.map((block) => block.kind)).toEqual(["heading", "paragraph", "list", "paragraph"]);
    expect(blocks[2]?.items.length).toBe(2);
    expect(blocks[2]?.items[1]?.map((run) => run.text).join("")).toBe("Small samples give wide intervals: read them with care. A continuation line of the second item.");
    expect(inlineRuns("a **b** *c* `d`")).toEqual([
      { text: "a ", strong: false, emphasis: false, code: false },
      { text: "b", strong: true, emphasis: false, code: false },
      { text: " ", strong: false, emphasis: false, code: false },
      { text: "c", strong: false, emphasis: true, code: false },
      { text: " ", strong: false, emphasis: false, code: false },
      { text: "d", strong: false, emphasis: false, code: true },
    ]);
  });
  it("keeps HTML as text, for the template to escape", () => {
    const blocks = markdownBlocks("<script>alert(1)</script>");
    expect(blocks[0]?.runs[0]?.text).toBe("<script>alert(1)</script>");
  });
});

describe("trustSvg(svg) and trustCss(css)", () => {
  it("accepts a plain chart and refuses scripts, handlers, foreign objects and outside references", () => {
    expect(trustSvg('<svg viewBox="0 0 1 1"><clipPath id="c"/><g clip-path="url(#c)"/></svg>').trustedMarkup).toContain("<svg");
    for (const bad of [
      "<svg><script>alert(1)</script></svg>",
      '<svg><rect onload="x()"/></svg>',
      "<svg><foreignObject></foreignObject></svg>",
      '<svg><a href="http://example.org/">x</a></svg>',
      '<svg><image href="file:///etc/passwd"/></svg>',
      "<div></div>",
    ]) {
      expect(() => trustSvg(bad)).toThrow(RangeError);
    }
  });
  it("refuses CSS that could close the style element or load a resource", () => {
    expect(() => trustCss("</style><script>")).toThrow(RangeError);
    expect(() => trustCss("body{background:url(http://x/y.png)}")).toThrow(RangeError);
    expect(() => trustCss("@import 'x.css';")).toThrow(RangeError);
    expect(trustCss("a{src:url(data:font/woff2;base64,AA)}").trustedMarkup).toContain("data:");
  });
});

/** Template text without handlebars comments ({{!-- … --}} and {{! … }}). */
function withoutComments(text: string): string {
  return text.replace(/\{\{!--[\s\S]*?--\}\}/g, "").replace(/\{\{![^}]*\}\}/g, "");
}

describe("templates", () => {
  it("insert raw ({{{ }}}) only the trustedMarkup fields", () => {
    const files = [join(TEMPLATES_DIR, "briefing.hbs"), ...readdirSync(join(TEMPLATES_DIR, "partials")).map((name) => join(TEMPLATES_DIR, "partials", name))];
    let raw = 0;
    for (const file of files) {
      const text = withoutComments(readFileSync(file, "utf8"));
      for (const match of text.matchAll(/\{\{\{\s*([^}]*?)\s*\}\}\}/g)) {
        raw += 1;
        expect(match[1]).toMatch(/(^|\.)trustedMarkup$/);
      }
      expect(text).not.toMatch(/\{\{&/); // the other unescaped form
    }
    expect(raw).toBeGreaterThan(0);
  });
  it("contain no helper calls beyond the built-in block helpers", () => {
    for (const name of readdirSync(join(TEMPLATES_DIR, "partials"))) {
      const text = withoutComments(readFileSync(join(TEMPLATES_DIR, "partials", name), "utf8"));
      for (const match of text.matchAll(/\{\{#(\w+)/g)) expect(["if", "unless", "each", "with"]).toContain(match[1]);
      expect(text).not.toMatch(/\{\{[^}]*\(/); // no sub-expressions
    }
  });
});

describe("buildBriefingView(inputs)", () => {
  const inputs = sampleBriefingInputs();
  const view = buildBriefingView({ ...inputs, toolVersion: "0.1.0", safetyMarkdown: SAMPLE_SAFETY_MARKDOWN, paper: "a4" });

  it("dates the issue and names the season with date-fns", () => {
    expect(view.header.issuedText).toBe("Issued 10 March 2027");
    expect(view.header.seasonText).toBe("for the 2027 fire season");
    expect(view.header.dataThroughText).toBe("Data through: fire record 1995; climate indices through 1995.");
  });
  it("states the headline in words against the base rate, with the interval", () => {
    // 17 high-fire years of 83: Wilson 95% 13.2–30.0% (Wilson 1927; computed in the fixture).
    expect(view.headline.sentence).toBe("About 2 in 10 chance of a high-fire year; in an average year about 1 in 10.");
    expect(view.headline.chance.percent).toBe("20%");
    expect(view.headline.chance.interval).toBe("95% interval 13–30%");
    expect(view.headline.basis).toBe("Based on the ENSO warm phase: 17 high-fire years in 83 past years with the same phase.");
  });
  it("flags the near-boundary phase and the current phase row", () => {
    expect(view.currentPhases.rows.map((row) => row.nearBoundary)).toEqual([false, true]);
    expect(view.indices[0]?.phases.map((phase) => phase.isCurrent)).toEqual([false, false, true]);
  });
  it("describes a phase rule in words", () => {
    const enso = inputs.calibration.indices[0];
    if (enso === undefined) throw new Error("fixture has ENSO");
    expect(describePhaseRule(enso, { first: 1700, last: 1990 })).toBe("cold: at most \u22120.50; neutral: between \u22120.50 and 0.50; warm: at least 0.50 (fixed cuts)");
  });
  it("renders a hostile region name escaped in the HTML", () => {
    const hostile = sampleBriefingInputs({ regionName: `<script>alert("x")</script>` });
    const html = renderBriefingHtml(buildBriefingView({ ...hostile, toolVersion: "0.1.0", safetyMarkdown: "<img src=x onerror=alert(1)>", paper: "a4" }));
    expect(html).not.toContain("<script>alert");
    expect(html).toContain("&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt;");
    expect(html).not.toContain("<img src=x");
    expect(html).not.toMatch(/<script/i);
    expect(html).not.toMatch(/(?:src|href)=["']?(?:https?:|file:)/i);
  });
  it("prints 'not enough data' and the reason where statistics are null", () => {
    const degenerate = buildBriefingView({ ...sampleBriefingInputs({ degenerate: true }), toolVersion: "0.1.0", safetyMarkdown: "", paper: "letter" });
    expect(degenerate.headline.available).toBe(false);
    expect(degenerate.headline.sentence).toBe("Chance of a high-fire year: not enough data (no past year shares this phase).");
    expect(degenerate.indices[0]?.sea.missingText).toBe("not enough data (no fire year has its whole window covered)");
    expect(degenerate.indices[0]?.testText).toBe("Chi-square test: not enough data (a phase has no years).");
    expect(degenerate.hindcast.missingText).toBe("not enough data (fewer than 10 hindcast years)");
    expect(degenerate.analogs.missingText).toBe("not enough data (no calibration year has all current index values)");
    expect(renderBriefingHtml(degenerate)).toContain("not enough data");
  });
});
