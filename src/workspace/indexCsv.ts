import { MONTH_ABBREVIATIONS, parseMonthWindow, seasonalValues, type MonthlyValue } from "../climate/seasonalValues.js";
import { listColumns, readCsvTable, type CsvTable } from "./csvTable.js";
import { readInteger, readNumber } from "./fields.js";
import type { ProblemList } from "./InputError.js";
import { echoText } from "./limits.js";
import type { IndexSeries, IndexSettings, Warning } from "./types.js";

const YEAR_RANGE = { min: -9999, max: 9999 } as const;

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

/** How an index file lays out its values, detected from its header. */
export type IndexFileLayout =
  /** `year,<INDEX>,…`: one seasonal value per year. */
  | "yearly"
  /** `year,month,<INDEX>,…`: one row per month. */
  | "long"
  /** `year` + twelve month columns (`Jan`…`Dec` in any case, or `1`…`12`): one row per year, one index per file. */
  | "wide";

interface Cell {
  readonly line: number;
  readonly year: number;
  /** 1–12, or 0 in a yearly file. */
  readonly month: number;
  readonly text: string;
  /** The number written, or null for an empty cell. */
  readonly value: number | null;
}

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
  const valueColumns = wide ? (months.found as string[]) : [...new Set(indices.map((index) => index.column))];
  const cells = new Map<string, Cell[]>(valueColumns.map((column) => [column, []]));
  const firstLine = new Map<string, number>();
  for (const row of table.rows) {
    const year = readInteger(row.field(yearColumn), yearColumn, row.line, problems, YEAR_RANGE);
    const month = layout === "long" ? readInteger(row.field(monthColumn as string), monthColumn as string, row.line, problems, { min: 1, max: 12 }) : 0;
    const parsed = valueColumns.map((column) => {
      const text = row.field(column);
      if (text === "") return { text, value: null };
      const value = readNumber(text, column, row.line, problems);
      return value === null ? undefined : { text, value };
    });
    if (year === null || month === null || parsed.some((cell) => cell === undefined)) continue;
    const key = `${year}-${month}`;
    const earlier = firstLine.get(key);
    if (earlier !== undefined) {
      const what = layout === "long" ? `year ${year} month ${month}` : `year ${year}`;
      problems.add(row.line, `${what} appears twice (lines ${earlier} and ${row.line})`);
      continue;
    }
    firstLine.set(key, row.line);
    valueColumns.forEach((column, position) => {
      const cell = parsed[position] as { text: string; value: number | null };
      (cells.get(column) as Cell[]).push({ line: row.line, year, month: wide ? position + 1 : month, text: cell.text, value: cell.value });
    });
  }
  if (problems.size > 0) return { series: [], warnings: [] };

  const reported = new Set<string>();
  const perIndex = indices.map((index) => {
    const own = wide ? valueColumns.flatMap((column) => cells.get(column) as Cell[]) : (cells.get(index.column) as Cell[]);
    const declared = index.missing ?? [];
    const values = own.map((cell) => (cell.value !== null && declared.includes(cell.value) ? { ...cell, value: null } : cell));
    checkMissingCodes(index, values, layout, problems, reported);
    return values;
  });
  if (problems.size > 0) return { series: [], warnings: [] };

  const series: IndexSeries[] = [];
  const warnings: Warning[] = [];
  indices.forEach((index, position) => {
    const values = perIndex[position] as Cell[];
    if (layout === "yearly") {
      const sorted = [...values].sort((a, b) => a.year - b.year);
      series.push({ name: index.name, years: sorted.map((cell) => cell.year), values: sorted.map((cell) => cell.value) });
      return;
    }
    const window = parseMonthWindow(index.months ?? "");
    if (window === null) throw new RangeError(`index ${index.name}: invalid month window ${String(index.months)}`);
    const monthlyValues: MonthlyValue[] = values
      .map((cell) => ({ year: cell.year, month: cell.month, value: cell.value }))
      .sort((a, b) => a.year - b.year || a.month - b.month);
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

/** Median of |x| over the non-missing values (0 for none). */
function medianSize(cells: readonly Cell[]): number {
  const sizes = new Float64Array(cells.length);
  let count = 0;
  for (const cell of cells) if (cell.value !== null) sizes[count++] = Math.abs(cell.value);
  if (count === 0) return 0;
  const sorted = sizes.subarray(0, count).sort();
  return count % 2 === 1 ? (sorted[(count - 1) / 2] as number) : ((sorted[count / 2 - 1] as number) + (sorted[count / 2] as number)) / 2;
}

/** Adds a problem for every undeclared value that looks like a missing-value code (see readIndexCsv). */
function checkMissingCodes(index: IndexSettings, cells: readonly Cell[], layout: IndexFileLayout, problems: ProblemList, reported: Set<string>): void {
  const median = medianSize(cells);
  for (const cell of cells) {
    if (cell.value === null) continue;
    const size = Math.abs(cell.value);
    const common = COMMON_MISSING_CODES.includes(cell.value);
    const outlier = size >= SENTINEL_SIZE && size >= SENTINEL_RATIO * median;
    if (!common && !outlier) continue;
    // The cells of a wide file are shared by the indices that read it: report each cell once.
    const key = `${layout === "wide" ? "" : index.column}\u0000${cell.line}-${cell.month}`;
    if (reported.has(key)) continue;
    reported.add(key);
    const when = layout === "yearly" ? `${cell.year}` : `${monthName(cell.month)} ${cell.year}`;
    const why = common ? "a common missing-value code" : `far outside the rest of the series, whose median size is ${formatSize(median)}`;
    problems.add(
      cell.line,
      `${index.name} ${when}: the value ${echoText(cell.text)} looks like a missing-value code (${why}); if it marks a missing value, declare it in region.json as "indices": { "${index.name}": { "missing": [${formatCode(cell.value)}] } }, or leave the cell empty`,
    );
  }
}

const formatSize = (value: number): string => String(Number(value.toPrecision(3)));
const formatCode = (value: number): string => String(value);
