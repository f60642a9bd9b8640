import { MONTH_ABBREVIATIONS, parseMonthWindow, seasonalValues, type MonthlyValue } from "../climate/seasonalValues.js";
import { listColumns, readCsvTable, type CsvTable } from "./csvTable.js";
import { readInteger, readNumber } from "./fields.js";
import type { ProblemList } from "./InputError.js";
import { echoText } from "./limits.js";
import type { IndexSeries, IndexSettings, Warning } from "./types.js";

const YEAR_RANGE = { min: -9999, max: 9999 } as const;
const MONTH_RANGE = { min: 1, max: 12 } as const;

/**
 * Missing-value codes common in climate centres' index tables. They are common practice of such
 * tables, not a published standard. A value exactly equal to one of them is refused unless the
 * index declares it in `missing`.
 */
export const COMMON_MISSING_CODES: readonly number[] = Object.freeze([-99.9, -99.99, -999, -9999]);

/** A value of at least this size is suspect when it is also far outside the rest of its series. */
const SENTINEL_SIZE = 99;
/** …far outside = at least this many times the median size |x| of the series. */
const SENTINEL_RATIO = 20;
/** No value smaller in size than this can be a common code or an outlier. */
const SMALLEST_SUSPECT = Math.min(SENTINEL_SIZE, ...COMMON_MISSING_CODES.map(Math.abs));

/** How an index file lays out its values, detected from its header. */
export type IndexFileLayout =
  /** `year,<INDEX>,…`: one seasonal value per year. */
  | "yearly"
  /** `year,month,<INDEX>,…`: one row per month. */
  | "long"
  /** `year` + twelve month columns (`Jan`…`Dec` in any case, or `1`…`12`): one row per year, one index per file. */
  | "wide";

const monthName = (month: number): string => MONTH_ABBREVIATIONS[month - 1] as string;

/** The header's twelve month columns (index 0 = January), or the months it lacks. */
function monthColumns(columns: readonly string[]): { found: (string | undefined)[]; named: number } {
  const found: (string | undefined)[] = new Array<string | undefined>(12).fill(undefined);
  let named = 0;
  for (const column of columns) {
    const lower = column.toLowerCase();
    const byName = MONTH_ABBREVIATIONS.findIndex((abbreviation) => abbreviation.toLowerCase() === lower);
    const byNumber = /^(?:0?[1-9]|1[0-2])$/.test(column) ? Number(column) - 1 : -1;
    const month = byName >= 0 ? byName : byNumber;
    if (byName >= 0) named++;
    if (month >= 0 && found[month] === undefined) found[month] = column;
  }
  return { found, named };
}

const findColumn = (table: CsvTable, name: string): string | undefined => table.columns.find((column) => column.toLowerCase() === name);

/**
 * Climate-index file reader. Three layouts are recognised from the header:
 * - yearly `year,<INDEX>,…`: one seasonal value per year; several indices may share the file;
 * - long monthly `year,month,<INDEX>,…` (month 1–12): averaged over each index's month window;
 * - wide monthly `year` + twelve month columns named `Jan`…`Dec` (any letter case) or `1`…`12`:
 *   one row per year holding one index; the index (or indices, e.g. two windows of the same
 *   table) is the one whose `file` names this file, `column` is not used, and `months` gives the
 *   window. Other columns (an annual mean, say) are ignored.
 * `year` and `month` match in any letter case. The file may be comma-separated CSV or a
 * whitespace-separated text table (see `readCsvTable`).
 *
 * An empty cell, or a cell holding exactly one of the index's declared `missing` codes, is a
 * missing value. An undeclared value that looks like a missing code is an error naming the file,
 * line and the `missing` key: a value equal to -99.9, -99.99, -999 or -9999, or a value of 99 or
 * more in size that is also at least 20 times the median size of the index's values (which a
 * real measurement of a small-range index is not). Such codes are common practice of climate
 * centres' tables, not a standard, so the rule is a guard, not a proof.
 *
 * @param bytes - the file's content
 * @param indices - the indices of region.json that read this file (at least one)
 * @param problems - collects problems: a named column missing from the header, a non-integer or
 *   repeated year (or year and month, naming both lines), a month outside 1–12, a value that is
 *   not a number, an undeclared missing code, a layout/`months` mismatch with region.json
 * @param file - the file as shown to the user, for warnings
 * @returns one series per index (ascending unique years; a monthly file also keeps its raw
 *   months in `monthly`), the layout found, and warnings for seasons left missing because a month
 *   is missing; no series when the file has problems
 * @example
 * readIndexCsv(Buffer.from("Year Jan Feb Mar Apr May Jun Jul Aug Sep Oct Nov Dec\n1950 …"), [nao], problems, "nao.txt");
 */
