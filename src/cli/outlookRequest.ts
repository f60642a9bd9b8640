import { addYears } from "date-fns/addYears";
import { differenceInCalendarDays } from "date-fns/differenceInCalendarDays";
import { format } from "date-fns/format";
import { getMonth } from "date-fns/getMonth";
import { isValid } from "date-fns/isValid";
import { parseISO } from "date-fns/parseISO";
import type { Command } from "commander";
import { currentSeasonValue } from "../climate/currentSeasonValue.js";
import type { OutlookRequest, OutlookValueDetail } from "../outlook/buildOutlook.js";
import { InputError } from "../workspace/InputError.js";
import type { Workspace } from "../workspace/types.js";
import { UsageError } from "./errors.js";
import { join } from "node:path";

export interface OutlookOptions {
  /** `--values NAME=V,…`; the option may be given more than once (commander collects them). */
  readonly values?: string | readonly string[];
  readonly issued?: string;
  readonly season?: string;
}

/** Collects a repeatable commander option into a list. */
export function collectOption(value: string, previous: readonly string[] | undefined): string[] {
  return [...(previous ?? []), value];
}

/**
 * Adds the options that choose the season and its index values (`--values`, `--issued`,
 * `--season`), shared by `outlook` and `brief` so both read them the same way.
 */
export function addOutlookOptions(command: Command): Command {
  return command
    .option(
      "--values <list>",
      "this season's index values, e.g. ENSO=1.2,NAO=-0.4 (default: computed from the index files; may be repeated)",
      collectOption,
    )
    .option("--issued <date>", "issue date YYYY-MM-DD (default: today, or region.json's when it is for this season or later)")
    .option("--season <year>", "fire season year (default: the issue year; the next year for an issue date in Oct–Dec)");
}

/** Largest magnitude accepted in `--values`: beyond it a number cannot be on any index's scale. */
export const MAX_VALUE_MAGNITUDE = 1e6;

const DECIMAL = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;
const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;
const MONTH_NAMES = [
  "January", "February", "March", "April", "May", "June", "July", "August", "September", "October", "November", "December",
] as const;

/**
 * Season of an issue date: the fire season an outlook issued on that day is for — the issue
 * year, or the next year for an issue date in October–December (the coming fire season is then
 * next year's).
 *
 * @param date - the issue date (local calendar date)
 * @returns the season year
 * @example
 * seasonOfIssueDate(new Date(2026, 11, 3)); // => 2027
 * seasonOfIssueDate(new Date(2027, 2, 10)); // => 2027
 */
export function seasonOfIssueDate(date: Date): number {
  return getMonth(date) >= 9 ? date.getFullYear() + 1 : date.getFullYear();
}

/**
 * A calendar date written YYYY-MM-DD, checked to exist (2027-02-30 does not).
 *
 * @param text - the date as typed
 * @param what - the name used in messages ("--issued")
 * @returns the date at local midnight
 * @throws UsageError when the text is not YYYY-MM-DD or names a day that does not exist
 * @example
 * parseIssueDate("2027-03-10", "--issued"); // => Date of 10 March 2027
 */
export function parseIssueDate(text: string, what: string): Date {
  const match = ISO_DATE.exec(text.trim());
  if (match === null) throw new UsageError(`${what}: expected a date as YYYY-MM-DD, found "${text}"`);
  const [year, month, day] = [Number(match[1]), Number(match[2]), Number(match[3])];
  if (month < 1 || month > 12) throw new UsageError(`${what}: ${text.trim()} does not exist (there is no month ${match[2]})`);
  const daysInMonth = new Date(2000, month, 0).getDate() - (month === 2 && !isLeapYear(year) ? 1 : 0);
  if (day < 1 || day > daysInMonth) {
    throw new UsageError(`${what}: ${text.trim()} does not exist (${MONTH_NAMES[month - 1]} ${year} has ${daysInMonth} days)`);
  }
  const date = parseISO(text.trim());
  if (!isValid(date)) throw new UsageError(`${what}: ${text.trim()} does not exist`);
  return date;
}

