import { MONTH_ABBREVIATIONS, parseMonthWindow, seasonalValues, type MonthlyValue } from "../climate/seasonalValues.js";
import { readCsvTable } from "./csvTable.js";
import { readInteger, readOptionalNumber } from "./fields.js";
import type { ProblemList } from "./InputError.js";
import type { IndexSeries, IndexSettings, Warning } from "./types.js";

const YEAR_RANGE = { min: -9999, max: 9999 } as const;

/**
 * Climate-index file reader. A yearly file (`year,<INDEX>,…`) holds one seasonal value per year;
 * a monthly file (`year,month,<INDEX>,…`, month 1–12) is averaged over each index's month window
 * (see `seasonalValues`). An empty cell is a missing value. Several indices may share one file.
 *
 * @param bytes - the file's content
 * @param indices - the indices of region.json that read this file (at least one)
 * @param problems - collects problems: a named column missing from the header, a non-integer or
 *   repeated year (or year and month, naming both lines), a month outside 1–12, a value that is
 *   not a number, a yearly/monthly mismatch with region.json's `months`
 * @param file - the file as shown to the user, for warnings
 * @returns one series per index (ascending unique years), and warnings for seasons left missing
 *   because a month is missing; no series when the file has problems
 */
export function readIndexCsv(
  bytes: Uint8Array,
  indices: readonly IndexSettings[],
  problems: ProblemList,
  file: string,
): { series: IndexSeries[]; warnings: Warning[] } {
  const table = readCsvTable(bytes, ["year"], problems);
  if (table === null) return { series: [], warnings: [] };
  const monthly = table.columns.includes("month");
  let usable = true;
  for (const index of indices) {
    if (!table.columns.includes(index.column)) {
      const named = index.column === index.name ? "" : ` (column of index ${index.name})`;
      problems.add(table.headerLine, `missing column "${index.column}"${named} named in region.json (found columns: ${table.columns.join(", ")})`);
      usable = false;
    }
    if (monthly && index.months === null) {
      problems.add(table.headerLine, `this is a monthly file (it has a "month" column): give "months" for index ${index.name} in region.json, e.g. "Dec-Mar"`);
      usable = false;
    }
    if (!monthly && index.months !== null) {
      problems.add(table.headerLine, `region.json gives "months" for index ${index.name}, but this file has no "month" column`);
      usable = false;
    }
  }
  if (!usable) return { series: [], warnings: [] };

  const rows: { line: number; year: number; month: number; values: (number | null)[] }[] = [];
  for (const row of table.rows) {
    const year = readInteger(row.field("year"), "year", row.line, problems, YEAR_RANGE);
    const month = monthly ? readInteger(row.field("month"), "month", row.line, problems, { min: 1, max: 12 }) : 0;
    const values = indices.map((index) => readOptionalNumber(row.field(index.column), index.column, row.line, problems));
    if (year === null || month === null || values.some((value) => value === undefined)) continue;
    rows.push({ line: row.line, year, month, values: values as (number | null)[] });
  }
  const seen = new Map<string, number>();
  for (const row of rows) {
    const key = `${row.year}-${row.month}`;
    const earlier = seen.get(key);
    const what = monthly ? `year ${row.year} month ${row.month}` : `year ${row.year}`;
    if (earlier === undefined) seen.set(key, row.line);
    else problems.add(row.line, `${what} appears twice (lines ${earlier} and ${row.line})`);
  }
  if (problems.size > 0) return { series: [], warnings: [] };

  const series: IndexSeries[] = [];
  const warnings: Warning[] = [];
  indices.forEach((index, position) => {
    if (!monthly) {
      const sorted = [...rows].sort((a, b) => a.year - b.year);
      series.push({ name: index.name, years: sorted.map((r) => r.year), values: sorted.map((r) => r.values[position] ?? null) });
      return;
    }
    const window = parseMonthWindow(index.months ?? "");
    if (window === null) throw new RangeError(`index ${index.name}: invalid month window ${String(index.months)}`);
    const monthlyValues: MonthlyValue[] = rows.map((r) => ({ year: r.year, month: r.month, value: r.values[position] ?? null }));
    const seasonal = seasonalValues(monthlyValues, window);
    const sortedMonths = [...monthlyValues].sort((x, y) => x.year - y.year || x.month - y.month);
    series.push({ name: index.name, years: seasonal.years, values: seasonal.values, monthly: sortedMonths });
    if (seasonal.incomplete.length > 0) {
      const count = seasonal.incomplete.length;
      const shown = seasonal.incomplete
        .slice(0, 5)
        .map((season) => `${season.year} (${season.missing.map((m) => `${MONTH_ABBREVIATIONS[m.month - 1]} ${m.year}`).join(", ")})`)
        .join("; ");
      warnings.push({
        code: "season-missing-month",
        message: `${file}: ${index.name} ${window.text}: ${count} season${count === 1 ? "" : "s"} left missing because a month is missing: ${shown}${count > 5 ? `; and ${count - 5} more` : ""}`,
      });
    }
  });
  return { series, warnings };
}