export function readIndexCsv(
  bytes: Uint8Array,
  indices: readonly IndexSettings[],
  problems: ProblemList,
  file: string,
): { series: IndexSeries[]; warnings: Warning[]; layout?: IndexFileLayout } {
  const table = readCsvTable(bytes, [], problems, { whitespace: true });
  if (table === null) return { series: [], warnings: [] };
  const yearColumn = findColumn(table, "year");
  const monthColumn = findColumn(table, "month");
  const months = monthColumns(table.columns);
  const wide = monthColumn === undefined && months.found.every((column) => column !== undefined);
  const layout: IndexFileLayout = wide ? "wide" : monthColumn !== undefined ? "long" : "yearly";
  let usable = true;
  if (yearColumn === undefined) {
    problems.add(table.headerLine, `missing column "year" (found columns: ${listColumns(table.columns)})`);
    usable = false;
  }
  if (!wide && monthColumn === undefined && months.named >= 3) {
    const lacking = months.found.flatMap((column, month) => (column === undefined ? [monthName(month + 1)] : []));
    problems.add(table.headerLine, `the header has month columns but not all twelve (missing: ${lacking.join(", ")}); a wide table needs year and Jan…Dec`);
    usable = false;
  }
  for (const index of indices) {
    if (wide) {
      if (index.months === null) {
        problems.add(table.headerLine, `this is a wide monthly table (year and twelve month columns): give "months" for index ${index.name} in region.json, e.g. "Dec-Mar"`);
        usable = false;
      }
      if (index.column !== index.name) {
        problems.add(
          table.headerLine,
          `index ${index.name}: "column" is not used with a wide monthly table (year and twelve month columns, one index per file): leave "column" out of region.json`,
        );
        usable = false;
      }
      continue;
    }
    if (!table.columns.includes(index.column)) {
      const named = index.column === index.name ? "" : ` (column of index ${index.name})`;
      problems.add(
        table.headerLine,
        `missing column "${echoText(index.column)}"${named} named in region.json (found columns: ${listColumns(table.columns)})`,
      );
      usable = false;
    }
    if (layout === "long" && index.months === null) {
      problems.add(table.headerLine, `this is a monthly file (it has a "month" column): give "months" for index ${index.name} in region.json, e.g. "Dec-Mar"`);
      usable = false;
    }
    if (layout === "yearly" && index.months !== null) {
      problems.add(
        table.headerLine,
        `region.json gives "months" for index ${index.name}, but this file has neither a "month" column nor twelve month columns`,
      );
      usable = false;
    }
  }
  if (!usable || yearColumn === undefined) return { series: [], warnings: [] };

  // Read every value cell once: the twelve month columns of a wide file, or each index's column.
  const valueColumns: string[] = [];
  if (wide) valueColumns.push(...(months.found as string[]));
  else for (const index of indices) if (!valueColumns.includes(index.column)) valueColumns.push(index.column);
  const columnCount = valueColumns.length;
  const long = layout === "long";
  const firstValue = long ? 2 : 1;
  const read = table.columnReader(long ? [yearColumn, monthColumn as string, ...valueColumns] : [yearColumn, ...valueColumns]);
  // The rows kept, as columns: line, year, month (0 in a yearly file, 1–12 in a long one; a wide
  // file's month is its value column), data row, and the values row by row (NaN = empty cell).
  const rowCount = table.rowCount;
  const cells: Cells = {
    count: 0,
    lines: new Int32Array(rowCount),
    years: new Float64Array(rowCount),
    months: new Int32Array(rowCount),
    rows: new Int32Array(rowCount),
    stride: rowCount,
    values: new Float64Array(rowCount * columnCount),
  };
  const texts: string[] = [];
  const plain = table.plainNumbers([
    { name: yearColumn, integer: true },
    ...(long ? [{ name: monthColumn as string, integer: true }] : []),
    ...valueColumns.map((name) => ({ name, integer: false })),
  ]);
  if (plain === null || !keepPlainRows(plain, table, cells, long, columnCount)) readRows(table, read, texts, cells, { yearColumn, monthColumn, valueColumns, long }, problems);
  if (problems.size > 0) return { series: [], warnings: [] };

  /** The text of a kept cell, read again from its row (only for a message). */
  const textOf = (at: number, column: number): string => {
    read(cells.rows[at] as number, texts);
    return texts[firstValue + column] as string;
  };
  const reported = new Set<string>();
  const perIndex = indices.map((index) => {
    const own = ownCells(cells, wide ? null : valueColumns.indexOf(index.column), columnCount, index.missing ?? []);
    if (own.suspect) checkMissingCodes(index, own, cells, layout, problems, reported, textOf);
    return own;
  });
  if (problems.size > 0) return { series: [], warnings: [] };

  const series: IndexSeries[] = [];
  const warnings: Warning[] = [];
  indices.forEach((index, position) => {
    const own = perIndex[position] as OwnCells;
    if (layout === "yearly") {
      const order = ascendingYears(cells);
      series.push({ name: index.name, years: order.map((at) => cells.years[at] as number), values: order.map((at) => valueOrNull(own.values[at] as number)) });
      return;
    }
    const window = parseMonthWindow(index.months ?? "");
    if (window === null) throw new RangeError(`index ${index.name}: invalid month window ${String(index.months)}`);
    const monthlyValues = monthlyInOrder(own, cells, wide);
    const seasonal = seasonalValues(monthlyValues, window);
    series.push({ name: index.name, years: seasonal.years, values: seasonal.values, monthly: monthlyValues });
    if (seasonal.incomplete.length > 0) {
      const count = seasonal.incomplete.length;
      const shown = seasonal.incomplete
        .slice(0, 5)
        .map((season) => `${season.year} (${season.missing.map((m) => `${monthName(m.month)} ${m.year}`).join(", ")})`)
        .join("; ");
      warnings.push({
        code: "season-missing-month",
        message: `${file}: ${index.name} ${window.text}: ${count} season${count === 1 ? "" : "s"} left missing because a month is missing: ${shown}${count > 5 ? `; and ${count - 5} more` : ""}`,
      });
    }
  });
  return { series, warnings, layout };
}

