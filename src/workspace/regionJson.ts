import { parseMonthWindow } from "../climate/seasonalValues.js";
import { DEFAULT_FIRE_YEARS, DEFAULT_METHODS, DEFAULT_SEED, DEFAULT_TERCILE_LABELS } from "./defaults.js";
import { didYouMean } from "./didYouMean.js";
import { InputError, ProblemList } from "./InputError.js";
import { JsonSyntaxError, locateJson } from "./jsonLocations.js";
import { echoText, MAX_MISSING_CODES, TEXT_LIMITS } from "./limits.js";
import * as v from "./settingsSchema.js";
import type { IndexSettings, PhaseRule, RegionSettings } from "./types.js";

/** The data files named in region.json, as written there (relative to the region folder). */
export interface RegionFileNames {
  readonly fireRecord:
    | { readonly kind: "sites"; readonly sites: string; readonly events: string }
    | { readonly kind: "activity"; readonly activity: string };
  readonly modern: string | null;
}

const INDEX_NAME = /^[A-Za-z][A-Za-z0-9_.-]*$/;

/** A data-file path: trimmed, not empty, at most TEXT_LIMITS.file characters. */
const fileName = v.text({ trim: true, min: 1, max: TEXT_LIMITS.file });
/** Optional free text of at most `limit` characters. */
const freeText = (limit: number) => v.optional(v.text({ max: limit }));
/** A whole year from -9999 to 9999. */
const year = v.number({ int: true, min: -9999, max: 9999 });
/** A whole number from `min` to `max` (no upper bound when left out). */
const integer = (min: number, max?: number) => v.optional(v.number({ int: true, min, max }));

const calibrationSchema = v.object({ first: year, last: year }, (c, report) => {
  if (!(c.first <= c.last)) report("must not be before calibration.first", ["last"]);
});

const fireRecordSchema = v.object(
  {
    sites: v.optional(fileName),
    events: v.optional(fileName),
    activity: v.optional(fileName),
    modern: v.optional(fileName),
  },
  (record, report) => {
    const hasSites = record.sites !== undefined || record.events !== undefined;
    if (hasSites && record.activity !== undefined) {
      report('give either "sites" and "events", or "activity", not both', ["activity"]);
    } else if (hasSites) {
      if (record.sites === undefined) report('"sites" is required with "events"');
      if (record.events === undefined) report('"events" is required with "sites"');
    } else if (record.activity === undefined) {
      report('give "sites" and "events", or "activity"');
    }
  },
);

const fireYearsSchema = v.object({
  top: v.optional(v.number({ gt: 0, lt: 1 })),
  measure: v.optional(v.oneOf(["fraction", "sites"])),
  minSitesRecording: integer(1),
});

const indexSchema = v.object(
  {
    file: fileName,
    column: v.optional(v.text({ trim: true, min: 1, max: TEXT_LIMITS.column })),
    months: v.optional(v.text({ max: 40 })),
    cuts: v.optional(v.list(v.number(), { min: 1, max: 20 })),
    phases: v.optional(v.oneOf(["terciles"])),
    labels: v.optional(v.list(v.text({ trim: true, min: 1, max: TEXT_LIMITS.label }), { max: 21 })),
    missing: v.optional(v.list(v.number(), { max: MAX_MISSING_CODES })),
    units: v.optional(v.text({ trim: true, min: 1, max: TEXT_LIMITS.units })),
  },
  (index, report) => {
    if (index.months !== undefined && parseMonthWindow(index.months) === null) {
      report('must be a month window such as "Dec-Mar" or "Jul"', ["months"]);
    }
    if ((index.cuts === undefined) === (index.phases === undefined)) {
      report('give exactly one of "cuts" or "phases": "terciles"');
      return;
    }
    if (index.cuts !== undefined) {
      for (let i = 1; i < index.cuts.length; i++) {
        if ((index.cuts[i] as number) <= (index.cuts[i - 1] as number)) report("cuts must be strictly ascending", ["cuts", i]);
      }
      if (index.labels === undefined) {
        report(`"labels" is required with "cuts" (${index.cuts.length + 1} labels)`);
      } else if (index.labels.length !== index.cuts.length + 1) {
        report(`needs ${index.cuts.length + 1} labels for ${index.cuts.length} cuts`, ["labels"]);
      }
    } else if (index.labels !== undefined && index.labels.length !== 3) {
      report("terciles need exactly 3 labels", ["labels"]);
    }
    if (index.labels !== undefined && new Set(index.labels).size !== index.labels.length) {
      report("labels must be different from each other", ["labels"]);
    }
  },
);

