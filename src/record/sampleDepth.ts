import type { FireActivity } from "./types.js";

/** Sample depth of one century (or part of it) of the fire record. */
export interface CenturyDepth {
  /** First year of the century, e.g. 1700 for 1700–1799. */
  readonly century: number;
  /** Years of the century with at least one recording site. */
  readonly yearsRecorded: number;
  /** Fewest, most and mean recording sites over those years. */
  readonly minSites: number;
  readonly maxSites: number;
  readonly meanSites: number;
  /** Fire events (site-years burned) in the century. */
  readonly events: number;
}

/** A short description of how many sites record the fire history through time. */
export interface SampleDepthSummary {
  /** First and last year with a recording site; null for an empty record. */
  readonly firstYear: number | null;
  readonly lastYear: number | null;
  /** First and last usable year (≥ minSitesRecording sites); null when none. */
  readonly firstUsableYear: number | null;
  readonly lastUsableYear: number | null;
  readonly usableYears: number;
  readonly thinYears: number;
  /** Years between firstYear and lastYear with no recording site at all. */
  readonly gapYears: number;
  /** Largest sample depth and the first year it is reached; null for an empty record. */
  readonly maxSites: number | null;
  readonly maxSitesYear: number | null;
  /** Total fire events (site-years burned). */
  readonly events: number;
  readonly minSitesRecording: number;
  /** One row per century that has a recording year, ascending. */
  readonly byCentury: readonly CenturyDepth[];
}

/**
 * Sample-depth summary of a composited fire record: the span, the usable span (years with at
 * least minSitesRecording recording sites), gaps, the largest depth, and per century the
 * fewest, most and mean number of recording sites (mean = Σ sites recording / years recorded).
 * Sample depth falls back in time in most fire-scar records, so this tells a reader how much
 * evidence stands behind each part of the record.
 *
 * @param activity - a composited record from `compositeFireRecord`
 * @returns the summary; nulls and an empty `byCentury` for an empty record
 * @example
 * // sites A 1700–1710, B 1702–1710, C 1700–1705, D 1704–1710, at least 3 recording
 * summarizeSampleDepth(compositeFireRecord(fourSites, 3)).firstUsableYear; // => 1702
 */
export function summarizeSampleDepth(activity: FireActivity): SampleDepthSummary {
  const years = activity.years;
  const first = years[0];
  const last = years[years.length - 1];
  let maxSites: number | null = null;
  let maxSitesYear: number | null = null;
  let events = 0;
  const centuries = new Map<number, { years: number; min: number; max: number; sum: number; events: number }>();
  for (const year of years) {
    events += year.sitesBurned;
    if (maxSites === null || year.sitesRecording > maxSites) {
      maxSites = year.sitesRecording;
      maxSitesYear = year.year;
    }
    const century = Math.floor(year.year / 100) * 100;
    const row = centuries.get(century) ?? { years: 0, min: Infinity, max: 0, sum: 0, events: 0 };
    row.years += 1;
    row.min = Math.min(row.min, year.sitesRecording);
    row.max = Math.max(row.max, year.sitesRecording);
    row.sum += year.sitesRecording;
    row.events += year.sitesBurned;
    centuries.set(century, row);
  }
  const usable = activity.usableYears;
  return {
    firstYear: first?.year ?? null,
    lastYear: last?.year ?? null,
    firstUsableYear: usable[0] ?? null,
    lastUsableYear: usable[usable.length - 1] ?? null,
    usableYears: usable.length,
    thinYears: activity.thinYears.length,
    gapYears: first === undefined || last === undefined ? 0 : last.year - first.year + 1 - years.length,
    maxSites,
    maxSitesYear,
    events,
    minSitesRecording: activity.minSitesRecording,
    byCentury: [...centuries.entries()]
      .sort(([a], [b]) => a - b)
      .map(([century, row]) => ({
        century,
        yearsRecorded: row.years,
        minSites: row.min,
        maxSites: row.max,
        meanSites: row.sum / row.years,
        events: row.events,
      })),
  };
}