/** The columns an index file is read by. */
interface ReadColumns {
  readonly yearColumn: string;
  readonly monthColumn: string | undefined;
  readonly valueColumns: readonly string[];
  readonly long: boolean;
}

/**
 * The general path: reads every row's year (and month) and values as text, adding a problem for
 * each that is not a number, out of range, or a repeated year (and month), and keeps the rows
 * without problems in `cells`.
 */
function readRows(
  table: CsvTable,
  read: (row: number, into: string[]) => void,
  texts: string[],
  cells: Cells,
  { yearColumn, monthColumn, valueColumns, long }: ReadColumns,
  problems: ProblemList,
): void {
  const columnCount = valueColumns.length;
  const firstValue = long ? 2 : 1;
  const rowValues = new Float64Array(columnCount);
  const firstLine = new Map<number, number>();
  cells.count = 0;
  for (let row = 0; row < table.rowCount; row++) {
    read(row, texts);
    const line = table.lineOf(row);
    const year = readInteger(texts[0] as string, yearColumn, line, problems, YEAR_RANGE);
    const month = long ? readInteger(texts[1] as string, monthColumn as string, line, problems, MONTH_RANGE) : 0;
    let unreadable = false;
    for (let column = 0; column < columnCount; column++) {
      const text = texts[firstValue + column] as string;
      if (text === "") {
        rowValues[column] = NaN;
        continue;
      }
      const value = readNumber(text, valueColumns[column] as string, line, problems);
      if (value === null) unreadable = true;
      else rowValues[column] = value;
    }
    if (year === null || month === null || unreadable) continue;
    // Unique for a year of at most 4 digits and a month 0–12 (−0 and 0 are one key, as in text).
    const key = year * 16 + month;
    const earlier = firstLine.get(key);
    if (earlier !== undefined) {
      const what = long ? `year ${year} month ${month}` : `year ${year}`;
      problems.add(line, `${what} appears twice (lines ${earlier} and ${line})`);
      continue;
    }
    firstLine.set(key, line);
    const at = cells.count++;
    cells.lines[at] = line;
    cells.years[at] = year;
    cells.months[at] = month;
    cells.rows[at] = row;
    for (let column = 0; column < columnCount; column++) cells.values[column * cells.stride + at] = rowValues[column] as number;
  }
}