/** Days in each month; February of a leap year has 29. */
const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/**
 * An issue date: YYYY-MM-DD naming a real day of the proleptic Gregorian calendar (a leap year is
 * divisible by 4, except a century year not divisible by 400; year 0000 is a leap year).
 *
 * @example
 * isIssueDate("2024-02-29"); // => true
 * isIssueDate("2027-02-30"); // => false
 */
export function isIssueDate(date: string): boolean {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  if (match === null) return false;
  const year = Number(match[1]);
  const month = Number(match[2]);
  const day = Number(match[3]);
  if (month < 1 || month > 12 || day < 1) return false;
  const leap = year % 400 === 0 || (year % 4 === 0 && year % 100 !== 0);
  return day <= (month === 2 && leap ? 29 : (DAYS_IN_MONTH[month - 1] as number));
}

const outlookSchema = v.object({
  season: v.optional(year),
  values: v.optional(v.record(v.number())),
  issued: v.optional(v.text({ refine: { test: isIssueDate, message: "must be a date YYYY-MM-DD" } })),
});

const methodsSchema = v.object(
  {
    interval: v.optional(v.oneOf(["wilson", "jeffreys"])),
    seaFirstLag: integer(-100, 100),
    seaLastLag: integer(-100, 100),
    seaDraws: integer(1000, 1_000_000),
    blockYears: integer(1, 100),
    blockMaxLag: integer(0, 100),
    stabilityWindow: integer(2, 10000),
    stabilityStep: integer(1, 10000),
    analogs: integer(1, 1000),
    jointMinYears: integer(1, 10000),
    jointMaxQ: v.optional(v.number({ gt: 0, max: 1 })),
    nearBoundarySd: v.optional(v.number({ min: 0, max: 10 })),
    response: v.optional(v.oneOf(["phase", "curve"])),
    modernMeasure: v.optional(v.oneOf(["area", "fires"])),
    permutations: integer(199, 100_000),
    bootstrapResamples: integer(199, 100_000),
    independenceKm: v.optional(v.number({ min: 0 })),
    hindcastExclusion: integer(0, 100),
    smallSampleYears: integer(1, 10000),
  },
  (methods, report) => {
    const first = methods.seaFirstLag ?? DEFAULT_METHODS.seaFirstLag;
    const last = methods.seaLastLag ?? DEFAULT_METHODS.seaLastLag;
    if (first > 0 || last < 0) {
      report("the SEA lags must run from 0 or below to 0 or above", [methods.seaFirstLag !== undefined ? "seaFirstLag" : "seaLastLag"]);
    }
  },
);