function isLeapYear(year: number): boolean {
  return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
}

/** First year with a value in any index record of the region; null when no index has a value. */
function firstIndexYear(workspace: Workspace): number | null {
  let first: number | null = null;
  for (const series of workspace.indices) {
    for (let i = 0; i < series.years.length; i += 1) {
      const year = series.years[i] as number;
      if (series.values[i] !== null && series.values[i] !== undefined) {
        if (first === null || year < first) first = year;
        break;
      }
    }
  }
  return first;
}

/** The dates of an outlook request and the notes about how they were chosen. */
export interface OutlookDates {
  /** Issue date, YYYY-MM-DD. */
  readonly issued: string;
  readonly season: number;
  /** Season that region.json's `outlook.values` were written for (null when it does not say). */
  readonly valuesSeason: number | null;
  /** Whether region.json's `outlook.values` apply to `season` (see {@link resolveOutlookDates}). */
  readonly useFileValues: boolean;
  readonly notes: readonly { readonly code: string; readonly message: string }[];
}

/**
 * Issue date and season of an outlook, by these rules (README "Dates and seasons"):
 * - **issue date**: `--issued`; else region.json `outlook.issued` when the season of that date is
 *   not earlier than the season of today; else today (the local date of the injected clock);
 * - **season**: `--season`; else region.json `outlook.season` when it is not earlier than the
 *   season of the issue date; else the season of the issue date (the issue year, or the next year
 *   for an issue date in October–December);
 * - region.json `outlook.values` were written for `outlook.season`, or failing that for the
 *   season of `outlook.issued`; they are used only when that is the season issued (or region.json
 *   names neither, which is said in a note), otherwise ignored with a note that names them;
 * - plausible range: the issue date and the season may not lie before the first year of the index
 *   records nor more than a year after today (season at most the season of today + 1).
 * An ignored region.json date is reported in a note, and so is an issue date after today (code
 * `issued-ahead`: the briefing is dated ahead of the day it is made; allowed up to a year ahead).
 *
 * @param workspace - the loaded region
 * @param options - `--issued` and `--season` as typed
 * @param today - today (local calendar date; tests pass a fixed date)
 * @returns the dates and notes
 * @throws UsageError for a malformed, non-existent or implausible `--issued`/`--season`
 * @throws InputError naming region.json for an implausible `outlook.issued`/`outlook.season` there
 * @example
 * resolveOutlookDates(workspace, {}, new Date(2028, 2, 1)); // region.json for 2027 → { issued: "2028-03-01", season: 2028, … }
 */