/**
 * The fast path, for the values from {@link CsvTable.plainNumbers} (Infinity = empty cell): keeps every row in `cells`
 * when no year (or month) is out of range and none repeats, and returns true; returns false at
 * the first row that would be a problem (the caller then takes the general path, which reports it).
 */
function keepPlainRows(values: Float64Array, table: CsvTable, cells: Cells, long: boolean, columnCount: number): boolean {
  const width = columnCount + (long ? 2 : 1);
  // Keys that only grow cannot repeat: the set of keys is built only once a key does not grow.
  let seen: Set<number> | null = null;
  let last = -Infinity;
  for (let row = 0; row < table.rowCount; row++) {
    const year = values[row * width] as number;
    const month = long ? (values[row * width + 1] as number) : 0;
    if (year < YEAR_RANGE.min || year > YEAR_RANGE.max || (long && (month < MONTH_RANGE.min || month > MONTH_RANGE.max))) return false;
    const key = year * 16 + month;
    if (seen === null && key <= last) {
      seen = new Set<number>();
      for (let before = 0; before < row; before++) seen.add((cells.years[before] as number) * 16 + (cells.months[before] as number));
    }
    if (seen !== null) {
      if (seen.has(key)) return false;
      seen.add(key);
    }
    last = key;
    cells.lines[row] = table.lineOf(row);
    cells.years[row] = year;
    cells.months[row] = month;
    cells.rows[row] = row;
    for (let column = 0; column < columnCount; column++) {
      const value = values[row * width + width - columnCount + column] as number;
      cells.values[column * cells.stride + row] = value === Infinity ? NaN : value;
    }
  }
  cells.count = table.rowCount;
  return true;
}

/** The rows kept from an index file, as columns (see readIndexCsv). */
interface Cells {
  count: number;
  readonly lines: Int32Array;
  readonly years: Float64Array;
  readonly months: Int32Array;
  /** The data row of the table each kept row came from. */
  readonly rows: Int32Array;
  /** Room for this many rows per column. */
  readonly stride: number;
  /** Column by column (column c, kept row at: `values[c × stride + at]`); NaN = empty cell. */
  readonly values: Float64Array;
}

/**
 * The cells one index reads: one value column of every kept row, or for a wide file all twelve
 * month columns, January's cells first (then February's, …). Cell i is kept row `rowOf(i)`.
 */
interface OwnCells {
  /** NaN = missing (an empty cell, or a declared missing code). */
  readonly values: Float64Array;
  /** Whether a value is large enough to be a missing-value code or an outlier (see checkMissingCodes). */
  readonly suspect: boolean;
  /** The value column of cell i (a wide file's month is this + 1). */
  readonly columnOf: (i: number) => number;
  readonly rowOf: (i: number) => number;
}

/** The cells of value column `column` (or of every column for a wide file), with the declared missing codes made missing. */
function ownCells(cells: Cells, column: number | null, columnCount: number, declared: readonly number[]): OwnCells {
  const count = cells.count;
  const first = column ?? 0;
  const columns = column === null ? columnCount : 1;
  const values = new Float64Array(count * columns);
  let suspect = false;
  for (let c = 0; c < columns; c++) {
    const from = (first + c) * cells.stride;
    for (let at = 0; at < count; at++) {
      let value = cells.values[from + at] as number;
      if (declared.length > 0 && declared.includes(value)) value = NaN;
      values[c * count + at] = value;
      if (Math.abs(value) >= SMALLEST_SUSPECT) suspect = true;
    }
  }
  if (column !== null) return { values, suspect, columnOf: () => column, rowOf: (i) => i };
  return { values, suspect, columnOf: (i) => Math.floor(i / count), rowOf: (i) => i % count };
}

