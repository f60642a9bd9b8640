import { isValid } from "date-fns/isValid";
import { parseISO } from "date-fns/parseISO";
import { z } from "zod";
import { parseMonthWindow } from "../climate/seasonalValues.js";
import { DEFAULT_FIRE_YEARS, DEFAULT_METHODS, DEFAULT_SEED, DEFAULT_TERCILE_LABELS } from "./defaults.js";
import { didYouMean } from "./didYouMean.js";
import { InputError, ProblemList } from "./InputError.js";
import { JsonSyntaxError, locateJson } from "./jsonLocations.js";
import { echoText, MAX_MISSING_CODES, TEXT_LIMITS } from "./limits.js";
import type { IndexSettings, PhaseRule, RegionSettings } from "./types.js";

/** The data files named in region.json, as written there (relative to the region folder). */
export interface RegionFileNames {
  readonly fireRecord:
    | { readonly kind: "sites"; readonly sites: string; readonly events: string }
    | { readonly kind: "activity"; readonly activity: string };
  readonly modern: string | null;
}

const INDEX_NAME = /^[A-Za-z][A-Za-z0-9_.-]*$/;

const fileName = z.string().trim().min(1, { error: "must be a file name" }).max(TEXT_LIMITS.file);
/** Optional free text of at most `limit` characters. */
const freeText = (limit: number) => z.string().max(limit);
const year = z.number().int().min(-9999, { error: "must be a year from -9999 to 9999" }).max(9999, { error: "must be a year from -9999 to 9999" });
const integer = (minimum: number) => z.number().int().min(minimum);

const calibrationSchema = z
  .strictObject({ first: year, last: year })
  .refine((c) => c.first <= c.last, { error: "must not be before calibration.first", path: ["last"] });

const fireRecordSchema = z
  .strictObject({
    sites: fileName.optional(),
    events: fileName.optional(),
    activity: fileName.optional(),
    modern: fileName.optional(),
  })
  .superRefine((record, ctx) => {
    const hasSites = record.sites !== undefined || record.events !== undefined;
    if (hasSites && record.activity !== undefined) {
      ctx.addIssue({ code: "custom", message: 'give either "sites" and "events", or "activity", not both', path: ["activity"] });
    } else if (hasSites) {
      if (record.sites === undefined) ctx.addIssue({ code: "custom", message: '"sites" is required with "events"', path: [] });
      if (record.events === undefined) ctx.addIssue({ code: "custom", message: '"events" is required with "sites"', path: [] });
    } else if (record.activity === undefined) {
      ctx.addIssue({ code: "custom", message: 'give "sites" and "events", or "activity"', path: [] });
    }
  });

const fireYearsSchema = z.strictObject({
  top: z.number().gt(0).lt(1).optional(),
  measure: z.enum(["fraction", "sites"]).optional(),
  minSitesRecording: integer(1).optional(),
});

const indexSchema = z
  .strictObject({
    file: fileName,
    column: z.string().trim().min(1).max(TEXT_LIMITS.column).optional(),
    months: z.string().max(40).optional(),
    cuts: z.array(z.number()).min(1).max(20).optional(),
    phases: z.literal("terciles").optional(),
    labels: z.array(z.string().trim().min(1).max(TEXT_LIMITS.label)).max(21).optional(),
    missing: z.array(z.number()).max(MAX_MISSING_CODES).optional(),
    units: z.string().trim().min(1).max(TEXT_LIMITS.units).optional(),
  })
  .superRefine((index, ctx) => {
    if (index.months !== undefined && parseMonthWindow(index.months) === null) {
      ctx.addIssue({ code: "custom", message: 'must be a month window such as "Dec-Mar" or "Jul"', path: ["months"] });
    }
    if ((index.cuts === undefined) === (index.phases === undefined)) {
      ctx.addIssue({ code: "custom", message: 'give exactly one of "cuts" or "phases": "terciles"', path: [] });
      return;
    }
    if (index.cuts !== undefined) {
      for (let i = 1; i < index.cuts.length; i++) {
        if ((index.cuts[i] as number) <= (index.cuts[i - 1] as number)) {
          ctx.addIssue({ code: "custom", message: "cuts must be strictly ascending", path: ["cuts", i] });
        }
      }
      if (index.labels === undefined) {
        ctx.addIssue({ code: "custom", message: `"labels" is required with "cuts" (${index.cuts.length + 1} labels)`, path: [] });
      } else if (index.labels.length !== index.cuts.length + 1) {
        ctx.addIssue({ code: "custom", message: `needs ${index.cuts.length + 1} labels for ${index.cuts.length} cuts`, path: ["labels"] });
      }
    } else if (index.labels !== undefined && index.labels.length !== 3) {
      ctx.addIssue({ code: "custom", message: "terciles need exactly 3 labels", path: ["labels"] });
    }
    if (index.labels !== undefined && new Set(index.labels).size !== index.labels.length) {
      ctx.addIssue({ code: "custom", message: "labels must be different from each other", path: ["labels"] });
    }
  });

