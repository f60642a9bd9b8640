
/** English three-letter month abbreviations, January first, as accepted in `"months"`. */
export const MONTH_ABBREVIATIONS = [
  "Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec",
] as const;

/** A run of consecutive calendar months, possibly crossing the new year (e.g. Dec–Mar). */
export interface MonthWindow {
  /** The window as written, normalised (e.g. "Dec-Mar"). */
  readonly text: string;
  /** First and last month of the window, 1 = January … 12 = December. */
  readonly firstMonth: number;
  readonly lastMonth: number;
  /** Number of months in the window, 1–12. */
  readonly length: number;
}

/** One value of a monthly index series; `value` null = missing. */
export interface MonthlyValue {
  readonly year: number;
  /** 1 = January … 12 = December. */
  readonly month: number;
  readonly value: number | null;
}

/** A season whose value is missing because one or more of its months is missing. */
export interface IncompleteSeason {
  readonly year: number;
  readonly missing: readonly { readonly year: number; readonly month: number }[];
}

/** Seasonal values of one index: ascending unique years, with `null` for an incomplete season. */
export interface SeasonalSeries {
  readonly years: readonly number[];
  readonly values: readonly (number | null)[];
  readonly incomplete: readonly IncompleteSeason[];
}

/**
 * Month window parser: reads a window such as `"Dec-Mar"` (December to March, crossing the new
 * year) or a single month such as `"Jul"`. Month names are English three-letter abbreviations,
 * in any letter case.
 *
 * @param text - `"Mon-Mon"` or `"Mon"`
 * @returns the window, or null when the text is not a month window
 * @example
 * parseMonthWindow("Dec-Mar"); // => { text: "Dec-Mar", firstMonth: 12, lastMonth: 3, length: 4 }
 */
export function parseMonthWindow(text: string): MonthWindow | null {
  const match = /^\s*([A-Za-z]{3})\s*(?:-\s*([A-Za-z]{3})\s*)?$/.exec(text);
  if (match === null) return null;
  const monthNumber = (name: string): number =>
    MONTH_ABBREVIATIONS.findIndex((abbreviation) => abbreviation.toLowerCase() === name.toLowerCase()) + 1;
  const firstMonth = monthNumber(match[1] as string);
  const lastMonth = match[2] === undefined ? firstMonth : monthNumber(match[2]);
  if (firstMonth === 0 || lastMonth === 0) return null;
  const length = ((lastMonth - firstMonth + 12) % 12) + 1;
  const name = (month: number): string => MONTH_ABBREVIATIONS[month - 1] as string;
  const normalised = firstMonth === lastMonth ? name(firstMonth) : `${name(firstMonth)}-${name(lastMonth)}`;
  return { text: normalised, firstMonth, lastMonth, length };
}

/**
 * Months counted on one line: month number `year × 12 + (month − 1)`, so that month arithmetic
 * across the new year is integer addition (no Date objects: the readers call this for every month
 * of a multi-century record, and it must be exact for any integer year, 0–99 included).
 */
function monthNumber(year: number, month: number): number {
  return year * 12 + (month - 1);
}

/** The calendar year and month (1–12) of a month number from {@link monthNumber}. */
function fromMonthNumber(number: number): { year: number; month: number } {
  const year = Math.floor(number / 12);
  return { year, month: number - year * 12 + 1 };
}

/**
 * The calendar months of the season that ends in `seasonYear`, first to last (integer month
 * arithmetic: the last month is in `seasonYear`, earlier months are counted back from it).
 *
 * @param window - a month window from {@link parseMonthWindow}
 * @param seasonYear - any integer year
 * @returns `window.length` months
 * @example
 * seasonMonths(parseMonthWindow("Dec-Mar")!, 1998);
 * // => [{ year: 1997, month: 12 }, { year: 1998, month: 1 }, { year: 1998, month: 2 }, { year: 1998, month: 3 }]
 */