export function resolveOutlookDates(workspace: Workspace, options: OutlookOptions, today: Date): OutlookDates {
  const file = workspace.settings.outlook;
  const regionJson = join(workspace.shownRoot ?? workspace.root, "region.json");
  const notes: { code: string; message: string }[] = [];
  const todayText = format(today, "yyyy-MM-dd");
  const todaySeason = seasonOfIssueDate(today);
  const latestDate = addYears(today, 1);
  const firstYear = firstIndexYear(workspace);
  const fileProblem = (message: string): InputError => new InputError([{ file: regionJson, line: null, message }]);

  let issuedDate: Date;
  if (options.issued !== undefined) {
    issuedDate = parseIssueDate(options.issued, "--issued");
    const text = format(issuedDate, "yyyy-MM-dd");
    if (issuedDate > latestDate) {
      throw new UsageError(`--issued: ${text} is more than a year after today (${todayText}); an outlook cannot be issued that far ahead`);
    }
    if (firstYear !== null && issuedDate.getFullYear() < firstYear) {
      throw new UsageError(`--issued: ${text} is before the index records begin (${firstYear}); no outlook can be issued then`);
    }
  } else if (file.issued !== null) {
    let fileDate: Date;
    try {
      fileDate = parseIssueDate(file.issued, "outlook.issued");
    } catch (error) {
      throw fileProblem(error instanceof Error ? error.message : String(error));
    }
    if (fileDate > latestDate) {
      throw fileProblem(`outlook.issued ${file.issued} is more than a year after today (${todayText}); remove it or give --issued`);
    }
    if (seasonOfIssueDate(fileDate) >= todaySeason) {
      issuedDate = fileDate;
    } else {
      issuedDate = today;
      notes.push({
        code: "region-json-issued-ignored",
        message: `region.json's issue date ${file.issued} is for the ${seasonOfIssueDate(fileDate)} season, earlier than today's ${todaySeason} season: issued today (${todayText}) instead`,
      });
    }
  } else {
    issuedDate = today;
  }
  const issued = format(issuedDate, "yyyy-MM-dd");
  const issuedSeason = seasonOfIssueDate(issuedDate);
  if (issued > todayText) {
    // Allowed (up to a year ahead), but a planner must see it: the files are read as they are today.
    const days = differenceInCalendarDays(issuedDate, today);
    notes.push({
      code: "issued-ahead",
      message:
        `dated ahead: issued ${issued}, ${days} day${days === 1 ? "" : "s"} after it was made on ${todayText}; ` +
        `the index values are the files' as of ${todayText}, with every month that ends before the issue date counted as complete`,
    });
  }

  let season: number;
  if (options.season !== undefined) {
    const typed = options.season.trim();
    if (!/^\d{4}$/.test(typed)) throw new UsageError(`--season: expected a year such as 2027, found "${options.season}"`);
    season = Number(typed);
    if (season > todaySeason + 1) {
      throw new UsageError(`--season: ${season} is more than a year after today's ${todaySeason} season (today is ${todayText})`);
    }
    if (firstYear !== null && season < firstYear) {
      throw new UsageError(`--season: ${season} is before the index records begin (${firstYear})`);
    }
  } else if (file.season !== null && file.season >= issuedSeason) {
    season = file.season;
    if (season > todaySeason + 1) {
      throw fileProblem(`outlook.season ${season} is more than a year after today's ${todaySeason} season; remove it or give --season`);
    }
    if (season > issuedSeason) {
      notes.push({
        code: "season-from-region-json",
        message: `the season ${season} comes from region.json; an outlook issued ${issued} would otherwise be for ${issuedSeason} (give --season to choose)`,
      });
    }
  } else {
    season = issuedSeason;
    if (file.season !== null) {
      notes.push({
        code: "region-json-season-ignored",
        message: `region.json's season ${file.season} is earlier than the ${issuedSeason} season of the issue date ${issued}: the outlook is for ${issuedSeason}`,
      });
    }
  }

  const valuesSeason = file.season ?? (file.issued === null ? null : seasonOfIssueDate(parseISO(file.issued)));
  const fileValueNames = Object.keys(file.values);
  const useFileValues = valuesSeason === null || valuesSeason === season;
  if (fileValueNames.length > 0 && !useFileValues) {
    notes.push({
      code: "values-for-another-season",
      message: `region.json's values of ${fileValueNames.join(", ")} were written for the ${valuesSeason} season, not ${season}: not used (this season's values come from the index files or --values)`,
    });
  } else if (fileValueNames.length > 0 && valuesSeason === null) {
    notes.push({
      code: "values-without-season",
      message: `region.json gives values of ${fileValueNames.join(", ")} without saying which season they are for (add outlook.season): used for ${season}`,
    });
  }
  if (issuedDate.getFullYear() > season) {
    notes.push({ code: "issued-after-season", message: `issued ${issued}, after the ${season} season's year` });
  }
  return { issued, season, valuesSeason, useFileValues, notes };
}

/** Dashes read as a minus sign before a value: U+2212 minus, U+2012 figure dash, U+2013 en dash, U+2014 em dash, U+FE63 small hyphen-minus, U+FF0D fullwidth hyphen-minus. */
const MINUS_SIGNS = /[\u2212\u2012\u2013\u2014\uFE63\uFF0D]/g;

