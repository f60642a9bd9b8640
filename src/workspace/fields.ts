import type { ProblemList } from "./InputError.js";
import { echoText } from "./limits.js";

const INTEGER = /^[+-]?\d+$/;
const DECIMAL = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
/** {@link DECIMAL} without an exponent: such a text needs no U+2212 replacement. */
const PLAIN_DECIMAL = /^[+-]?(?:\d+\.?\d*|\.\d+)$/;

/** How a field's text is shown in a problem: a short quoted excerpt with control characters escaped, or "an empty cell". */
export function foundText(text: string): string {
  if (text === "") return "found an empty cell";
  return `found "${echoText(text).replaceAll('"', '\\"')}"`;
}

/** U+2212 MINUS SIGN, as typeset tables and our own PDF print negative numbers. */
const UNICODE_MINUS = /\u2212/g;

/**
 * Decimal number parser: a finite number such as `-0.5`, `1.2e3`, `.25` or `−0.5` written with the
 * Unicode minus sign U+2212 (read as "-", also in an exponent); no thousands separators, no
 * spaces inside, no hexadecimal, no "Infinity" or "NaN".
 *
 * @param text - the text, already trimmed
 * @returns the number, or null when the text is not a finite decimal number
 * @example
 * parseDecimal("\u22120.5"); // => -0.5
 * parseDecimal("1e400"); // => null (not finite)
 */
export function parseDecimal(text: string): number | null {
  if (PLAIN_DECIMAL.test(text)) {
    // The common case, without the U+2212 replacement (the built-in regex and Number are far
    // quicker than a scan in JavaScript while the reader is not yet compiled).
    const value = Number(text);
    return Number.isFinite(value) ? value : null;
  }
  const ascii = text.replace(UNICODE_MINUS, "-");
  if (!DECIMAL.test(ascii)) return null;
  const value = Number(ascii);
  return Number.isFinite(value) ? value : null;
}

/** Limits on a number read from a field; both bounds inclusive. */
export interface FieldRange {
  readonly min?: number;
  readonly max?: number;
}

function checkRange(value: number, column: string, range: FieldRange, text: string, line: number, problems: ProblemList): number | null {
  if ((range.min !== undefined && value < range.min) || (range.max !== undefined && value > range.max)) {
    const bounds =
      range.min !== undefined && range.max !== undefined
        ? `between ${range.min} and ${range.max}`
        : range.min !== undefined
          ? `at least ${range.min}`
          : `at most ${String(range.max)}`;
    problems.add(line, `${column} must be ${bounds} (${foundText(text)})`);
    return null;
  }
  return value;
}

const NO_RANGE: FieldRange = Object.freeze({});

function slowInteger(text: string): number {
  const ascii = text.replace(UNICODE_MINUS, "-");
  return INTEGER.test(ascii) ? Number(ascii) : NaN;
}

/**
 * Integer field reader: a whole number written in decimal digits with an optional sign.
 *
 * @returns the number, or null after adding a problem `column must be an integer (found "…")`
 * @example
 * readInteger("1750", "year", 4, problems); // => 1750
 */
export function readInteger(text: string, column: string, line: number, problems: ProblemList, range: FieldRange = NO_RANGE): number | null {
  const value = INTEGER.test(text) ? Number(text) : slowInteger(text);
  if (!Number.isSafeInteger(value)) {
    problems.add(line, `${column} must be an integer (${foundText(text)})`);
    return null;
  }
  return checkRange(value, column, range, text, line, problems);
}

/**
 * Decimal field reader: a finite number as {@link parseDecimal} reads it (U+2212 minus allowed).
 *
 * @returns the number, or null after adding a problem `column must be a number (found "…")`
 * @example
 * readNumber("-0.5", "ENSO", 9, problems); // => -0.5
 */
export function readNumber(text: string, column: string, line: number, problems: ProblemList, range: FieldRange = NO_RANGE): number | null {
  const value = parseDecimal(text) ?? NaN;
  if (!Number.isFinite(value)) {
    problems.add(line, `${column} must be a number (${foundText(text)})`);
    return null;
  }
  return checkRange(value, column, range, text, line, problems);
}

/**
 * Optional decimal field reader: an empty cell is a missing value.
 *
 * @returns the number; `null` for an empty cell; `undefined` after adding a problem
 */
export function readOptionalNumber(
  text: string,
  column: string,
  line: number,
  problems: ProblemList,
  range: FieldRange = NO_RANGE,
): number | null | undefined {
  if (text === "") return null;
  return readNumber(text, column, line, problems, range) ?? undefined;
}