const outlookSchema = z.strictObject({
  season: year.optional(),
  values: z.record(z.string(), z.number()).optional(),
  issued: z
    .string()
    .refine((text) => /^\d{4}-\d{2}-\d{2}$/.test(text) && isValid(parseISO(text)), { error: "must be a date YYYY-MM-DD" })
    .optional(),
});

const methodsSchema = z
  .strictObject({
    interval: z.enum(["wilson", "jeffreys"]).optional(),
    seaFirstLag: z.number().int().min(-100).max(100).optional(),
    seaLastLag: z.number().int().min(-100).max(100).optional(),
    seaDraws: integer(1000).max(1_000_000, { error: "must be at most 1000000" }).optional(),
    blockYears: integer(1).max(100).optional(),
    blockMaxLag: integer(0).max(100).optional(),
    stabilityWindow: integer(2).max(10000).optional(),
    stabilityStep: integer(1).max(10000).optional(),
    analogs: integer(1).max(1000).optional(),
    jointMinYears: integer(1).max(10000).optional(),
    jointMaxQ: z.number().gt(0).max(1).optional(),
    nearBoundarySd: z.number().min(0).max(10).optional(),
    response: z.enum(["phase", "curve"]).optional(),
    modernMeasure: z.enum(["area", "fires"]).optional(),
    permutations: integer(199).max(100_000).optional(),
    bootstrapResamples: integer(199).max(100_000).optional(),
    independenceKm: z.number().min(0).optional(),
    hindcastExclusion: integer(0).max(100).optional(),
    smallSampleYears: integer(1).max(10000).optional(),
  })
  .superRefine((methods, ctx) => {
    const first = methods.seaFirstLag ?? DEFAULT_METHODS.seaFirstLag;
    const last = methods.seaLastLag ?? DEFAULT_METHODS.seaLastLag;
    if (first > 0 || last < 0) {
      ctx.addIssue({ code: "custom", message: "the SEA lags must run from 0 or below to 0 or above", path: [methods.seaFirstLag !== undefined ? "seaFirstLag" : "seaLastLag"] });
    }
  });

const regionSchema = z
  .strictObject({
    name: z.string().trim().min(1, { error: "must be a non-empty name" }).max(TEXT_LIMITS.name),
    description: freeText(TEXT_LIMITS.description).optional(),
    preparedBy: freeText(TEXT_LIMITS.preparedBy).optional(),
    contact: freeText(TEXT_LIMITS.contact).optional(),
    calibration: calibrationSchema.optional(),
    fireRecord: fireRecordSchema,
    fireYears: fireYearsSchema.optional(),
    indices: z.record(z.string(), indexSchema),
    outlook: outlookSchema.optional(),
    seed: z.number().int().min(Number.MIN_SAFE_INTEGER).max(Number.MAX_SAFE_INTEGER).optional(),
    methods: methodsSchema.optional(),
  })
  .superRefine((region, ctx) => {
    const names = Object.keys(region.indices);
    if (names.length === 0) ctx.addIssue({ code: "custom", message: "name at least one index", path: ["indices"] });
    for (const name of names) {
      if (!INDEX_NAME.test(name)) {
        ctx.addIssue({
          code: "custom",
          message: "an index name starts with a letter and has only letters, digits, '_', '-' or '.'",
          path: ["indices", name],
        });
      } else if (name.length > TEXT_LIMITS.indexName) {
        ctx.addIssue({
          code: "custom",
          message: `an index name has at most ${TEXT_LIMITS.indexName} characters (this one has ${name.length})`,
          path: ["indices", name],
        });
      }
    }
    for (const name of Object.keys(region.outlook?.values ?? {})) {
      if (!names.includes(name)) {
        const suggestion = didYouMean(name, names);
        ctx.addIssue({
          code: "custom",
          message: `"${echoText(name)}" is not an index of this region${suggestion === null ? ` (indices: ${names.map((known) => echoText(known)).join(", ")})` : ` (did you mean "${echoText(suggestion)}"?)`}`,
          path: ["outlook", "values", name],
        });
      }
    }
  });

