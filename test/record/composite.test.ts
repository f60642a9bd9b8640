import { describe, expect, it } from "vitest";
import { compositeFireRecord } from "../../src/record/composite.js";
import { summarizeSampleDepth } from "../../src/record/sampleDepth.js";
import type { FireRecordInput, Site } from "../../src/workspace/types.js";

const site = (id: string, firstYear: number, lastYear: number): Site => ({ id, name: null, latitude: 45, longitude: -140, firstYear, lastYear });

/**
 * The 4-site example of test/fixtures/regions/valid, counted by hand:
 *   A 1700–1710, B 1702–1710, C 1700–1705, D 1704–1710
 *   fires: A 1701 1704 1708 · B 1704 1708 · C 1701 1705 · D 1704 1708 1710
 */
const FOUR_SITES: FireRecordInput = Object.freeze({
  kind: "sites",
  sites: [site("A", 1700, 1710), site("B", 1702, 1710), site("C", 1700, 1705), site("D", 1704, 1710)],
  events: [
    { site: "A", year: 1701 },
    { site: "A", year: 1704 },
    { site: "A", year: 1708 },
    { site: "B", year: 1704 },
    { site: "B", year: 1708 },
    { site: "C", year: 1701 },
    { site: "C", year: 1705 },
    { site: "D", year: 1704 },
    { site: "D", year: 1708 },
    { site: "D", year: 1710 },
  ],
});

// year: [sites recording, sites burned], counted by hand from the spans and fires above
const HAND_COUNT: [number, number, number][] = [
  [1700, 2, 0], // A C
  [1701, 2, 2], // A C; A and C burn
  [1702, 3, 0], // A B C
  [1703, 3, 0],
  [1704, 4, 3], // A B C D; A B D burn
  [1705, 4, 1], // C burns
  [1706, 3, 0], // A B D
  [1707, 3, 0],
  [1708, 3, 3], // A B D burn
  [1709, 3, 0],
  [1710, 3, 1], // D burns
];

describe("compositeFireRecord(input, minSitesRecording)", () => {
  it("counts sites recording and burned per year on the 4-site example (hand count)", () => {
    const activity = compositeFireRecord(FOUR_SITES, 3);
    expect(activity.years.map((y) => [y.year, y.sitesRecording, y.sitesBurned])).toEqual(HAND_COUNT);
    expect(activity.years.map((y) => y.fraction)).toEqual(HAND_COUNT.map(([, recording, burned]) => burned / recording));
    expect(activity.years[4]?.fraction).toBe(0.75);
    expect(activity.usableYears).toEqual([1702, 1703, 1704, 1705, 1706, 1707, 1708, 1709, 1710]);
    expect(activity.thinYears).toEqual([1700, 1701]);
    expect(activity.minSitesRecording).toBe(3);
  });

  it("with minSitesRecording = 4 only 1704 and 1705 are usable", () => {
    expect(compositeFireRecord(FOUR_SITES, 4).usableYears).toEqual([1704, 1705]);
  });

  it("leaves out years with no recording site, and counts a repeated or out-of-span event at most once", () => {
    const input: FireRecordInput = {
      kind: "sites",
      sites: [site("A", 1700, 1701), site("B", 1704, 1704)],
      events: [
        { site: "A", year: 1700 },
        { site: "A", year: 1700 },
        { site: "A", year: 1702 },
        { site: "Z", year: 1700 },
      ],
    };
    const activity = compositeFireRecord(input, 1);
    expect(activity.years).toEqual([
      { year: 1700, sitesRecording: 1, sitesBurned: 1, fraction: 1 },
      { year: 1701, sitesRecording: 1, sitesBurned: 0, fraction: 0 },
      { year: 1704, sitesRecording: 1, sitesBurned: 0, fraction: 0 },
    ]);
  });

  it("takes an already composited record row by row, sorted, leaving out rows with 0 sites recording", () => {
    const activity = compositeFireRecord(
      {
        kind: "activity",
        rows: [
          { year: 1801, sitesRecording: 4, sitesBurned: 1 },
          { year: 1800, sitesRecording: 0, sitesBurned: 0 },
          { year: 1799, sitesRecording: 2, sitesBurned: 2 },
        ],
      },
      3,
    );
    expect(activity.years).toEqual([
      { year: 1799, sitesRecording: 2, sitesBurned: 2, fraction: 1 },
      { year: 1801, sitesRecording: 4, sitesBurned: 1, fraction: 0.25 },
    ]);
    expect(activity.usableYears).toEqual([1801]);
    expect(activity.thinYears).toEqual([1799]);
  });

  it("gives empty lists for a record without sites, and throws RangeError for minSitesRecording < 1", () => {
    expect(compositeFireRecord({ kind: "sites", sites: [], events: [] }, 3)).toEqual({ years: [], usableYears: [], thinYears: [], minSitesRecording: 3 });
    expect(() => compositeFireRecord(FOUR_SITES, 0)).toThrow(RangeError);
    expect(() => compositeFireRecord(FOUR_SITES, 2.5)).toThrow(RangeError);
  });
});

describe("summarizeSampleDepth(activity)", () => {
  it("summarises the 4-site example: span, usable span, largest depth, one century row", () => {
    const summary = summarizeSampleDepth(compositeFireRecord(FOUR_SITES, 3));
    expect(summary).toEqual({
      firstYear: 1700,
      lastYear: 1710,
      firstUsableYear: 1702,
      lastUsableYear: 1710,
      usableYears: 9,
      thinYears: 2,
      gapYears: 0,
      maxSites: 4,
      maxSitesYear: 1704,
      events: 10,
      minSitesRecording: 3,
      // mean sites = (2+2+3+3+4+4+3+3+3+3+3) / 11 = 33/11 = 3
      byCentury: [{ century: 1700, yearsRecorded: 11, minSites: 2, maxSites: 4, meanSites: 3, events: 10 }],
    });
  });

  it("splits centuries and counts gap years", () => {
    const summary = summarizeSampleDepth(
      compositeFireRecord({ kind: "sites", sites: [site("A", 1698, 1700), site("B", 1705, 1705)], events: [{ site: "A", year: 1699 }] }, 1),
    );
    expect(summary.byCentury.map((c) => [c.century, c.yearsRecorded, c.events])).toEqual([
      [1600, 2, 1],
      [1700, 2, 0],
    ]);
    expect(summary.gapYears).toBe(4);
  });

  it("gives nulls for an empty record", () => {
    const summary = summarizeSampleDepth(compositeFireRecord({ kind: "sites", sites: [], events: [] }, 3));
    expect([summary.firstYear, summary.firstUsableYear, summary.maxSites, summary.byCentury]).toEqual([null, null, null, []]);
  });
});
