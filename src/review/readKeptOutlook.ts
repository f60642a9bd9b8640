import { InputError, type InputProblem } from "../workspace/InputError.js";
import { JsonSyntaxError, locateJson, type JsonLocations } from "../workspace/jsonLocations.js";
import { echoText } from "../workspace/limits.js";
import type { KeptOutlook } from "./types.js";

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

/** Kept categories must sum to 1 within this (rounded hand-written odds pass), then are rescaled to sum to 1. */
export const CATEGORY_SUM_TOLERANCE = 0.01;

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === "object" && value !== null && !Array.isArray(value);
}

function own(record: Record<string, unknown>, key: string): unknown {
  return Object.hasOwn(record, key) ? record[key] : undefined;
}

const isProbability = (value: unknown): value is number => typeof value === "number" && Number.isFinite(value) && value >= 0 && value <= 1;

function realDate(text: string): boolean {
  const match = ISO_DATE.exec(text);
  if (match === null) return false;
  const [year, month, day] = [Number(match[1]), Number(match[2]), Number(match[3])];
  const date = new Date(2000, 0, 1, 12);
  date.setFullYear(year, month - 1, day);
  return date.getFullYear() === year && date.getMonth() === month - 1 && date.getDate() === day;
}

/** The line of the first JSON syntax error in `text` (null when the locator finds none). */
function syntaxErrorLine(text: string): number | null {
  try {
    locateJson(text);
    return null;
  } catch (error) {
    return error instanceof JsonSyntaxError ? error.line : null;
  }
}

/**
 * Kept-outlook reader: reads back one outlook that `brief` kept (`<region>/issued/*.json`, the
 * `firephase.outlook/1` object) or that someone wrote by hand. Required: `schema` (a string
 * starting "firephase.outlook/"), `issued` (a real date YYYY-MM-DD), `season` (an integer year)
 * and `fireYear.estimate` (a probability 0–1). Optional and used when present: `fireYear.lower`
 * and `upper`, `baseRate.estimate`, `categories.{below,near,above}.estimate` (summing to 1 within
 * {@link CATEGORY_SUM_TOLERANCE}, then rescaled), `phases` (index → label) and `current[]`
 * (`index`, `value`). Optional fields that are malformed are left out rather than refused.
 *
 * @param text - the file's text
 * @param file - the file as shown in messages
 * @returns the kept outlook
 * @throws InputError with `file:line: message` problems (the line of the offending key, or of the
 *   syntax error) when the text is not JSON or a required field is missing or malformed
 * @example
 * readKeptOutlook('{"schema":"firephase.outlook/1","issued":"2026-03-01","season":2026,"fireYear":{"estimate":0.2}}', "r/issued/a.json");
 * // => { file: "r/issued/a.json", season: 2026, issued: "2026-03-01", probability: 0.2, … }
 */
export function readKeptOutlook(text: string, file: string): KeptOutlook {
  let value: unknown;
  try {
    value = JSON.parse(text) as unknown;
  } catch (error) {
    throw new InputError([{ file, line: syntaxErrorLine(text), message: `not valid JSON (${error instanceof Error ? error.message : String(error)})` }]);
  }
  // Line numbers are needed only for problems: the text is located (a slower, second parse) only then.
  let located: JsonLocations | null = null;
  const locations = { lineOf: (path: readonly (string | number)[]): number | null => (located ??= locateJson(text)).lineOf(path) };
  const problems: InputProblem[] = [];
  const problem = (path: readonly (string | number)[], message: string): void => {
    problems.push({ file, line: locations.lineOf(path), message });
  };
  if (!isRecord(value)) throw new InputError([{ file, line: locations.lineOf([]), message: "a kept outlook must be a JSON object" }]);
  const schema = own(value, "schema");
  if (typeof schema !== "string" || !schema.startsWith("firephase.outlook/")) {
    problem(schema === undefined ? [] : ["schema"], `"schema" must be "firephase.outlook/1" (found ${schema === undefined ? "nothing" : echoText(JSON.stringify(schema))})`);
  }
  const issued = own(value, "issued");
  if (typeof issued !== "string" || !realDate(issued)) {
    problem(issued === undefined ? [] : ["issued"], `"issued" must be a date YYYY-MM-DD (found ${issued === undefined ? "nothing" : echoText(JSON.stringify(issued))})`);
  }
  const season = own(value, "season");
  if (typeof season !== "number" || !Number.isInteger(season) || season < 1 || season > 9999) {
    problem(season === undefined ? [] : ["season"], `"season" must be a year such as 2027 (found ${season === undefined ? "nothing" : echoText(JSON.stringify(season))})`);
  }
  const fireYear = own(value, "fireYear");
  const estimate = isRecord(fireYear) ? own(fireYear, "estimate") : undefined;
  if (!isProbability(estimate)) {
    problem(
      isRecord(fireYear) && estimate !== undefined ? ["fireYear", "estimate"] : fireYear === undefined ? [] : ["fireYear"],
      `"fireYear.estimate" must be a probability from 0 to 1 (found ${estimate === undefined ? "nothing" : echoText(JSON.stringify(estimate))})`,
    );
  }
  if (problems.length > 0) throw new InputError(problems);

  const lower = isRecord(fireYear) ? own(fireYear, "lower") : undefined;
  const upper = isRecord(fireYear) ? own(fireYear, "upper") : undefined;
  const baseRate = own(value, "baseRate");
  const baseEstimate = isRecord(baseRate) ? own(baseRate, "estimate") : undefined;
  const categories = own(value, "categories");
  let kept: KeptOutlook["categories"] = null;
  if (isRecord(categories)) {
    const odds = (["below", "near", "above"] as const).map((name) => {
      const entry = own(categories, name);
      const p = isRecord(entry) ? own(entry, "estimate") : undefined;
      return isProbability(p) ? p : null;
    });
    const [below, near, above] = odds;
    if (below !== null && below !== undefined && near !== null && near !== undefined && above !== null && above !== undefined) {
      const sum = below + near + above;
      if (Math.abs(sum - 1) <= CATEGORY_SUM_TOLERANCE + 1e-12 && sum > 0) kept = { below: below / sum, near: near / sum, above: above / sum };
    }
  }
  const phases: { index: string; label: string }[] = [];
  const phaseRecord = own(value, "phases");
  if (isRecord(phaseRecord)) {
    for (const index of Object.keys(phaseRecord)) {
      const label = phaseRecord[index];
      if (typeof label === "string") phases.push({ index, label });
    }
  }
  const values: { index: string; value: number }[] = [];
  const current = own(value, "current");
  if (Array.isArray(current)) {
    for (const entry of current) {
      if (!isRecord(entry)) continue;
      const index = own(entry, "index");
      const number = own(entry, "value");
      if (typeof index === "string" && typeof number === "number" && Number.isFinite(number)) values.push({ index, value: number });
    }
  }
  return {
    file,
    schema: schema as string,
    issued: issued as string,
    season: season as number,
    probability: estimate as number,
    lower: isProbability(lower) ? lower : null,
    upper: isProbability(upper) ? upper : null,
    baseRate: isProbability(baseEstimate) ? baseEstimate : null,
    categories: kept,
    phases,
    values,
  };
}
