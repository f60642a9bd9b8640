import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import {
  coreCautions,
  failedOverviewRow,
  comparedWords,
  overviewCsv,
  overviewDateline,
  overviewDateNotes,
  overviewFooterText,
  overviewProvisionalNote,
  overviewRanks,
  overviewHtml,
  overviewRowFromOutlook,
  overviewSkill,
  sortOverviewRows,
} from "../../src/briefing/overview.js";

function outlookJson(name: string, estimate: number | null, upper: number | null, dates: { issued?: string; season?: number } = {}) {
  const hasSkill = estimate !== null && estimate > 0.3;
  return {
    schema: "firephase.outlook/1",
    issued: dates.issued ?? "2027-03-10",
    season: dates.season ?? 2027,
    region: { name },
    baseRate: { estimate: 0.1, lower: 0.07, upper: 0.15 },
    current: [{ index: "ENSO", value: 1.2, label: "warm" }],
    fireYear: {
      estimate,
      lower: estimate === null ? null : estimate / 2,
      upper,
      basis: `the years like ${name}`,
      comparedWithBase: "not distinguishable",
      selectionInterval: estimate === null ? null : { lower: estimate / 4, upper: 0.6, resamples: 999, blockYears: 5, level: 0.95, seed: 1, method: "…" },
    },
    hindcast: { hasSkill, brierSkillScore: hasSkill ? 0.06 : -0.01, skillPValue: hasSkill ? 0.002 : 0.6, verdict: `Verdict of ${name}. More words.` },
  };
}

const PAGE = { cautions: ["Caution one."], madeAt: "2027-03-10T08:15:42.000Z", toolVersion: "9.8.7", fontCss: "" };

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
      compared: "not distinguishable",
      selection: { estimate: null, lower: 0.0875, upper: 0.6 },
      hasSkill: true,
      skill: "Some skill",
      verdict: "Verdict of North. More words.",
      basis: "the years like North",
      provisional: [],
      pdf: "/out/north.pdf",
      problem: null,
    });
  });
});

describe("comparedWords(row): the comparison with the average year as the briefing makes it", () => {
  it("says 'Not clearly different' with the interval that allows for the choice of index, and Higher/Lower only as the outlook says", () => {
    const row = overviewRowFromOutlook(outlookJson("North", 0.22, 0.32), "north", null);
    expect(comparedWords(row)).toBe("Not clearly different (allowing for the choice of index: 6\u201360%)");
    expect(comparedWords({ ...row, compared: "higher" })).toBe("Higher");
    expect(comparedWords({ ...row, compared: "lower" })).toBe("Lower");
    expect(comparedWords({ ...row, compared: null })).toBe("Not known");
  });
});

