import { readCsvTable } from "./csvTable.js";
import { readInteger, readNumber, readOptionalNumber } from "./fields.js";
import type { ProblemList } from "./InputError.js";
import { echoText, TEXT_LIMITS } from "./limits.js";
import type { ActivityRow, FireEvent, ModernFireRow, Site, Warning } from "./types.js";

/** A value read from a CSV row, with the line it came from. */
export interface Located<T> {
  readonly line: number;
  readonly value: T;
}

/** Years are whole numbers in this range (years before 1 CE are zero or negative). */
const YEAR_RANGE = { min: -9999, max: 9999 } as const;

/** Adds a problem for every value whose key was already seen, naming both lines. */
function checkUnique<T>(rows: readonly Located<T>[], key: (value: T) => string, describe: (value: T) => string, problems: ProblemList): void {
  const first = new Map<string, number>();
  for (const row of rows) {
    const k = key(row.value);
    const earlier = first.get(k);
    if (earlier === undefined) first.set(k, row.line);
    else problems.add(row.line, `${describe(row.value)} appears twice (lines ${earlier} and ${row.line})`);
  }
}

/**
 * Sites reader for `fire-sites.csv` (`site,latitude,longitude,first_year,last_year`, optional
 * `name`): one row per site; the recording span first_year…last_year is inclusive.
 *
 * @param bytes - the file's content
 * @param problems - collects every problem: a missing id, latitude outside −90…90, longitude
 *   outside −180…180, non-integer years, first_year after last_year, a site id given twice
 * @returns the valid sites with their lines
 */
export function readSitesCsv(bytes: Uint8Array, problems: ProblemList): Located<Site>[] {
  const table = readCsvTable(bytes, ["site", "latitude", "longitude", "first_year", "last_year"], problems);
  if (table === null) return [];
  const sites: Located<Site>[] = [];
  for (const row of table.rows) {
    const id = row.field("site");
    const name = row.field("name");
    if (id === "") problems.add(row.line, "site must not be empty (found an empty cell)");
    const tooLong =
      id.length > TEXT_LIMITS.siteId
        ? `site id is too long: at most ${TEXT_LIMITS.siteId} characters (found ${id.length})`
        : name.length > TEXT_LIMITS.siteName
          ? `name is too long: at most ${TEXT_LIMITS.siteName} characters (found ${name.length})`
          : null;
    if (tooLong !== null) problems.add(row.line, tooLong);
    const latitude = readNumber(row.field("latitude"), "latitude", row.line, problems, { min: -90, max: 90 });
    const longitude = readNumber(row.field("longitude"), "longitude", row.line, problems, { min: -180, max: 180 });
    const firstYear = readInteger(row.field("first_year"), "first_year", row.line, problems, YEAR_RANGE);
    const lastYear = readInteger(row.field("last_year"), "last_year", row.line, problems, YEAR_RANGE);
    if (firstYear !== null && lastYear !== null && firstYear > lastYear) {
      problems.add(row.line, `first_year must not be after last_year (found ${firstYear} > ${lastYear})`);
      continue;
    }
    if (id === "" || tooLong !== null || latitude === null || longitude === null || firstYear === null || lastYear === null) continue;
    sites.push({ line: row.line, value: { id, name: name === "" ? null : name, latitude, longitude, firstYear, lastYear } });
  }
  checkUnique(sites, (site) => site.id, (site) => `site "${echoText(site.id)}"`, problems);
  return sites;
}

/**
 * Fire events reader for `fire-events.csv` (`site,year`): one row per site and fire year. A
 * repeated (site, year) pair is counted once and reported as one warning for the file.
 *
 * @param bytes - the file's content
 * @param problems - collects problems: an empty site id, a year that is not an integer
 * @param file - the file as shown to the user, for the warning
 * @returns the distinct events with the line of their first row, and the warnings
 */
