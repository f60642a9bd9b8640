/**
 * Number and date formatting for the briefing. Probabilities use the project's one rule in
 * src/outlook/describeChance.ts (`formatPercent`, `formatPercentRange`, `describeChance`), so the
 * page and the outlook JSON compare with a single rule; the other figures pass through these.
 */
import { format } from "date-fns/format";
import { isValid } from "date-fns/isValid";
import { parseISO } from "date-fns/parseISO";

function assertProbability(name: string, p: number): void {
  if (!Number.isFinite(p) || p < 0 || p > 1) throw new RangeError(`${name}: expected a probability in 0–1 (got ${p})`);
}

/**
 * A signed decimal with a true minus sign (U+2212) and fixed digits.
 *
 * @param value - any finite number.
 * @param digits - digits after the point, 0–6.
 * @returns e.g. "−0.42"; "0.00" for a value that rounds to zero (never "−0.00").
 * @throws RangeError when value is not finite.
 * @example
 * formatDecimal(-0.4236, 2); // => "−0.42"
 */
export function formatDecimal(value: number, digits: number): string {
  if (!Number.isFinite(value)) throw new RangeError(`formatDecimal: expected a finite number (got ${value})`);
  const text = value.toFixed(digits);
  if (/^-0(\.0*)?$/.test(text)) return text.slice(1);
  return text.replace("-", "\u2212");
}

/**
 * A p-value with a precision that suits its size: "<0.001", three decimals below 0.01, two above.
 *
 * @param p - a p-value, 0 ≤ p ≤ 1.
 * @returns e.g. "0.004", "0.31", "<0.001".
 * @throws RangeError when p is not in 0–1.
 * @example
 * formatPValue(2.954e-7); // => "<0.001"
 */
export function formatPValue(p: number): string {
  assertProbability("formatPValue", p);
  if (p < 0.001) return "<0.001";
  if (p < 0.01) return p.toFixed(3);
  return p.toFixed(2);
}

/**
 * An integer with thousands separators ("10,000").
 *
 * @param value - a finite number; it is rounded to the nearest integer.
 * @returns the grouped integer text with a true minus sign for negatives.
 * @throws RangeError when value is not finite.
 * @example
 * formatCount(10000); // => "10,000"
 */
export function formatCount(value: number): string {
  if (!Number.isFinite(value)) throw new RangeError(`formatCount: expected a finite number (got ${value})`);
  const rounded = Math.round(value);
  const grouped = Math.abs(rounded).toString().replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  return rounded < 0 ? `\u2212${grouped}` : grouped;
}

/**
 * A calendar date (YYYY-MM-DD) as "10 March 2027", with date-fns.
 *
 * @param isoDate - a date in ISO 8601 calendar form, YYYY-MM-DD.
 * @returns day, full month name and year.
 * @throws RangeError when the text is not a valid calendar date.
 * @example
 * formatLongDate("2027-03-10"); // => "10 March 2027"
 */
export function formatLongDate(isoDate: string): string {
  const date = /^\d{4}-\d{2}-\d{2}$/.test(isoDate) ? parseISO(isoDate) : new Date(Number.NaN);
  if (!isValid(date) || format(date, "yyyy-MM-dd") !== isoDate) throw new RangeError(`formatLongDate: not a calendar date (got "${isoDate}")`);
  return format(date, "d MMMM yyyy");
}
