import type { FireRecordInput } from "../workspace/types.js";
import type { FireActivity, YearActivity } from "./types.js";

/**
 * Fire-record composite: for every year, the number of sites recording (sites whose recording
 * span first_year…last_year covers the year), the number of those sites with a fire that year,
 * and the fraction burned = sites burned / sites recording. Years with no recording site are
 * absent; years with at least `minSitesRecording` recording sites are usable for calibration, the
 * others are listed as thin years.
 *
 * An already composited record (`kind: "activity"`) is taken row by row; rows with 0 sites
 * recording are left out. A fire event at a site that is not recording that year, or repeated for
 * the same site and year, is counted at most once and only inside the span (the reader reports
 * both as input problems before this runs).
 *
 * @param input - sites with their fire events, or an already composited record
 * @param minSitesRecording - the fewest recording sites a usable year needs, an integer ≥ 1
 * @returns the yearly activity, ascending; empty lists when the record has no recording year
 * @throws RangeError when `minSitesRecording` is not an integer ≥ 1
 * @example
 * compositeFireRecord({ kind: "sites", sites: [
 *   { id: "A", name: null, latitude: 0, longitude: 0, firstYear: 1700, lastYear: 1702 },
 *   { id: "B", name: null, latitude: 0, longitude: 0, firstYear: 1701, lastYear: 1702 } ],
 *   events: [{ site: "A", year: 1701 }, { site: "B", year: 1701 }] }, 2).years[1];
 * // => { year: 1701, sitesRecording: 2, sitesBurned: 2, fraction: 1 }
 */
export function compositeFireRecord(input: FireRecordInput, minSitesRecording: number): FireActivity {
  if (!Number.isInteger(minSitesRecording) || minSitesRecording < 1) {
    throw new RangeError(`minSitesRecording must be an integer ≥ 1 (found ${minSitesRecording})`);
  }
  const years: YearActivity[] = [];
  if (input.kind === "activity") {
    const rows = [...input.rows].sort((a, b) => a.year - b.year);
    for (const row of rows) {
      if (row.sitesRecording > 0) {
        years.push({
          year: row.year,
          sitesRecording: row.sitesRecording,
          sitesBurned: row.sitesBurned,
          fraction: row.sitesBurned / row.sitesRecording,
        });
      }
    }
  } else if (input.sites.length > 0) {
    // Loops, not Math.min(...array): a spread of 130,000 sites overflows the call stack.
    let firstYear = Infinity;
    let lastYear = -Infinity;
    for (const site of input.sites) {
      if (site.firstYear < firstYear) firstYear = site.firstYear;
      if (site.lastYear > lastYear) lastYear = site.lastYear;
    }
    const span = lastYear - firstYear + 1;
    const recording = new Array<number>(span).fill(0);
    const burned = new Array<number>(span).fill(0);
    const spans = new Map(input.sites.map((site) => [site.id, site]));
    for (const site of input.sites) {
      for (let year = site.firstYear; year <= site.lastYear; year++) {
        recording[year - firstYear] = (recording[year - firstYear] as number) + 1;
      }
    }
    const counted = new Set<string>();
    for (const event of input.events) {
      const site = spans.get(event.site);
      const key = `${event.site}\u0000${event.year}`;
      if (site === undefined || event.year < site.firstYear || event.year > site.lastYear || counted.has(key)) continue;
      counted.add(key);
      burned[event.year - firstYear] = (burned[event.year - firstYear] as number) + 1;
    }
    for (let offset = 0; offset < span; offset++) {
      const sitesRecording = recording[offset] as number;
      if (sitesRecording === 0) continue;
      const sitesBurned = burned[offset] as number;
      years.push({ year: firstYear + offset, sitesRecording, sitesBurned, fraction: sitesBurned / sitesRecording });
    }
  }
  return {
    years,
    usableYears: years.filter((y) => y.sitesRecording >= minSitesRecording).map((y) => y.year),
    thinYears: years.filter((y) => y.sitesRecording < minSitesRecording).map((y) => y.year),
    minSitesRecording,
  };
}
