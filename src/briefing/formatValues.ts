/**
 * Number, date and text formatting for the briefing. Probabilities use the project's one rule in
 * src/outlook/describeChance.ts (`formatPercent`, `formatPercentRange`, `describeChance`), so the
 * page and the outlook JSON compare with a single rule; the other figures pass through these.
 *
 * Every formatter here is total: any number (NaN, ±Infinity, 1e200, −0) and any string gives
 * printable text, never an exception. A value that cannot be shown as a figure says why in words
 * ("not computable" for NaN, "∞" for an infinity); a number too large for fixed notation is
 * written as a power of ten ("1.2 × 10^200").
 */
import { format } from "date-fns/format";
import { isValid } from "date-fns/isValid";
import { parseISO } from "date-fns/parseISO";

/** The words printed for a NaN (a figure that could not be computed). */
export const NOT_COMPUTABLE = "not computable";

/** Numbers at or above this size are written as a power of ten: fixed notation would run to 16+ digits. */
const SCIENTIFIC_FROM = 1e15;

/**
 * True when a value is a finite number (not null, undefined, NaN or ±Infinity).
 *
 * @param value - anything.
 * @returns whether it is a finite number.
 * @throws never.
 * @example
 * isFiniteNumber(Number.NaN); // => false
 */
export function isFiniteNumber(value: unknown): value is number {
  return typeof value === "number" && Number.isFinite(value);
}

function minus(text: string): string {
  return text.replace("-", "\u2212");
}

/** Text of a non-finite or huge number, or null when ordinary fixed notation applies. */
function special(value: number, digits: number): string | null {
  if (Number.isNaN(value)) return NOT_COMPUTABLE;
  if (value === Number.POSITIVE_INFINITY) return "\u221e";
  if (value === Number.NEGATIVE_INFINITY) return "\u2212\u221e";
  if (Math.abs(value) >= SCIENTIFIC_FROM) {
    const [mantissa, exponent] = value.toExponential(Math.min(Math.max(digits, 1), 3)).split("e");
    return `${minus(mantissa ?? "")} \u00d7 10^${Number(exponent)}`;
  }
  return null;
}

function clampDigits(digits: number): number {
  return Number.isFinite(digits) ? Math.min(6, Math.max(0, Math.round(digits))) : 2;
}

/**
 * A signed decimal with a true minus sign (U+2212) and fixed digits.
 *
 * @param value - any number; NaN prints "not computable", ±Infinity "∞" / "−∞", a magnitude of
 *   10^15 or more a power of ten.
 * @param digits - digits after the point, 0–6 (clamped).
 * @returns e.g. "−0.42"; "0.00" for a value that rounds to zero (never "−0.00").
 * @throws never.
 * @example
 * formatDecimal(-0.4236, 2); // => "−0.42"
 */
export function formatDecimal(value: number, digits: number): string {
  const places = clampDigits(digits);
  const odd = special(value, places);
  if (odd !== null) return odd;
  const text = value.toFixed(places);
  if (/^-0(\.0*)?$/.test(text)) return text.slice(1);
  return minus(text);
}

/**
 * A figure with fixed digits, or the reason it is not one: the same as {@link formatDecimal}
 * (kept as the name the view model uses for any number that reaches the page).
 *
 * @param value - any number.
 * @param digits - digits after the point, 0–6.
 * @returns the text.
 * @throws never.
 * @example
 * formatNumber(1e200, 2); // => "1.00 × 10^200"
 */
export function formatNumber(value: number, digits: number): string {
  return formatDecimal(value, digits);
}

/**
 * A p-value with a precision that suits its size: "<0.001", three decimals below 0.01, two above.
 *
 * @param p - a p-value, 0 ≤ p ≤ 1; anything else (NaN, negative, above 1) prints "not computable".
 * @returns e.g. "0.004", "0.31", "<0.001".
 * @throws never.
 * @example
 * formatPValue(2.954e-7); // => "<0.001"
 */
export function formatPValue(p: number): string {
  if (!isFiniteNumber(p) || p < 0 || p > 1) return NOT_COMPUTABLE;
  if (p < 0.001) return "<0.001";
  if (p < 0.01) return p.toFixed(3);
  return p.toFixed(2);
}

/**
 * An integer with thousands separators ("10,000").
 *
 * @param value - any number; it is rounded to the nearest integer. NaN prints "not computable",
 *   ±Infinity "∞" / "−∞", 10^15 or more a power of ten.
 * @returns the grouped integer text with a true minus sign for negatives.
 * @throws never.
 * @example
 * formatCount(10000); // => "10,000"
 */
export function formatCount(value: number): string {
  const odd = special(value, 1);
  if (odd !== null) return odd;
  const rounded = Math.round(value);
  const grouped = Math.abs(rounded).toString().replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  return rounded < 0 ? `\u2212${grouped}` : grouped;
}

/**
 * A calendar date (YYYY-MM-DD) as "10 March 2027", with date-fns.
 *
 * @param isoDate - a date in ISO 8601 calendar form, YYYY-MM-DD.
 * @returns day, full month name and year; text that is not a calendar date is returned as
 *   "<text> (not a calendar date)" (at most 40 characters of it).
 * @throws never.
 * @example
 * formatLongDate("2027-03-10"); // => "10 March 2027"
 */
export function formatLongDate(isoDate: string): string {
  const date = /^\d{4}-\d{2}-\d{2}$/.test(isoDate) ? parseISO(isoDate) : new Date(Number.NaN);
  if (!isValid(date) || format(date, "yyyy-MM-dd") !== isoDate) return `${clipText(String(isoDate), 40)} (not a calendar date)`;
  return format(date, "d MMMM yyyy");
}

/**
 * A moment (ISO 8601 date-time) as "10 March 2027, 08:15 UTC", with date-fns, in UTC so the text
 * does not depend on the machine's time zone.
 *
 * @param isoMoment - e.g. "2027-03-10T08:15:00.000Z".
 * @returns the date and the UTC time to the minute; text that is not a moment is returned as
 *   "<text> (not a date and time)".
 * @throws never.
 * @example
 * formatMoment("2027-03-10T08:15:42.000Z"); // => "10 March 2027, 08:15 UTC"
 */
export function formatMoment(isoMoment: string): string {
  const date = parseISO(isoMoment);
  if (!isValid(date)) return `${clipText(String(isoMoment), 40)} (not a date and time)`;
  const utc = new Date(date.getTime() + date.getTimezoneOffset() * 60_000);
  return `${format(utc, "d MMMM yyyy, HH:mm")} UTC`;
}

/**
 * Free text bounded for the page: at most `max` characters (whole code points), the rest cut with
 * an ellipsis, so one very long name cannot push a page out of shape. Line breaks and tabs become
 * spaces.
 *
 * @param text - any string.
 * @param max - the most characters kept, ≥ 2 (default 120).
 * @returns the text, cut with "…" when longer.
 * @throws never.
 * @example
 * clipText("abcdef", 4); // => "abc…"
 */
export function clipText(text: string, max = 120): string {
  const limit = Number.isFinite(max) ? Math.max(2, Math.floor(max)) : 120;
  const flat = String(text).replace(/[\r\n\t]+/g, " ");
  const characters = [...flat];
  return characters.length <= limit ? flat : `${characters.slice(0, limit - 1).join("")}\u2026`;
}