const valueOrNull = (value: number): number | null => (Number.isNaN(value) ? null : value);

/** The kept rows in ascending year (years are unique in a yearly file): file order when it already is. */
function ascendingYears(cells: Cells): number[] {
  const order = Array.from({ length: cells.count }, (_, at) => at);
  for (let at = 1; at < cells.count; at++) {
    if ((cells.years[at] as number) < (cells.years[at - 1] as number)) return order.sort((a, b) => (cells.years[a] as number) - (cells.years[b] as number));
  }
  return order;
}

/** An index's months in ascending year then month, each (year, month) once. */
function monthlyInOrder(own: OwnCells, cells: Cells, wide: boolean): MonthlyValue[] {
  const count = cells.count;
  const monthly: MonthlyValue[] = new Array<MonthlyValue>(wide ? count * 12 : count);
  let sorted = true;
  for (let at = 0; at < count; at++) {
    const year = cells.years[at] as number;
    if (at > 0) {
      const previous = cells.years[at - 1] as number;
      if (year < previous || (year === previous && (wide || (cells.months[at] as number) <= (cells.months[at - 1] as number)))) sorted = false;
    }
    if (wide) {
      for (let month = 0; month < 12; month++) {
        const value = own.values[month * count + at] as number;
        monthly[at * 12 + month] = { year, month: month + 1, value: Number.isNaN(value) ? null : value };
      }
    } else {
      const value = own.values[at] as number;
      monthly[at] = { year, month: cells.months[at] as number, value: Number.isNaN(value) ? null : value };
    }
  }
  return sorted ? monthly : monthly.sort((a, b) => a.year - b.year || a.month - b.month);
}

/** Median of |x| over the non-missing values (0 for none). */
function medianSize(values: Float64Array): number {
  const sizes = new Float64Array(values.length);
  let count = 0;
  for (let i = 0; i < values.length; i++) {
    const value = values[i] as number;
    if (!Number.isNaN(value)) sizes[count++] = Math.abs(value);
  }
  if (count === 0) return 0;
  const sorted = sizes.subarray(0, count).sort();
  return count % 2 === 1 ? (sorted[(count - 1) / 2] as number) : ((sorted[count / 2 - 1] as number) + (sorted[count / 2] as number)) / 2;
}

/** Adds a problem for every undeclared value that looks like a missing-value code (see readIndexCsv). */
function checkMissingCodes(
  index: IndexSettings,
  own: OwnCells,
  cells: Cells,
  layout: IndexFileLayout,
  problems: ProblemList,
  reported: Set<string>,
  textOf: (at: number, column: number) => string,
): void {
  const median = medianSize(own.values);
  for (let i = 0; i < own.values.length; i++) {
    const value = own.values[i] as number;
    const size = Math.abs(value);
    if (!(size >= SMALLEST_SUSPECT)) continue; // also skips NaN, a missing value
    const common = COMMON_MISSING_CODES.includes(value);
    const outlier = size >= SENTINEL_SIZE && size >= SENTINEL_RATIO * median;
    if (!common && !outlier) continue;
    const at = own.rowOf(i);
    const column = own.columnOf(i);
    const line = cells.lines[at] as number;
    const year = cells.years[at] as number;
    const month = layout === "wide" ? column + 1 : (cells.months[at] as number);
    // The cells of a wide file are shared by the indices that read it: report each cell once.
    const key = `${layout === "wide" ? "" : index.column}\u0000${line}-${month}`;
    if (reported.has(key)) continue;
    reported.add(key);
    const when = layout === "yearly" ? `${year}` : `${monthName(month)} ${year}`;
    const why = common ? "a common missing-value code" : `far outside the rest of the series, whose median size is ${formatSize(median)}`;
    problems.add(
      line,
      `${index.name} ${when}: the value ${echoText(textOf(at, column))} looks like a missing-value code (${why}); if it marks a missing value, declare it in region.json as "indices": { "${index.name}": { "missing": [${formatCode(value)}] } }, or leave the cell empty`,
    );
  }
}

const formatSize = (value: number): string => String(Number(value.toPrecision(3)));
const formatCode = (value: number): string => String(value);