const regionSchema = v.object(
  {
    name: v.text({ trim: true, min: 1, max: TEXT_LIMITS.name }),
    description: freeText(TEXT_LIMITS.description),
    preparedBy: freeText(TEXT_LIMITS.preparedBy),
    contact: freeText(TEXT_LIMITS.contact),
    calibration: v.optional(calibrationSchema),
    fireRecord: fireRecordSchema,
    fireYears: v.optional(fireYearsSchema),
    indices: v.record(indexSchema),
    outlook: v.optional(outlookSchema),
    seed: v.optional(v.number({ int: true, min: Number.MIN_SAFE_INTEGER, max: Number.MAX_SAFE_INTEGER })),
    methods: v.optional(methodsSchema),
  },
  (region, report) => {
    const names = Object.keys(region.indices);
    if (names.length === 0) report("name at least one index", ["indices"]);
    for (const name of names) {
      if (!INDEX_NAME.test(name)) {
        report("an index name starts with a letter and has only letters, digits, '_', '-' or '.'", ["indices", name]);
      } else if (name.length > TEXT_LIMITS.indexName) {
        report(`an index name has at most ${TEXT_LIMITS.indexName} characters (this one has ${name.length})`, ["indices", name]);
      }
    }
    for (const name of Object.keys(region.outlook?.values ?? {})) {
      if (!names.includes(name)) {
        const suggestion = didYouMean(name, names);
        report(
          `"${echoText(name)}" is not an index of this region${suggestion === null ? ` (indices: ${names.map((known) => echoText(known)).join(", ")})` : ` (did you mean "${echoText(suggestion)}"?)`}`,
          ["outlook", "values", name],
        );
      }
    }
  },
);

type RegionJson = v.Output<typeof regionSchema>;

/** The keys allowed in the object at `path`, for did-you-mean suggestions. */
function knownKeysAt(path: v.SettingsPath): readonly string[] {
  if (path.length === 0) return regionSchema.keys;
  if (path.length === 2 && path[0] === "indices") return indexSchema.keys;
  if (path.length === 1) {
    switch (path[0]) {
      case "calibration":
        return calibrationSchema.keys;
      case "fireRecord":
        return fireRecordSchema.keys;
      case "fireYears":
        return fireYearsSchema.keys;
      case "outlook":
        return outlookSchema.keys;
      case "methods":
        return methodsSchema.keys;
      default:
        return [];
    }
  }
  return [];
}

function valueAt(root: unknown, path: readonly PropertyKey[]): unknown {
  let value = root;
  for (const key of path) {
    if (value === null || typeof value !== "object" || !Object.hasOwn(value, key)) return undefined;
    value = (value as Record<PropertyKey, unknown>)[key];
  }
  return value;
}

function describeValue(value: unknown): string {
  if (value === undefined) return "nothing";
  if (typeof value === "number" && !Number.isFinite(value)) return "a number out of range";
  const text = JSON.stringify(value);
  return echoText(text.length > 40 ? `${text.slice(0, 37)}...` : text, 43);
}

/**
 * `JSON.parse` keeps a key "__proto__" as an own property, but the settings schema's record reader
 * skips it (an ordinary object would take it as its prototype). A "__proto__" key in `indices` or
 * `outlook.values` is therefore refused here, with its line; in the fixed-key objects the strict
 * schema already reports it as an unknown key.
 */
function checkProtoKeys(raw: Record<string, unknown>, locations: ReturnType<typeof locateJson>, problems: ProblemList): void {
  const indices = Object.hasOwn(raw, "indices") ? raw["indices"] : undefined;
  if (indices !== null && typeof indices === "object" && !Array.isArray(indices) && Object.hasOwn(indices, "__proto__")) {
    problems.add(
      locations.lineOf(["indices", "__proto__"]),
      `"indices.__proto__": "__proto__" cannot be an index name (an index name starts with a letter and has only letters, digits, '_', '-' or '.')`,
    );
  }
  const outlook = Object.hasOwn(raw, "outlook") ? raw["outlook"] : undefined;
  if (outlook !== null && typeof outlook === "object" && !Array.isArray(outlook) && Object.hasOwn(outlook, "values")) {
    const values = (outlook as Record<string, unknown>)["values"];
    if (values !== null && typeof values === "object" && !Array.isArray(values) && Object.hasOwn(values, "__proto__")) {
      problems.add(locations.lineOf(["outlook", "values", "__proto__"]), `"outlook.values.__proto__" "__proto__" is not an index of this region`);
    }
  }
}

const dotted = (path: readonly PropertyKey[]): string =>
  path.map((key, i) => (typeof key === "number" ? `[${key}]` : `${i === 0 ? "" : "."}${echoText(String(key))}`)).join("");