describe("overviewSkill(outlook JSON): the verdict in words from the structured hindcast fields", () => {
  const base = outlookJson("North", 0.2, 0.3);
  const withHindcast = (hindcast: Record<string, unknown>, current: unknown[] = base.current) => ({ ...base, current, hindcast: { verdict: "Any sentence. At all.", ...hindcast } });
  it.each([
    ["BSS 0.06, p = 0.002, hasSkill", "Some skill", withHindcast({ hasSkill: true, brierSkillScore: 0.06, skillPValue: 0.002 })],
    ["BSS 0.03 but p = 0.31 (chance reaches it)", "No skill", withHindcast({ hasSkill: false, brierSkillScore: 0.03, skillPValue: 0.31 })],
    ["BSS −0.02, p = 0.8", "No skill", withHindcast({ hasSkill: false, brierSkillScore: -0.02, skillPValue: 0.8 })],
    ["scores but no chance test, with its reason", "Not tested", withHindcast({ hasSkill: false, brierSkillScore: 0.04, skillPValue: null, skillPValueReason: "skipped past the work bound" })],
    ["no Brier skill score (too few years)", "Too little data", withHindcast({ hasSkill: false, brierSkillScore: null, skillPValue: null, skillPValueReason: "too few years" })],
    ["a score but no p and no reason", "Too little data", withHindcast({ hasSkill: false, brierSkillScore: 0.04, skillPValue: null })],
    ["no current index value (the average year)", "Does not apply", withHindcast({ hasSkill: false, brierSkillScore: 0.01, skillPValue: 0.4 }, [])],
    ["no hindcast object", null, { ...base, hindcast: undefined }],
  ] as const)("%s → %s", (_, expected, json) => {
    expect(overviewSkill(json)).toBe(expected);
  });

  it("never reads the sentence: a verdict sentence saying 'Some skill' with hasSkill false is 'No skill'", () => {
    expect(overviewSkill(withHindcast({ hasSkill: false, brierSkillScore: 0.03, skillPValue: 0.2, verdict: "Some skill: …" }))).toBe("No skill");
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
      "rank,region,folder,status,season,issued,chance,chance_lower,chance_upper,base_rate,base_rate_lower,base_rate_upper,compared_with_average,selection_lower,selection_upper,has_skill,skill,skill_verdict,basis,pdf,problem",
    );
    expect(lines[1]).toBe(
      `1,"'=HYPERLINK(""x"")","ridge, east",briefed,2027,2027-03-10,0.123456789,0.0617283945,0.2,0.1,0.07,0.15,not distinguishable,0.03086419725,0.6,no,No skill,"Verdict of =HYPERLINK(""x""). More words.","the years like =HYPERLINK(""x"")",,`,
    );
    expect(lines[2]).toBe(`,bad,bad,failed,,,,,,,,,,,,,,,,,"bad/region.json:3: name is ""-1"""`);
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
    expect(html).toContain("2 regions briefed, 1 not briefed");
    expect(html).not.toMatch(/(src|href)=["']?https?:/);
    expect(html).toContain("default-src 'none'");
  });

  it("writes the hindcast column as a short verdict, never the verdict sentence cut off", () => {
    const long = { ...outlookJson("North", 0.4, 0.6), hindcast: { hasSkill: true, brierSkillScore: 0.06, skillPValue: 0.002, verdict: `Some skill: ${"a long sentence ".repeat(20)}.` } };
    const html = overviewHtml([overviewRowFromOutlook(long, "north", null), overviewRowFromOutlook(outlookJson("South", 0.1, 0.2), "south", null)], PAGE);
    expect(html).toContain('<td class="skill">Some skill</td>');
    expect(html).toContain('<td class="skill">No skill</td>');
    expect(html).not.toContain("a long sentence");
    expect(html).not.toContain("…");
    expect(html).toContain("<th>Hindcast skill</th>");
  });

  it("dates the page as the single briefings do: 'Issued 10 March 2027 for the 2027 fire season', 'Made 10 March 2027, 08:15 UTC'", () => {
    const rows = [overviewRowFromOutlook(outlookJson("North", 0.4, 0.6), "north", null)];
    const html = overviewHtml(rows, PAGE);
    expect(html).toContain('<p class="dateline"><strong>Issued 10 March 2027</strong> for the 2027 fire season</p>');
    expect(html).toContain("1 region briefed · Made 10 March 2027, 08:15 UTC with firephase 9.8.7.");
    expect(html).not.toContain("2027-03-10T08:15");
    expect(overviewFooterText(rows)).toBe("Overview of 1 region · fire-season outlook 2027 · Issued 10 March 2027");
    expect(overviewDateNotes(rows)).toEqual([]);
    expect(html).not.toContain('class="dates-differ"');
  });
});

describe("overviewDateNotes(rows), overviewDateline(rows), overviewFooterText(rows): regions of different dates or seasons", () => {
  const rows = [
    overviewRowFromOutlook(outlookJson("North", 0.4, 0.6, { issued: "2027-03-15", season: 2027 }), "north", null),
    overviewRowFromOutlook(outlookJson("South", 0.2, 0.3, { issued: "2027-03-10", season: 2027 }), "south", null),
    overviewRowFromOutlook(outlookJson("East", 0.3, 0.4, { issued: "2027-03-10", season: 2028 }), "east", null),
    failedOverviewRow("bad", ["bad/region.json:3: oops"]),
  ];

  it("says plainly which regions were issued on which date and for which season, dates and seasons ascending", () => {
    expect(overviewDateNotes(rows)).toEqual([
      "Regions were issued on different dates: 10 March 2027 (East, South); 15 March 2027 (North). Each region's odds use what was known on its own date.",
      "The regions' fire seasons differ: 2027 (North, South); 2028 (East). Odds for different seasons are not the same question: compare those rows with care.",
    ]);
    expect(overviewDateNotes(rows.slice(1, 2).concat(rows.slice(0, 1)))).toHaveLength(1); // same season, two dates
    expect(overviewDateline(rows)).toEqual({ issuedText: "Issued on 2 different dates, 10 March 2027 to 15 March 2027", seasonText: "for the 2027 and 2028 fire seasons" });
    expect(overviewFooterText(rows)).toBe("Overview of 4 regions · fire-season outlooks 2027 and 2028 · Issued 10 March 2027 to 15 March 2027");
  });

  it("prints the notes above the table and each row's own issue date and season", () => {
    const html = overviewHtml(rows, PAGE);
    expect(html).toContain('<div class="dates-differ"><p>Regions were issued on different dates: 10 March 2027 (East, South); 15 March 2027 (North).');
    expect(html.indexOf("dates-differ\">")).toBeLessThan(html.indexOf("<table>"));
    expect(html).toContain('<div class="muted small">north</div><div class="muted small">Issued 15 March 2027</div><div class="muted small">2027 season</div>');
    expect(html).toContain('<div class="muted small">east</div><div class="muted small">Issued 10 March 2027</div><div class="muted small">2028 season</div>');
    // Only what differs: one season, two dates.
    const sameSeason = overviewHtml(rows.slice(0, 2), PAGE);
    expect(sameSeason).toContain('<div class="muted small">north</div><div class="muted small">Issued 15 March 2027</div></td>');
    expect(sameSeason).not.toContain("2027 season</div>");
  });

  it("names a region by its folder too when another region has the same name", () => {
    const twins = [
      overviewRowFromOutlook(outlookJson("Ridge", 0.4, 0.6, { issued: "2027-03-15" }), "copies/ridge-a", null),
      overviewRowFromOutlook(outlookJson("Ridge", 0.2, 0.3), "copies/ridge-b", null),
    ];
    expect(overviewDateNotes(twins)[0]).toBe(
      "Regions were issued on different dates: 10 March 2027 (Ridge in copies/ridge-b); 15 March 2027 (Ridge in copies/ridge-a). Each region's odds use what was known on its own date.",
    );
  });

  it("lists at most five regions per date, then counts the rest", () => {
    const many = ["A", "B", "C", "D", "E", "F", "G"].map((name) => overviewRowFromOutlook(outlookJson(name, 0.2, 0.3), name.toLowerCase(), null));
    const other = overviewRowFromOutlook(outlookJson("H", 0.2, 0.3, { issued: "2027-03-01" }), "h", null);
    expect(overviewDateNotes([...many, other])[0]).toBe(
      "Regions were issued on different dates: 1 March 2027 (H); 10 March 2027 (A, B, C, D, E and 2 more). Each region's odds use what was known on its own date.",
    );
  });
});

describe("overviewProvisionalNote(rows): the regions whose odds use a provisional index value", () => {
  it("names each such region with its provisional indices (in the overview's order), and says nothing when there is none", () => {
    const north = { ...outlookJson("North", 0.35, 0.5), current: [{ index: "PMI", value: -1.65, provisional: true }, { index: "ENSO", value: 0.2, provisional: false }] };
    const south = { ...outlookJson("South", 0.2, 0.3), current: [{ index: "ENSO", value: 0.2, provisional: false }] };
    const east = { ...outlookJson("East", 0.4, 0.6), current: [{ index: "PMI", value: -0.4, provisional: true }, { index: "WSI", value: 1.1, provisional: true }] };
    const rows = [north, south, east].map((json, i) => overviewRowFromOutlook(json, `r${i}`, null));
    expect(rows.map((row) => row.provisional)).toEqual([["PMI"], [], ["PMI", "WSI"]]);
    expect(overviewProvisionalNote(rows)).toBe(
      "Provisional index values: East (PMI, WSI); North (PMI). Their windows are not complete yet, so those odds may change when the remaining months are in; each briefing says which months it used.",
    );
    expect(overviewProvisionalNote([rows[1] as (typeof rows)[number], failedOverviewRow("bad", ["bad/region.json: broken"])])).toBeNull();
    const page = overviewHtml([...rows], PAGE);
    expect(page).toContain("Provisional index values: East (PMI, WSI); North (PMI).");
    expect(page).toContain("<h2>Cautions</h2>");
  });
});

describe("overviewRanks(sorted rows): equal odds share a rank", () => {
  it("ranks 1, 1, 3 when the first two have the same odds and interval, and gives failed regions none (CSV and page alike)", () => {
    const rows = sortOverviewRows([
      overviewRowFromOutlook(outlookJson("North", 0.35, 0.5), "north", null),
      overviewRowFromOutlook(outlookJson("South", 0.35, 0.5), "south", null),
      overviewRowFromOutlook(outlookJson("East", 0.2, 0.3), "east", null),
      failedOverviewRow("bad", ["bad/region.json: broken"]),
    ]);
    expect(overviewRanks(rows)).toEqual([1, 1, 3, null]);
    expect(overviewCsv(rows).split("\n").slice(1, 5).map((line) => line.split(",")[0])).toEqual(["1", "1", "3", ""]);
  });
});