/**
 * Reads `--values NAME=V,…` (repeatable; every index named once). A value may be written with
 * the Unicode minus sign U+2212 (as the briefing prints it) or another dash (U+2012, U+2013,
 * U+2014, U+FE63, U+FF0D), each read as a minus. A decimal comma ("NAO=-0,8") is refused with
 * "use a decimal point: -0.8"; a name that differs from an index only in case is refused with a
 * did-you-mean.
 *
 * @param lists - the option's values as commander collected them
 * @param known - the region's index names
 * @returns a null-prototype record of the values given
 * @throws UsageError for a malformed entry, an unknown or repeated name, a value that is not a
 *   decimal number or whose magnitude is above {@link MAX_VALUE_MAGNITUDE}
 * @example
 * parseValuesOption(["ENSO=1.2,NAO=−0.4"], ["ENSO", "NAO"]); // => { ENSO: 1.2, NAO: -0.4 }
 */
export function parseValuesOption(lists: readonly string[], known: readonly string[]): Record<string, number> {
  const values: Record<string, number> = Object.create(null) as Record<string, number>;
  const given = new Set<string>();
  const knownSet = new Set(known);
  for (const list of lists) {
    const parts = list.split(",");
    for (const [position, part] of parts.entries()) {
      const trimmed = part.trim();
      if (trimmed === "") continue;
      const equals = trimmed.indexOf("=");
      if (equals <= 0) {
        const before = position > 0 ? (parts[position - 1] as string).trim() : "";
        if (/^\d+$/.test(trimmed) && /=\s*\S*\d$/.test(before)) {
          const whole = before.slice(before.indexOf("=") + 1).trim().replace(MINUS_SIGNS, "-");
          throw new UsageError(`--values: "${before},${trimmed}" has a decimal comma; use a decimal point: ${whole}.${trimmed}`);
        }
        throw new UsageError(`--values: expected NAME=VALUE, found "${trimmed}"`);
      }
      const name = trimmed.slice(0, equals).trim();
      const text = trimmed.slice(equals + 1).trim().replace(MINUS_SIGNS, "-");
      if (!knownSet.has(name)) {
        const close = known.find((candidate) => candidate.toLowerCase() === name.toLowerCase());
        throw new UsageError(
          `--values: unknown index "${name}"${close === undefined ? "" : ` (did you mean "${close}"? names are case-sensitive)`}; this region's indices are ${known.join(", ")}`,
        );
      }
      if (given.has(name)) throw new UsageError(`--values: ${name} is given more than once`);
      if (!DECIMAL.test(text) || !Number.isFinite(Number(text))) {
        throw new UsageError(`--values: ${name} must be a decimal number such as 1.2 or -0.5, found "${trimmed.slice(equals + 1).trim()}"`);
      }
      const value = Number(text);
      if (Math.abs(value) > MAX_VALUE_MAGNITUDE) {
        throw new UsageError(
          `--values: ${name} = ${text} is beyond ±${MAX_VALUE_MAGNITUDE.toLocaleString("en-US")}, which no climate index reaches: check the value and its scale`,
        );
      }
      given.add(name);
      values[name] = value === 0 ? 0 : value; // -0 prints as 0
    }
  }
  return values;
}

const MONTH_ABBREVIATIONS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"] as const;

/**
 * Months "YYYY-MM" in words, consecutive months joined as a range: ["2026-12", "2027-01",
 * "2027-02"] → "Dec 2026–Feb 2027"; a gap starts a new range ("Dec 2026, Feb 2027–Mar 2027").
 *
 * @param months - ascending months "YYYY-MM"
 * @returns the months in words; "" for none
 * @example
 * monthRangeText(["2026-12", "2027-01", "2027-02"]); // => "Dec 2026–Feb 2027"
 */