/** Keys that were renamed, with the hint shown when the old key is used. */
const RENAMED_KEYS: ReadonlyMap<string, { readonly key: string; readonly hint: string }> = new Map([
  ["methods.nearBoundaryMargin", { key: "nearBoundarySd", hint: "it is now a share of the index's standard deviation, e.g. 0.1" }],
]);

/** How an expected JSON type is said ("must be an object", not "a object"). */
const EXPECTED_WORDS: Readonly<Record<string, string>> = Object.freeze({
  int: "an integer",
  array: "a list (JSON array)",
  object: "an object",
  record: "an object",
});

/** A plain sentence for one problem found by the settings schema. */
function issueMessage(issue: Exclude<v.SettingsIssue, { code: "unrecognized_keys" }>, found: unknown): string {
  if (typeof found === "number" && !Number.isFinite(found)) {
    return "is out of range: not a finite number (JSON numbers beyond about 1.8e308 cannot be used)";
  }
  switch (issue.code) {
    case "invalid_type":
      return found === undefined ? "is required" : `must be ${EXPECTED_WORDS[issue.expected] ?? `a ${issue.expected}`}`;
    case "too_small":
      if (issue.origin === "array") return `needs at least ${String(issue.minimum)} item(s)`;
      if (issue.origin === "string") return "must not be empty";
      return `must be ${issue.inclusive ? "at least" : "greater than"} ${String(issue.minimum)}`;
    case "too_big":
      if (issue.origin === "string") return `is too long: at most ${String(issue.maximum)} characters`;
      if (issue.origin === "array") return `has too many items: at most ${String(issue.maximum)}`;
      return `must be ${issue.inclusive ? "at most" : "less than"} ${String(issue.maximum)}`;
    case "invalid_value":
      return `must be one of ${issue.values.map((value) => JSON.stringify(value)).join(", ")}`;
    case "custom":
      return issue.message;
  }
}

/**
 * Region settings reader: parses and validates the text of region.json and fills in every default
 * (DEFAULT_METHODS, DEFAULT_FIRE_YEARS, tercile labels, seed 1, column = index name).
 *
 * @param text - the text of region.json (a leading BOM is allowed)
 * @param file - the file as shown in problems, e.g. "my-region/region.json"
 * @returns the settings and the data-file names
 * @throws InputError listing every problem: JSON syntax (with its line), unknown keys (named, with
 *   a did-you-mean suggestion), wrong types and out-of-range values (with the line of the key and
 *   the value found), and repeated keys
 * @example
 * parseRegionJson('{"name":"X","fireRecord":{"activity":"a.csv"},"indices":{"ENSO":{"file":"i.csv","phases":"terciles"}}}', "region.json")
 *   .settings.methods.seaDraws; // => 10000
 */