type RegionJson = z.infer<typeof regionSchema>;

/** The keys allowed in the object at `path`, for did-you-mean suggestions. */
function knownKeysAt(path: readonly PropertyKey[]): readonly string[] {
  if (path.length === 0) return Object.keys(regionSchema.shape);
  if (path.length === 2 && path[0] === "indices") return Object.keys(indexSchema.shape);
  if (path.length === 1) {
    switch (path[0]) {
      case "calibration":
        return Object.keys(calibrationSchema.shape);
      case "fireRecord":
        return Object.keys(fireRecordSchema.shape);
      case "fireYears":
        return Object.keys(fireYearsSchema.shape);
      case "outlook":
        return Object.keys(outlookSchema.shape);
      case "methods":
        return Object.keys(methodsSchema.shape);
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
 * `JSON.parse` keeps a key "__proto__" as an own property, but zod's record reader drops it and an
 * ordinary object would take it as its prototype. A "__proto__" key in `indices` or
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

/** A plain sentence for one zod issue. */
function issueMessage(issue: z.core.$ZodIssue, found: unknown): string {
  if (typeof found === "number" && !Number.isFinite(found)) {
    return "is out of range: not a finite number (JSON numbers beyond about 1.8e308 cannot be used)";
  }
  switch (issue.code) {
    case "invalid_type":
      return found === undefined ? "is required" : `must be ${issue.expected === "int" ? "an integer" : `a ${issue.expected}`}`;
    case "too_small":
      if (issue.origin === "array") return `needs at least ${String(issue.minimum)} item(s)`;
      if (issue.origin === "string") return "must not be empty";
      return `must be ${issue.inclusive ? "at least" : "greater than"} ${String(issue.minimum)}`;
    case "too_big":
      if (issue.origin === "string") return `is too long: at most ${String(issue.maximum)} characters`;
      if (issue.origin === "array") return `has too many items: at most ${String(issue.maximum)}`;
      return `must be ${issue.inclusive ? "at most" : "less than"} ${String(issue.maximum)}`;
    case "invalid_value":
      return `must be one of ${issue.values.map((v) => JSON.stringify(v)).join(", ")}`;
    case "invalid_format":
      return `must be ${issue.format}`;
    case "not_multiple_of":
      return `must be a multiple of ${String(issue.divisor)}`;
    default:
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
  const parsed = regionSchema.safeParse(raw);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
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
      const literal = locations.literalOf(issue.path.map((key) => (typeof key === "number" ? key : String(key))));
      let foundText = "";
      if (typeof found === "number" && !Number.isFinite(found)) foundText = ` (found ${echoText(literal ?? String(found))})`;
      else if (typeof found === "string" && issue.code === "too_big") foundText = ` (found ${found.length} characters)`;
      else if (found !== undefined && (issue.code !== "custom" || message.startsWith("must"))) foundText = ` (found ${describeValue(found)})`;
      problems.add(
        locations.lineOf(issue.path.map((key) => (typeof key === "number" ? key : String(key)))),
        `${subject} ${message}${foundText}`,
      );
    }
  }
  if (problems.size > 0 || !parsed.success) throw new InputError(problems.toArray());
  return toSettings(parsed.data);
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
