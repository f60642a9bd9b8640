import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { coreCautions, failedOverviewRow, overviewCsv, overviewHtml, overviewRowFromOutlook, sortOverviewRows } from "../../src/briefing/overview.js";

function outlookJson(name: string, estimate: number | null, upper: number | null) {
  return {
    schema: "firephase.outlook/1",
    issued: "2027-03-10",
    season: 2027,
    region: { name },
    baseRate: { estimate: 0.1, lower: 0.07, upper: 0.15 },
    fireYear: { estimate, lower: estimate === null ? null : estimate / 2, upper, basis: `the years like ${name}` },
    hindcast: { hasSkill: estimate !== null && estimate > 0.3, verdict: `Verdict of ${name}. More words.` },
  };
}

describe("overviewRowFromOutlook(outlook JSON, folder, pdf)", () => {
  it("reads the headline odds, base rate, skill and basis as the JSON holds them", () => {
    const row = overviewRowFromOutlook(outlookJson("North", 0.35, 0.5), "north", "/out/north.pdf");
    expect(row).toEqual({
      region: "North",
      folder: "north",
      status: "briefed",
      season: 2027,
      issued: "2027-03-10",
      chance: { estimate: 0.35, lower: 0.175, upper: 0.5 },
      baseRate: { estimate: 0.1, lower: 0.07, upper: 0.15 },
      hasSkill: true,
      verdict: "Verdict of North. More words.",
      basis: "the years like North",
      pdf: "/out/north.pdf",
      problem: null,
    });
  });
});

describe("sortOverviewRows(rows)", () => {
  it("orders by the odds, highest first; ties by the upper end, then the name; no odds after odds; failed regions last in input order", () => {
    const rows = [
      failedOverviewRow("z-bad", ["z-bad/region.json:2: oops"]),
      overviewRowFromOutlook(outlookJson("Low", 0.1, 0.2), "low", null),
      overviewRowFromOutlook(outlookJson("None", null, null), "none", null),
      overviewRowFromOutlook(outlookJson("TieB", 0.3, 0.4), "tieb", null),
      overviewRowFromOutlook(outlookJson("TieA", 0.3, 0.4), "tiea", null),
      overviewRowFromOutlook(outlookJson("Wide", 0.3, 0.6), "wide", null),
      failedOverviewRow("a-bad", ["a-bad/fire-sites.csv:4: latitude", "a-bad/fire-sites.csv:5: longitude"]),
    ];
    expect(sortOverviewRows(rows).map((row) => row.folder)).toEqual(["wide", "tiea", "tieb", "low", "none", "z-bad", "a-bad"]);
    expect(rows[6]?.problem).toBe("a-bad/fire-sites.csv:4: latitude (and 1 more)");
  });
});

describe("overviewCsv(rows)", () => {
  it("writes RFC 4180 cells, full-precision shares, ranks for briefed regions only, and defuses spreadsheet formulas", () => {
    const rows = [
      overviewRowFromOutlook({ ...outlookJson('=HYPERLINK("x")', 0.123456789, 0.2), region: { name: '=HYPERLINK("x")' } }, "ridge, east", null),
      failedOverviewRow("bad", ['bad/region.json:3: name is "-1"']),
    ];
    const lines = overviewCsv(rows).split("\n");
    expect(lines[0]).toBe(
      "rank,region,folder,status,season,issued,chance,chance_lower,chance_upper,base_rate,base_rate_lower,base_rate_upper,has_skill,skill_verdict,basis,pdf,problem",
    );
    expect(lines[1]).toBe(
      `1,"'=HYPERLINK(""x"")","ridge, east",briefed,2027,2027-03-10,0.123456789,0.0617283945,0.2,0.1,0.07,0.15,no,"Verdict of =HYPERLINK(""x""). More words.","the years like =HYPERLINK(""x"")",,`,
    );
    expect(lines[2]).toBe(`,bad,bad,failed,,,,,,,,,,,,,"bad/region.json:3: name is ""-1"""`);
    expect(lines[3]).toBe("");
  });
});

describe("coreCautions(SAFETY.md)", () => {
  it("takes the first point of 'What this outlook is' and every point of 'What it is not' from the package's SAFETY.md", () => {
    const cautions = coreCautions(readFileSync("SAFETY.md", "utf8"));
    expect(cautions[0]).toMatch(/^A statistical, long-range outlook/);
    expect(cautions.some((text) => /^Not a substitute for official agency seasonal outlooks/.test(text))).toBe(true);
    expect(cautions.some((text) => /evacuation decisions/.test(text))).toBe(true);
    for (const text of cautions) expect(text).not.toMatch(/\n|\s{2}/);
  });

  it("refuses a SAFETY.md without those sections", () => {
    expect(() => coreCautions("# Cautions\n\nNothing here.\n")).toThrow(/never made without its cautions/);
  });
});

describe("overviewHtml(rows, options)", () => {
  it("escapes every text, keeps the sorted order, lists failed regions and the cautions, and loads nothing", () => {
    const rows = [
      overviewRowFromOutlook(outlookJson("<script>x</script> Low", 0.1, 0.2), "low", null),
      overviewRowFromOutlook(outlookJson("High & Dry", 0.4, 0.6), "high", null),
      failedOverviewRow("bad", ["bad/region.json:3: <b>"]),
    ];
    const html = overviewHtml(rows, { cautions: ["Caution one.", "Never for <evacuation>."], madeAt: "2027-03-10T08:00:00.000Z", toolVersion: "9.8.7", fontCss: "" });
    expect(html).not.toContain("<script>x");
    expect(html).toContain("&lt;script&gt;x&lt;/script&gt; Low");
    expect(html.indexOf("High &amp; Dry")).toBeLessThan(html.indexOf("&lt;script&gt;x"));
    expect(html).toContain("bad/region.json:3: &lt;b&gt;");
    expect(html).toContain("Never for &lt;evacuation&gt;.");
    expect(html).toContain("2 regions briefed, 1 not briefed · 2027 fire season · issued 2027-03-10");
    expect(html).not.toMatch(/(src|href)=["']?https?:/);
    expect(html).toContain("default-src 'none'");
  });
});