export function parseRegionJson(text: string, file: string): { settings: RegionSettings; files: RegionFileNames } {
  const problems = new ProblemList(file);
  const source = text.startsWith("\uFEFF") ? text.slice(1) : text;
  if (source.trim() === "") {
    problems.add(null, "the file is empty");
    throw new InputError(problems.toArray());
  }
  let locations;
  try {
    locations = locateJson(source);
  } catch (error) {
    if (error instanceof JsonSyntaxError) {
      problems.add(error.line, error.message);
      throw new InputError(problems.toArray());
    }
    throw error;
  }
  for (const duplicate of locations.duplicateKeys) {
    const where = duplicate.path.length === 0 ? "" : ` in "${dotted(duplicate.path)}"`;
    problems.add(duplicate.line, `key "${echoText(duplicate.key)}" appears twice${where}`);
  }
  const raw: unknown = JSON.parse(source);
  if (raw === null || typeof raw !== "object" || Array.isArray(raw)) {
    problems.add(1, `region.json must hold one JSON object (found ${describeValue(raw)})`);
    throw new InputError(problems.toArray());
  }
  checkProtoKeys(raw as Record<string, unknown>, locations, problems);
  const parsed = v.validate(regionSchema, raw);
  if (!parsed.ok) {
    for (const issue of parsed.issues) {
      if (issue.code === "unrecognized_keys") {
        const known = knownKeysAt(issue.path);
        for (const key of issue.keys) {
          const renamed = RENAMED_KEYS.get(dotted([...issue.path, key]));
          const suggestion = renamed?.key ?? didYouMean(key, known);
          const where = issue.path.length === 0 ? "" : ` in "${dotted(issue.path)}"`;
          const hint =
            suggestion === null
              ? ` (allowed: ${known.join(", ")})`
              : ` (did you mean "${suggestion}"?${renamed === undefined ? "" : ` ${renamed.hint}`})`;
          problems.add(locations.lineOf([...issue.path.map(String), key]), `unknown key "${echoText(key)}"${where}${hint}`);
        }
        continue;
      }
      const found = valueAt(raw, issue.path);
      const subject = issue.path.length === 0 ? "region.json" : `"${dotted(issue.path)}"`;
      const message = issueMessage(issue, found);
      const literal = locations.literalOf(issue.path);
      let foundText = "";
      if (typeof found === "number" && !Number.isFinite(found)) foundText = ` (found ${echoText(literal ?? String(found))})`;
      else if (typeof found === "string" && issue.code === "too_big") foundText = ` (found ${found.length} characters)`;
      else if (found !== undefined && (issue.code !== "custom" || message.startsWith("must"))) foundText = ` (found ${describeValue(found)})`;
      problems.add(locations.lineOf(issue.path), `${subject} ${message}${foundText}`);
    }
  }
  if (problems.size > 0 || !parsed.ok) throw new InputError(problems.toArray());
  return toSettings(parsed.value);
}

/** A copy of a record with no prototype, so that a lookup by a user's key never finds an inherited property. */
function nullPrototypeCopy(record: Readonly<Record<string, number>>): Record<string, number> {
  const copy = Object.create(null) as Record<string, number>;
  for (const [key, value] of Object.entries(record)) copy[key] = value;
  return copy;
}

function toSettings(region: RegionJson): { settings: RegionSettings; files: RegionFileNames } {
  const indices: IndexSettings[] = Object.entries(region.indices).map(([name, index]) => {
    const phases: PhaseRule =
      index.cuts !== undefined
        ? { kind: "cuts", cuts: index.cuts, labels: index.labels ?? [] }
        : { kind: "terciles", labels: index.labels ?? [...DEFAULT_TERCILE_LABELS] };
    const window = index.months === undefined ? null : parseMonthWindow(index.months);
    return {
      name,
      file: index.file,
      column: index.column ?? name,
      phases,
      months: window === null ? null : window.text,
      missing: [...(index.missing ?? [])],
      units: index.units ?? null,
    };
  });
  const methods = { ...DEFAULT_METHODS };
  for (const [key, value] of Object.entries(region.methods ?? {})) {
    if (value !== undefined) Object.assign(methods, { [key]: value });
  }
  const settings: RegionSettings = {
    name: region.name,
    description: region.description ?? null,
    preparedBy: region.preparedBy ?? null,
    contact: region.contact ?? null,
    calibration: region.calibration ?? null,
    fireYears: {
      top: region.fireYears?.top ?? DEFAULT_FIRE_YEARS.top,
      measure: region.fireYears?.measure ?? DEFAULT_FIRE_YEARS.measure,
      minSitesRecording: region.fireYears?.minSitesRecording ?? DEFAULT_FIRE_YEARS.minSitesRecording,
    },
    indices,
    outlook: {
      season: region.outlook?.season ?? null,
      values: nullPrototypeCopy(region.outlook?.values ?? {}),
      issued: region.outlook?.issued ?? null,
    },
    seed: region.seed ?? DEFAULT_SEED,
    methods,
  };
  const record = region.fireRecord;
  const fireRecord: RegionFileNames["fireRecord"] =
    record.activity !== undefined
      ? { kind: "activity", activity: record.activity }
      : { kind: "sites", sites: record.sites as string, events: record.events as string };
  return { settings, files: { fireRecord, modern: record.modern ?? null } };
}