export function seasonMonths(window: MonthWindow, seasonYear: number): { year: number; month: number }[] {
  const end = monthNumber(seasonYear, window.lastMonth);
  const months: { year: number; month: number }[] = [];
  for (let back = window.length - 1; back >= 0; back--) months.push(fromMonthNumber(end - back));
  return months;
}

/**
 * The season year a calendar month belongs to, or null when the month is outside the window. A
 * window that crosses the new year belongs to the year of its last month (Dec 1997 in a Dec–Mar
 * window → 1998).
 *
 * @example
 * seasonYearOf(parseMonthWindow("Dec-Mar")!, 1997, 12); // => 1998
 */
export function seasonYearOf(window: MonthWindow, year: number, month: number): number | null {
  const offset = (month - window.firstMonth + 12) % 12;
  if (offset >= window.length) return null;
  const monthsToEnd = window.length - 1 - offset;
  return Math.floor((monthNumber(year, month) + monthsToEnd) / 12);
}

/**
 * Seasonal mean of a monthly index: for each season year, the arithmetic mean of the index over
 * the window's months, mean = (x₁ + … + x_L) / L. A season with any month missing (an empty cell
 * or an absent row) is `null` and listed in `incomplete`. Seasons run from the first to the last
 * season that has at least one month with a value in the input (so the empty months at the end of
 * a table's last row, not yet observed, add no season).
 *
 * @param monthly - monthly values, any order; (year, month) pairs must be unique
 * @param window - the season window
 * @returns the seasonal series; empty when `monthly` has no month inside the window
 * @throws RangeError when a month is outside 1–12, a year is not an integer, or a (year, month)
 *   pair repeats (the reader reports those as input problems before calling this)
 * @example
 * seasonalValues([{ year: 1997, month: 12, value: 1 }, { year: 1998, month: 1, value: 2 },
 *   { year: 1998, month: 2, value: 3 }, { year: 1998, month: 3, value: 4 }], parseMonthWindow("Dec-Mar")!);
 * // => { years: [1998], values: [2.5], incomplete: [] }
 */
export function seasonalValues(monthly: readonly MonthlyValue[], window: MonthWindow): SeasonalSeries {
  // Keyed by month number (an integer key: no text built per month).
  const byMonth = new Map<number, number | null>();
  let firstSeason = Infinity;
  let lastSeason = -Infinity;
  for (const row of monthly) {
    if (!Number.isInteger(row.month) || row.month < 1 || row.month > 12) {
      throw new RangeError(`month must be 1-12 (found ${row.month})`);
    }
    if (!Number.isInteger(row.year)) throw new RangeError(`year must be an integer (found ${row.year})`);
    const key = monthNumber(row.year, row.month);
    if (byMonth.has(key)) throw new RangeError(`month ${row.year}-${row.month} appears twice`);
    byMonth.set(key, row.value);
    const season = seasonYearOf(window, row.year, row.month);
    // Seasons are bounded by months that hold a value: the trailing missing-value codes of a wide
    // table's last row (months not yet observed) do not make a season of their own.
    if (season !== null && row.value !== null) {
      firstSeason = Math.min(firstSeason, season);
      lastSeason = Math.max(lastSeason, season);
    }
  }
  const years: number[] = [];
  const values: (number | null)[] = [];
  const incomplete: IncompleteSeason[] = [];
  for (let season = firstSeason; season <= lastSeason; season++) {
    // The season's months as month numbers, first to last (as seasonMonths gives them); the
    // {year, month} objects are made only for a season with a month missing.
    const end = monthNumber(season, window.lastMonth);
    let sum = 0;
    let complete = true;
    for (let number = end - window.length + 1; number <= end; number++) {
      const value = byMonth.get(number);
      if (value === undefined || value === null) complete = false;
      else sum += value;
    }
    years.push(season);
    if (complete) {
      values.push(sum / window.length);
    } else {
      const missing = seasonMonths(window, season).filter((m) => {
        const value = byMonth.get(monthNumber(m.year, m.month));
        return value === undefined || value === null;
      });
      values.push(null);
      incomplete.push({ year: season, missing });
    }
  }
  return { years, values, incomplete };
}