export function monthRangeText(months: readonly string[]): string {
  const parsed = months.map((text) => {
    const [year, month] = text.split("-").map(Number) as [number, number];
    return { year, month, serial: year * 12 + month - 1 };
  });
  const name = (m: { year: number; month: number }): string => `${MONTH_ABBREVIATIONS[m.month - 1] ?? "?"} ${m.year}`;
  const ranges: string[] = [];
  let start = 0;
  for (let i = 1; i <= parsed.length; i += 1) {
    const previous = parsed[i - 1];
    const current = parsed[i];
    if (current !== undefined && previous !== undefined && current.serial === previous.serial + 1) continue;
    const first = parsed[start];
    if (first !== undefined && previous !== undefined) ranges.push(first === previous ? name(first) : `${name(first)}–${name(previous)}`);
    start = i;
  }
  return ranges.join(", ");
}

/**
 * The outlook request from the command line, region.json and the index files. Dates by
 * {@link resolveOutlookDates}. Each index's current value comes from, in this order: `--values`;
 * region.json `outlook.values` when they were written for the season issued; this season's
 * window of the index file itself (`currentSeasonValue`: complete, or provisional from at least
 * half of the window's months — `details` says so and the outlook warns about it; an index whose
 * value cannot be computed is left out with a note giving the reason).
 *
 * `sources` says where each value came from in words ("nao-monthly.csv, Dec 2026–Feb 2027",
 * "region.json", "--values"); `details` adds the window, the months used and whether the value is
 * provisional.
 *
 * Every record in the request has a null prototype, so an index named after a built-in object
 * property (`constructor`, `toString`) is looked up like any other name.
 *
 * @param workspace - the loaded region
 * @param options - `--values`, `--issued`, `--season` as typed
 * @param today - today's date (local calendar date; tests pass a fixed date)
 * @returns values, sources, details, issue date, season and notes for `buildOutlook`
 * @throws UsageError for bad option values, InputError for implausible region.json dates
 * @example
 * resolveOutlookRequest(workspace, { values: "ENSO=1.2" }, new Date(2027, 2, 10));
 * // => { values: { ENSO: 1.2, NAO: 0.43 }, sources: { ENSO: "--values", NAO: "nao-monthly.csv, Dec 2026–Feb 2027 (provisional)" }, … }
 */
export function resolveOutlookRequest(workspace: Workspace, options: OutlookOptions, today: Date): OutlookRequest {
  const known = workspace.settings.indices.map((index) => index.name);
  const dates = resolveOutlookDates(workspace, options, today);
  const notes: { code: string; message: string }[] = [...dates.notes];
  const values: Record<string, number> = Object.create(null) as Record<string, number>;
  const sources: Record<string, string> = Object.create(null) as Record<string, string>;
  const details: Record<string, OutlookValueDetail> = Object.create(null) as Record<string, OutlookValueDetail>;
  const lists = options.values === undefined ? [] : typeof options.values === "string" ? [options.values] : options.values;
  const given = parseValuesOption(lists, known);
  const fileValues = workspace.settings.outlook.values;
  for (const [position, settings] of workspace.settings.indices.entries()) {
    const name = settings.name;
    if (Object.hasOwn(given, name)) {
      values[name] = given[name] as number;
      sources[name] = "--values";
      details[name] = { source: "--values", window: settings.months, months: [], provisional: false };
      continue;
    }
    if (dates.useFileValues && Object.hasOwn(fileValues, name) && typeof fileValues[name] === "number") {
      values[name] = fileValues[name];
      sources[name] = "region.json";
      details[name] = { source: "region.json", window: settings.months, months: [], provisional: false };
      continue;
    }
    const series = workspace.indices[position];
    if (series === undefined || series.name !== name) continue;
    const current = currentSeasonValue(series, settings, dates.season, dates.issued);
    if (current.value === null) {
      notes.push({
        code: "no-value-from-file",
        message: `${name}: no value for the ${dates.season} season from ${settings.file}: ${current.reason ?? "not available"}; give it with --values`,
      });
      continue;
    }
    const when = current.window === null ? String(dates.season) : monthRangeText(current.months);
    const source = `${settings.file}, ${when}${current.provisional ? " (provisional)" : ""}`;
    values[name] = current.value;
    sources[name] = source;
    details[name] = { source, window: current.window, months: current.months, provisional: current.provisional };
  }
  return { values, issued: dates.issued, season: dates.season, sources, details, notes };
}