export function readEventsCsv(bytes: Uint8Array, problems: ProblemList, file: string): { events: Located<FireEvent>[]; warnings: Warning[] } {
  const table = readCsvTable(bytes, ["site", "year"], problems);
  if (table === null) return { events: [], warnings: [] };
  const events: Located<FireEvent>[] = [];
  const firstLine = new Map<string, number>();
  const repeats: string[] = [];
  let repeatCount = 0;
  // The file may have a million rows: read them without an object per row.
  const read = table.columnReader(["site", "year"]);
  const fields: string[] = [];
  for (let row = 0; row < table.rowCount; row++) {
    read(row, fields);
    const line = table.lineOf(row);
    const site = fields[0] as string;
    if (site === "") problems.add(line, "site must not be empty (found an empty cell)");
    else if (site.length > TEXT_LIMITS.siteId) {
      problems.add(line, `site id is too long: at most ${TEXT_LIMITS.siteId} characters (found ${site.length})`);
      continue;
    }
    const year = readInteger(fields[1] as string, "year", line, problems, YEAR_RANGE);
    if (site === "" || year === null) continue;
    const key = `${site}\u0000${year}`;
    const earlier = firstLine.get(key);
    if (earlier !== undefined) {
      repeatCount++;
      if (repeats.length < 5) repeats.push(`${echoText(site)} ${year} (lines ${earlier} and ${line})`);
      continue;
    }
    firstLine.set(key, line);
    events.push({ line, value: { site, year } });
  }
  const warnings: Warning[] = [];
  if (repeatCount > 0) {
    const shown = repeats.join("; ");
    const more = repeatCount > 5 ? `; and ${repeatCount - 5} more` : "";
    warnings.push({
      code: "duplicate-event",
      message: `${file}: ${repeatCount} repeated fire event${repeatCount === 1 ? "" : "s"} counted once: ${shown}${more}`,
    });
  }
  return { events, warnings };
}

/**
 * Composited record reader for `fire-activity.csv` (`year,sites_recording,sites_burned`).
 *
 * @param bytes - the file's content
 * @param problems - collects problems: non-integer or repeated years, counts that are not
 *   integers ≥ 0, sites_burned greater than sites_recording
 * @returns the valid rows
 */
export function readActivityCsv(bytes: Uint8Array, problems: ProblemList): Located<ActivityRow>[] {
  const table = readCsvTable(bytes, ["year", "sites_recording", "sites_burned"], problems);
  if (table === null) return [];
  const rows: Located<ActivityRow>[] = [];
  for (const row of table.rows) {
    const year = readInteger(row.field("year"), "year", row.line, problems, YEAR_RANGE);
    const sitesRecording = readInteger(row.field("sites_recording"), "sites_recording", row.line, problems, { min: 0 });
    const sitesBurned = readInteger(row.field("sites_burned"), "sites_burned", row.line, problems, { min: 0 });
    if (sitesRecording !== null && sitesBurned !== null && sitesBurned > sitesRecording) {
      problems.add(row.line, `sites_burned must not exceed sites_recording (found ${sitesBurned} > ${sitesRecording})`);
      continue;
    }
    if (year === null || sitesRecording === null || sitesBurned === null) continue;
    rows.push({ line: row.line, value: { year, sitesRecording, sitesBurned } });
  }
  checkUnique(rows, (r) => String(r.year), (r) => `year ${r.year}`, problems);
  return rows;
}

/**
 * Modern fire record reader for `modern-fires.csv` (`year,fires,area_ha`); an empty cell is a
 * missing value.
 *
 * @param bytes - the file's content
 * @param problems - collects problems: non-integer or repeated years, a negative or fractional
 *   count of fires, a negative area
 * @returns the valid rows
 */
export function readModernCsv(bytes: Uint8Array, problems: ProblemList): Located<ModernFireRow>[] {
  const table = readCsvTable(bytes, ["year", "fires", "area_ha"], problems);
  if (table === null) return [];
  const rows: Located<ModernFireRow>[] = [];
  for (const row of table.rows) {
    const year = readInteger(row.field("year"), "year", row.line, problems, YEAR_RANGE);
    const firesText = row.field("fires");
    const fires = firesText === "" ? null : readInteger(firesText, "fires", row.line, problems, { min: 0 });
    const areaHa = readOptionalNumber(row.field("area_ha"), "area_ha", row.line, problems, { min: 0 });
    if (year === null || (firesText !== "" && fires === null) || areaHa === undefined) continue;
    rows.push({ line: row.line, value: { year, fires, areaHa } });
  }
  checkUnique(rows, (r) => String(r.year), (r) => `year ${r.year}`, problems);
  return rows;
}
