import { readFileSync, readdirSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { buildBriefingView, describePhaseRule, printedText } from "../../src/briefing/buildBriefingView.js";
import { clipText, formatCount, formatDecimal, formatLongDate, formatMoment, formatPValue } from "../../src/briefing/formatValues.js";
import { inlineRuns, markdownBlocks } from "../../src/briefing/markdownBlocks.js";
import { renderBriefingHtml, TEMPLATES_DIR } from "../../src/briefing/renderBriefingHtml.js";
import { trustCss, trustSvg } from "../../src/briefing/trustedMarkup.js";
import { escapeHtml } from "../../src/briefing/escapeHtml.js";
import { DEFAULT_METHODS } from "../../src/workspace/defaults.js";
import { SAMPLE_SAFETY_MARKDOWN, sampleBriefingInputs } from "./sampleBriefingInputs.js";

describe("formatValues", () => {
  it("formatDecimal(-0.4236, 2) uses a true minus sign and never prints −0.00", () => {
    expect(formatDecimal(-0.4236, 2)).toBe("\u22120.42");
    expect(formatDecimal(-0.001, 2)).toBe("0.00");
    expect(formatDecimal(1.2, 2)).toBe("1.20");
  });
  it("formatDecimal and formatCount are total: NaN, ±Infinity and huge numbers format or say why", () => {
    expect(formatDecimal(Number.NaN, 2)).toBe("not computable");
    expect(formatDecimal(Number.POSITIVE_INFINITY, 2)).toBe("\u221e");
    expect(formatDecimal(Number.NEGATIVE_INFINITY, 2)).toBe("\u2212\u221e");
    expect(formatDecimal(1e200, 2)).toBe("1.00 \u00d7 10^200");
    expect(formatDecimal(-2.5e15, 1)).toBe("\u22122.5 \u00d7 10^15");
    expect(formatDecimal(999_999_999_999_999 - 1, 0)).toBe("999999999999998");
    expect(formatDecimal(1.23456, 99)).toBe("1.234560");
    expect(formatCount(Number.NaN)).toBe("not computable");
    expect(formatCount(1e200)).toBe("1.0 \u00d7 10^200");
    expect(formatCount(Number.NEGATIVE_INFINITY)).toBe("\u2212\u221e");
    // Property: every double gives text without NaN / Infinity / e+ notation.
    for (const value of [0, -0, 5e-324, 1e21, 1e308, -1e308, Number.MAX_VALUE, Number.MIN_VALUE, 123456.789]) {
      for (const text of [formatDecimal(value, 2), formatCount(value)]) expect(text).not.toMatch(/NaN|Infinity|e[+-]\d/);
    }
  });
  it("clipText bounds long names with an ellipsis, by whole characters; formatMoment prints UTC", () => {
    expect(clipText("abcdef", 4)).toBe("abc\u2026");
    expect(clipText("short")).toBe("short");
    expect([...clipText("x".repeat(100_000))].length).toBe(120);
    expect(clipText("\u{1F525}".repeat(10), 5)).toBe("\u{1F525}".repeat(4) + "\u2026");
    expect(clipText("a\nb\tc")).toBe("a b c");
    expect(formatMoment("2027-03-10T08:15:42.000Z")).toBe("10 March 2027, 08:15 UTC");
    expect(formatMoment("2027-03-10T23:59:59+02:00")).toBe("10 March 2027, 21:59 UTC");
    expect(formatMoment("yesterday")).toBe("yesterday (not a date and time)");
  });
  it("formatPValue(p) prints <0.001, three decimals below 0.01, two above", () => {
    // Agresti A. (2007) An Introduction to Categorical Data Analysis, 2nd ed., Wiley, p. 39, party
    // identification × gender: p = 2.954e-07 (the R ?chisq.test example).
    expect(formatPValue(2.954e-7)).toBe("<0.001");
    expect(formatPValue(0.0027)).toBe("0.003");
    // Ross S.M., Introduction to Probability and Statistics for Engineers and Scientists, ch. 11 chi-square 2×3
    // worked example (TS = 6.433): p = 0.04010 (recomputed).
    expect(formatPValue(0.0401)).toBe("0.04");
    expect(formatPValue(1.2)).toBe("not computable");
    expect(formatPValue(Number.NaN)).toBe("not computable");
  });
  it("formatCount(10000) groups thousands", () => {
    expect(formatCount(10000)).toBe("10,000");
    expect(formatCount(999)).toBe("999");
    expect(formatCount(-1234567)).toBe("\u22121,234,567");
  });
  it('formatLongDate("2027-03-10") is "10 March 2027" and rejects impossible dates', () => {
    expect(formatLongDate("2027-03-10")).toBe("10 March 2027");
    expect(formatLongDate("2028-02-29")).toBe("29 February 2028");
    expect(formatLongDate("2027-02-29")).toBe("2027-02-29 (not a calendar date)");
    expect(formatLongDate("10/03/2027")).toBe("10/03/2027 (not a calendar date)");
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
  it("checks only markup: escaped text such as 'phase one = wet' or '&lt;script&gt;' in text and labels passes", () => {
    const svg =
      '<svg xmlns="http://www.w3.org/2000/svg" aria-label="ENSO phase one = wet, url(x) javascript:"><title>phase one = wet</title>' +
      '<text x="1" y="2">phase one = wet &lt;script&gt;alert(1)&lt;/script&gt; url(http://x) href="y"</text></svg>';
    expect(trustSvg(svg).trustedMarkup).toBe(svg);
    for (const bad of [
      '<svg><rect fill="url(http://x/p)"/></svg>',
      "<svg><!-- <script> --></svg>",
      "<svg><style>@import 'x.css';</style></svg>",
      '<svg><use href="other.svg#a"/></svg>',
      '<svg><g ONCLICK="x()"></g></svg>',
      "<svg><text>a</text><script>x()</script></svg>",
      "<svg><rect x=1/></svg>",
    ]) {
      expect(() => trustSvg(bad), bad).toThrow(RangeError);
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
    expect(view.headline.sentence).toBe("About 1 in 5 chance of a high-fire year (20%, 95% interval 13–30%); in an average year about 1 in 10 (10%).");
    // 20% (13–30%) against 10% (7–14%): the intervals overlap, so no "higher" and no ratio is claimed.
    expect(view.headline.comparison).toBe("The two intervals overlap: this season may not differ from an average year.");
    expect(view.headline.chance.percent).toBe("20%");
    expect(view.headline.chance.interval).toBe("95% interval 13–30%");
    expect(view.headline.basis).toBe("Read from the 83 past years with ENSO warm: 17 of them were high-fire years.");
    expect(view.headline.basis).not.toMatch(/chi-square|q =|p =/);
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
  it("shows each category's average-year (realised) share, not one in three", () => {
    expect(view.categories.rows.map((row) => row.averageYear)).toEqual(["33%", "33%", "33%"]);
    expect(view.categories.note).toContain("the diamonds mark an average year (below 33%, near 33%, above 33%)");
    expect(view.categories.chart.trustedMarkup).not.toContain("Equal odds");
    expect(view.categories.chart.trustedMarkup).toContain('class="average-year"');
    const rpss = view.hindcast.scores.find((score) => score.score === "Ranked probability skill score");
    expect(rpss?.meaning).toContain("average-year shares of the three categories (their shares over the whole calibration period");
    expect(rpss?.meaning).not.toMatch(/one in three/);
  });
  it("says where each current value came from", () => {
    expect(view.currentPhases.rows.map((row) => row.source)).toEqual(["region.json", "--values"]);
    const html = renderBriefingHtml(view);
    // On page 1 the sources are a footnote, not a column.
    expect(html).not.toContain('<td class="source">');
    expect(view.footnotes[0]).toBe("Where this season's values came from: ENSO from region.json; NAO from --values.");
  });
  it("puts the outlook's warnings in a 'Read with care' box after the headline and skill, before the cautions", () => {
    const warned = buildBriefingView({
      ...sampleBriefingInputs({ outlookWarnings: [{ code: "value-far-outside", message: "ENSO = 40 is 46.5 standard deviations from its calibration mean: check the value" }] }),
      toolVersion: "0.1.0",
      safetyMarkdown: SAMPLE_SAFETY_MARKDOWN,
      paper: "a4",
    });
    expect(warned.readWithCare).toEqual(["ENSO = 40 is 46.5 standard deviations from its calibration mean: check the value."]);
    const html = renderBriefingHtml(warned);
    const headline = html.indexOf("headline-sentence");
    const skill = html.indexOf("Some skill: in the hindcast");
    const care = html.indexOf("Read with care");
    const cautions = html.indexOf('aria-label="Cautions"');
    expect(headline).toBeGreaterThan(0);
    expect(skill).toBeGreaterThan(headline);
    expect(care).toBeGreaterThan(skill);
    expect(cautions).toBeGreaterThan(care);
    expect(html.indexOf("46.5 standard deviations")).toBeGreaterThan(care);
    expect(renderBriefingHtml(view)).not.toContain("Read with care");
  });
  it("says a briefing dated ahead in the data notes (beside the moment made), not in page 1's 'Read with care'", () => {
    const message = "dated ahead: issued 2027-03-10, 97 days after it was made on 2026-12-03; the index values are the files' as of 2026-12-03, with every month that ends before the issue date counted as complete";
    const ahead = buildBriefingView({ ...sampleBriefingInputs({ outlookWarnings: [{ code: "issued-ahead", message }] }), toolVersion: "0.1.0", safetyMarkdown: "", paper: "a4" });
    expect(ahead.readWithCare).toEqual([]);
    expect(ahead.dataNotes).toContain(`${message}.`);
  });
  it("with no current values, page 1 says the skill score does not apply (not 'no skill')", () => {
    const average = buildBriefingView({ ...sampleBriefingInputs({ noCurrentValues: true }), toolVersion: "0.1.0", safetyMarkdown: "", paper: "a4" });
    expect(average.skill.applies).toBe(false);
    expect(average.skill.title).toBe("Hindcast: no index-based forecast to check");
    expect(average.skill.verdict).toContain("a skill score does not apply");
    const html = renderBriefingHtml(average);
    expect(html).toContain("skill-na");
    expect(html).not.toContain("the method showed no skill");
  });
  it("with no current values, the hindcast section says it does not apply and prints no scores or charts", () => {
    const average = buildBriefingView({ ...sampleBriefingInputs({ noCurrentValues: true }), toolVersion: "0.1.0", safetyMarkdown: "", paper: "a4" });
    expect(average.hindcast.applies).toBe(false);
    const html = renderBriefingHtml(average);
    const section = html.slice(html.indexOf('<section class="hindcast">'), html.indexOf("</section>", html.indexOf('<section class="hindcast">')));
    expect(section).toContain("Does not apply this season.");
    expect(section).toContain("long-term average year");
    expect(section).not.toContain("ROC curve");
    expect(section).not.toContain("How sure are the scores?");
    expect(section).not.toContain("<svg");
    expect(view.hindcast.applies).toBe(true);
    expect(renderBriefingHtml(view)).toContain("How sure are the scores?");
  });
  it("rests the skill verdict on the chance test and reads a bootstrap interval below 0 as a small, uncertain size, on page 1 and the hindcast page", () => {
    const base = sampleBriefingInputs({});
    const hindcast = {
      ...base.outlook.hindcast,
      skillPValue: 0.004,
      permutations: 999,
      permutationBlockYears: 5,
      intervals: { brierSkillScore: [-0.012, 0.114] as [number, number], rpss: [-0.02, 0.15] as [number, number], rocArea: [0.49, 0.71] as [number, number], level: 0.95, blockYears: 5, resamples: 999, method: "moving-block bootstrap of the hindcast years" },
    };
    const tested = buildBriefingView({ ...base, outlook: { ...base.outlook, hindcast }, toolVersion: "0.1.0", safetyMarkdown: "", paper: "a4" });
    expect(tested.skill.summary).toContain(
      "Brier skill score +0.09 (95% interval \u22120.01 to +0.11: small and uncertain in size), ROC area 0.68; shuffled fire records rarely scored as well (chance test p = 0.004).",
    );
    expect(tested.hindcast.extras.chanceText).toContain("Its size is small and uncertain: the 95% interval of the Brier skill score, \u22120.01 to +0.11, reaches below 0.");
    expect(tested.hindcast.extras.chanceText).toMatch(/^The verdict rests on the chance test: in 999 shuffles/);
    expect(tested.hindcast.extras.intervalsNote).toContain("means the skill is small and uncertain in size");
    expect(tested.hindcast.extras.intervalsNote).not.toMatch(/cannot rule out/);
  });
  it("prints warnings with one minus sign, en-dash month windows, table precision and a closing full stop", () => {
    expect(printedText("WSI = -0.245 is provisional: computed from Dec 2026–Jan 2027 of its Dec-Feb window")).toBe(
      "WSI = \u22120.24 is provisional: computed from Dec 2026–Jan 2027 of its Dec\u2013Feb window.",
    );
    expect(printedText("lags -2 to -1 (p = 0.01); high-fire years")).toBe("Lags \u22122 to \u22121 (p = 0.01); high-fire years.");
    expect(printedText("a well-known, non-numeric dash")).toBe("A well-known, non-numeric dash.");
  });
  it("states provisional months as 'N of M months so far (Mon YYYY–Mon YYYY)' and monthly indices by their last month", () => {
    const provisional = buildBriefingView({ ...sampleBriefingInputs({ provisional: true }), toolVersion: "0.1.0", safetyMarkdown: "", paper: "a4" });
    expect(provisional.currentPhases.rows[0]?.provisionalText).toBe("2 of 3 months so far (Dec 2026–Jan 2027); the odds may change.");
    expect(provisional.currentPhases.rows[1]?.note).toBe(`Within 0.08 of a cut (${formatDecimal(DEFAULT_METHODS.nearBoundarySd, 2)} SD): a small change would change the phase.`);
    expect(provisional.readWithCare).toEqual([]);
  });
  it("joins the tie rule as its own sentence in the settings (no '.;')", () => {
    const tied = buildBriefingView({
      ...sampleBriefingInputs({ tieRule: "years with equal activity always fall in one category, so the realised shares differ from one third." }),
      toolVersion: "0.1.0",
      safetyMarkdown: "",
      paper: "a4",
    });
    const categories = tied.settings.find((row) => row.label === "Activity categories")?.value ?? "";
    expect(categories).toBe(
      "terciles of calibration-period activity (Hyndman & Fan type 7). Years with equal activity always fall in one category, so the realised shares differ from one third. " +
        "Realised shares: below 33%, near 33%, above 33%.",
    );
    expect(categories).not.toMatch(/\.;|;\s*\./);
  });
  it("keeps superposed-epoch captions plain: the reading and the lags outside the limits, no seed or draw counts", () => {
    const enso = view.indices[0];
    expect(enso?.sea.caption).toBe(
      "Mean ENSO departure in the years around 30 high-fire years (lag 0 = the high-fire year); the shaded envelope shows how far chance alone goes (random years; settings in Appendix A).",
    );
    expect(enso?.sea.outsideText).toContain("lag 0 (+0.62, p = 0.001, q = 0.01)");
    expect(enso?.sea.caption).not.toMatch(/seed|10,000|draws|percentile/i);
    expect(view.settings.find((row) => row.label === "SEA draws and limits")?.value).toContain("percentiles");
  });
  it("says the timeline chooses high-fire years only among calibration years", () => {
    expect(view.timeline.caption).toContain("High-fire years are chosen only among the calibration years 1700–1990");
    expect(view.timeline.chart.trustedMarkup).toContain("Outside calibration (not used)");
  });
  it("renders phase labels that look like attributes or tags: 'phase one = wet' and '<script>' (escaped)", () => {
    const labelled = buildBriefingView({
      ...sampleBriefingInputs({ ensoLabels: ["phase one = wet", "<script>", "warm"] }),
      toolVersion: "0.1.0",
      safetyMarkdown: "",
      paper: "a4",
    });
    const html = renderBriefingHtml(labelled);
    expect(html).toContain("phase one = wet");
    expect(html).toContain("&lt;script&gt;");
    expect(html).not.toMatch(/<script/i);
    expect(labelled.indices[0]?.oddsChart.trustedMarkup).toContain("phase one = wet");
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
