import type { IndexSeries, IndexSettings } from "../workspace/types.js";
import { MONTH_ABBREVIATIONS, parseMonthWindow, seasonMonths } from "./seasonalValues.js";

/** This season's value of one index, computed from its file, with what it is made of. */
export interface CurrentSeasonValue {
  /** The value on the index's own scale; null when it cannot be computed (`reason` says why). */
  readonly value: number | null;
  /** The month window, e.g. "Dec-Mar"; null for a yearly file. */
  readonly window: string | null;
  /** Months whose values were used, "YYYY-MM", first to last; empty for a yearly file. */
  readonly months: readonly string[];
  /** Months of the window not (yet) available on the issue date, "YYYY-MM". */
  readonly missingMonths: readonly string[];
  /** True when the value is the mean of only part of the window. */
  readonly provisional: boolean;
  /** Why the value is null or provisional; absent for a complete value. */
  readonly reason?: string;
}

const ISSUE_DATE = /^(-?\d{4})-(\d{2})-(\d{2})$/;

const monthText = (year: number, month: number): string => `${year < 0 ? "-" : ""}${String(Math.abs(year)).padStart(4, "0")}-${String(month).padStart(2, "0")}`;
const monthName = (year: number, month: number): string => `${MONTH_ABBREVIATIONS[month - 1] as string} ${year}`;

/**
 * Current-season index value: the value of one index for the outlook season, computed from the
 * index file as it stands on the issue date.
 *
 * For a monthly file it is the seasonal mean over the index's month window ending in `season`,
 * mean = (x₁ + … + x_L) / L, the same arithmetic as the calibration's seasonal values. A month
 * counts only when it is complete before the issue date: month M of year Y is available from the
 * first day of the following month (Mar 2027 from 2027-04-01), and only when the file has a value
 * for it (an empty cell or a declared missing code is not a value). A window with every month
 * available gives a complete value. A window with at least half of its months available,
 * ceil(L / 2) of L, gives a provisional value: the mean of the months available, with
 * `provisional: true` and the others in `missingMonths`. With fewer months the value is null with
 * a reason. For a yearly file it is the file's value for `season` (never provisional), or null.
 *
 * The half-window rule is this tool's own choice, not a published standard: a mean of half a
 * season or more is usually close to the full season's mean for slowly varying indices, while a
 * single month of a four-month window is not. It is said plainly beside the value.
 *
 * @param series - the index as read (`monthly` holds the raw months of a monthly file)
 * @param settings - the index's settings (its `months` window; null for a yearly file)
 * @param season - the outlook season year, any integer from -9999 to 9999
 * @param issued - the issue date, "YYYY-MM-DD" (a real calendar date)
 * @returns the value with its months; value null with a reason when it cannot be computed
 *   (no month available, fewer than half of the window's months, no value for a yearly file, or a
 *   monthly index read without its months)
 * @throws RangeError when `issued` is not a date "YYYY-MM-DD", `season` is not an integer, or the
 *   window in `settings.months` cannot be read
 * @example
 * currentSeasonValue(nao, naoSettings, 2027, "2027-03-10");
 * // Dec-Mar, Dec 2026 to Feb 2027 present, Mar 2027 not complete:
 * // => { value: 0.43, window: "Dec-Mar", months: ["2026-12", "2027-01", "2027-02"],
 * //      missingMonths: ["2027-03"], provisional: true, reason: "…" }
 * @see seasonalValues (the calibration's seasonal means, same arithmetic). The availability and
 *   half-window rules are this tool's own; no published method is claimed for them.
 */
export function currentSeasonValue(
  series: IndexSeries,
  settings: IndexSettings,
  season: number,
  issued: string,
): CurrentSeasonValue {
  const date = ISSUE_DATE.exec(issued);
  if (date === null) throw new RangeError(`issue date must be YYYY-MM-DD (found ${JSON.stringify(issued)})`);
  const issueYear = Number(date[1]);
  const issueMonth = Number(date[2]);
  const issueDay = Number(date[3]);
  const check = new Date(2000, 0, 1, 12);
  check.setFullYear(issueYear, issueMonth - 1, issueDay);
  if (check.getFullYear() !== issueYear || check.getMonth() !== issueMonth - 1 || check.getDate() !== issueDay) {
    throw new RangeError(`issue date ${issued} does not exist`);
  }
  if (!Number.isInteger(season)) throw new RangeError(`season must be an integer year (found ${season})`);

  if (settings.months === null) {
    let value: number | null = null;
    for (let i = 0; i < series.years.length; i++) {
      if (series.years[i] === season) value = series.values[i] ?? null;
    }
    if (value === null) {
      return {
        value: null,
        window: null,
        months: [],
        missingMonths: [],
        provisional: false,
        reason: `the index file has no value for ${season}`,
      };
    }
    return { value, window: null, months: [], missingMonths: [], provisional: false };
  }

  const window = parseMonthWindow(settings.months);
  if (window === null) throw new RangeError(`index ${settings.name}: invalid month window ${JSON.stringify(settings.months)}`);
  const wanted = seasonMonths(window, season);
  const windowName = `${window.text} ${season}`;
  if (series.monthly === undefined) {
    return {
      value: null,
      window: window.text,
      months: [],
      missingMonths: wanted.map((m) => monthText(m.year, m.month)),
      provisional: false,
      reason: `the months of index ${settings.name} were not kept when its file was read`,
    };
  }
  const byMonth = new Map<string, number | null>();
  for (const row of series.monthly) byMonth.set(monthText(row.year, row.month), row.value);

  const used: string[] = [];
  const usedNames: string[] = [];
  const missing: string[] = [];
  const notYet: string[] = [];
  const notInFile: string[] = [];
  let sum = 0;
  for (const month of wanted) {
    const key = monthText(month.year, month.month);
    // Month (Y, M) is complete from the first day of the next month: available when (Y, M) is before the issue month.
    const complete = month.year < issueYear || (month.year === issueYear && month.month < issueMonth);
    const value = byMonth.get(key);
    if (complete && value !== undefined && value !== null) {
      used.push(key);
      usedNames.push(monthName(month.year, month.month));
      sum += value;
    } else {
      missing.push(key);
      (complete ? notInFile : notYet).push(monthName(month.year, month.month));
    }
  }
  const needed = Math.ceil(window.length / 2);
  const why = [
    notYet.length > 0 ? `${notYet.join(", ")} ${notYet.length === 1 ? "is" : "are"} not complete on ${issued}` : null,
    notInFile.length > 0 ? `${notInFile.join(", ")} ${notInFile.length === 1 ? "has" : "have"} no value in the index file` : null,
  ]
    .filter((part): part is string => part !== null)
    .join("; ");
  if (missing.length === 0) {
    return { value: sum / used.length, window: window.text, months: used, missingMonths: [], provisional: false };
  }
  if (used.length >= needed) {
    return {
      value: sum / used.length,
      window: window.text,
      months: used,
      missingMonths: missing,
      provisional: true,
      reason: `provisional: mean of ${usedNames.join(", ")} only (${used.length} of the ${window.length} months of ${windowName}); ${why}`,
    };
  }
  const have =
    used.length === 0
      ? `no month of ${windowName} is available on ${issued}`
      : `only ${usedNames.join(", ")} of ${windowName} ${used.length === 1 ? "is" : "are"} available on ${issued}`;
  return {
    value: null,
    window: window.text,
    months: used,
    missingMonths: missing,
    provisional: false,
    reason: `${have} (at least ${needed} of its ${window.length} months are needed; a month counts from the first day of the next month); ${why}`,
  };
}
