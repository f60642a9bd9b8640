/**
 * A small validator for the settings of region.json: strict objects, optional keys, strings
 * (trimmed, with a length range), numbers (integer, bounds), fixed choices, lists, records and
 * refinements. It checks a value that `JSON.parse` returned and reports every problem as an
 * {@link SettingsIssue} with the path where it was found; it never throws on any JSON value.
 *
 * The order of the checks, and which checks still run after a problem, follow fixed rules (the
 * problem messages of region.json depend on them):
 * - a value of the wrong type stops the checks of that value, except the length checks, which
 *   still run on any value that has a `length` (so `"cuts": "abc…"` is also reported as too long);
 * - a number that is not an integer stops every later check of that value;
 * - a list longer than its maximum is reported once, and its items are not checked;
 * - a value out of range, a string of the wrong length, an unknown key and a refinement's own
 *   problem let the later checks run; an object's refinement runs only when no value inside the
 *   object has a wrong type (so a refinement can trust the types it reads).
 *
 * Lengths of strings are counted in Unicode code points (a surrogate pair counts once).
 */

/** Where a problem was found: object keys and list positions from the root value. */
export type SettingsPath = (string | number)[];

/** How a length or size was measured. */
export type LengthOrigin = "string" | "array" | "unknown";

/** One problem found by a schema. */
export type SettingsIssue = {
  /** Keys and list positions from the value given to {@link validate}. */
  path: SettingsPath;
  /**
   * Whether later checks of the same value still run: true = yes; undefined = only the length
   * checks; false = none.
   */
  continue?: boolean;
} & (
  | { readonly code: "invalid_type"; readonly expected: "string" | "number" | "int" | "object" | "array" | "record" | "nonoptional" }
  | { readonly code: "too_small"; readonly origin: LengthOrigin | "number" | "int"; readonly minimum: number; readonly inclusive: boolean }
  | { readonly code: "too_big"; readonly origin: LengthOrigin | "number" | "int"; readonly maximum: number; readonly inclusive: boolean }
  | { readonly code: "invalid_value"; readonly values: readonly string[] }
  | { readonly code: "unrecognized_keys"; readonly keys: readonly string[] }
  | { readonly code: "custom"; readonly message: string }
);

/** A value being checked: the value read so far (a trimmed string, a copied object) and its problems. */
interface Payload {
  value: unknown;
  issues: SettingsIssue[];
}

/**
 * A schema: checks one value. `O` is true for a schema made with {@link optional}, whose key
 * may be left out of its object.
 */
export interface Schema<T, O extends boolean = boolean> {
  readonly optional: O;
  /** Checks `payload.value`, replaces it with the value read and adds the problems (paths relative to the value). */
  run(payload: Payload): void;
  /** The type of the value read (for type inference only; never set). */
  readonly output?: T;
}

/** The type of the value a schema reads. */
export type Output<S> = S extends Schema<infer T> ? T : never;

/** The schemas of the keys of an object. */
export type Shape = Readonly<Record<string, Schema<unknown>>>;

/** The value read by a strict object of shape `S`: optional keys may be absent. */
export type ObjectOutput<S extends Shape> = {
  [K in keyof S as S[K] extends Schema<unknown, true> ? never : K]: Output<S[K]>;
} & {
  [K in keyof S as S[K] extends Schema<unknown, true> ? K : never]?: Output<S[K]>;
};

/** A schema of a strict object, with the keys it allows (in the order of its shape). */
export interface ObjectSchema<S extends Shape> extends Schema<ObjectOutput<S>, false> {
  readonly keys: readonly string[];
}

/** Reports a refinement's problem at `path` (relative to the refined value; default: the value itself). */
export type Report = (message: string, path?: SettingsPath) => void;

/** One check after the type of a value is known. */
interface Check {
  /** A length check runs on any value with a `length`, also after a wrong type (not after a stop). */
  readonly length: boolean;
  run(payload: Payload): void;
}

/** Whether a problem from `start` on keeps the later checks from running. */
function stopsChecks(issues: readonly SettingsIssue[], start: number): boolean {
  for (let i = start; i < issues.length; i++) if ((issues[i] as SettingsIssue).continue !== true) return true;
  return false;
}

/** Whether a problem stops every later check, the length checks too. */
function stopsAll(issues: readonly SettingsIssue[]): boolean {
  for (const issue of issues) if (issue.continue === false) return true;
  return false;
}

const hasLength = (value: unknown): boolean => value !== null && value !== undefined && (value as { length?: unknown }).length !== undefined;

function runChecks(payload: Payload, checks: readonly Check[]): void {
  let stopped = stopsChecks(payload.issues, 0);
  for (const check of checks) {
    if (check.length) {
      if (stopsAll(payload.issues) || !hasLength(payload.value)) continue;
    } else if (stopped) {
      continue;
    }
    const before = payload.issues.length;
    check.run(payload);
    if (!stopped && payload.issues.length > before) stopped = stopsChecks(payload.issues, before);
  }
}

function prefixed(issues: SettingsIssue[], key: string | number, into: SettingsIssue[]): void {
  for (const issue of issues) {
    issue.path.unshift(key);
    into.push(issue);
  }
}

const isObject = (value: unknown): value is Record<string, unknown> => typeof value === "object" && value !== null && !Array.isArray(value);

/** Code points of a string: a surrogate pair counts once, a lone surrogate as one. */
function codePointLength(text: string): number {
  let count = text.length;
  for (let i = 0; i < text.length - 1; i++) {
    if ((text.charCodeAt(i) & 0xfc00) === 0xd800 && (text.charCodeAt(i + 1) & 0xfc00) === 0xdc00) {
      count--;
      i++;
    }
  }
  return count;
}

function lengthOrigin(value: unknown): LengthOrigin {
  if (Array.isArray(value)) return "array";
  return typeof value === "string" ? "string" : "unknown";
}

// The length checks compare `length` as JavaScript does (`<=`, `>=`): a value that is not a
// string or list but has a `length` key is measured by that key.
function minLength(minimum: number): Check {
  return {
    length: true,
    run(payload) {
      const input = payload.value as { length: number };
      const units = input.length;
      const length = typeof input === "string" && units >= minimum && units < minimum * 2 ? codePointLength(input) : units;
      if (length >= minimum) return;
      payload.issues.push({ code: "too_small", origin: lengthOrigin(input), minimum, inclusive: true, path: [], continue: true });
    },
  };
}

function maxLength(maximum: number): Check {
  return {
    length: true,
    run(payload) {
      const input = payload.value as { length: number };
      const units = input.length;
      const length = typeof input === "string" && units > maximum ? codePointLength(input) : units;
      if (length <= maximum) return;
      payload.issues.push({ code: "too_big", origin: lengthOrigin(input), maximum, inclusive: true, path: [], continue: true });
    },
  };
}

function refinement(refine: (value: never, report: Report) => void): Check {
  return {
    length: false,
    run(payload) {
      refine(payload.value as never, (message, path = []) => {
        payload.issues.push({ code: "custom", message, path: [...path], continue: true });
      });
    },
  };
}

/** Options of {@link text}, applied in this order: trim, min, max, refine. */
export interface TextOptions {
  /** Trim white space at both ends; the value read and the length checks use the trimmed text. */
  readonly trim?: boolean;
  /** Fewest code points. */
  readonly min?: number;
  /** Most code points. */
  readonly max?: number;
  /** A last test of the text, with the message when it fails. */
  readonly refine?: { readonly test: (text: string) => boolean; readonly message: string };
}

/**
 * A string.
 *
 * @example
 * validate(text({ trim: true, min: 1, max: 3 }), "  ab "); // => { ok: true, value: "ab" }
 */
export function text(options: TextOptions = {}): Schema<string, false> {
  const checks: Check[] = [];
  if (options.trim === true) checks.push({ length: false, run: (payload) => void (payload.value = (payload.value as string).trim()) });
  if (options.min !== undefined) checks.push(minLength(options.min));
  if (options.max !== undefined) checks.push(maxLength(options.max));
  const refine = options.refine;
  if (refine !== undefined) checks.push(refinement((value: string, report) => (refine.test(value) ? undefined : report(refine.message))));
  return {
    optional: false,
    run(payload) {
      if (typeof payload.value !== "string") payload.issues.push({ code: "invalid_type", expected: "string", path: [] });
      runChecks(payload, checks);
    },
  };
}

/** Options of {@link number}, applied in this order: int, min, gt, max, lt. */
export interface NumberOptions {
  /** A safe integer (|x| ≤ 2^53 − 1). */
  readonly int?: boolean;
  /** Bounds: min ≤ x, gt < x, x ≤ max, x < lt. */
  readonly min?: number;
  readonly gt?: number;
  readonly max?: number;
  readonly lt?: number;
}

function bound(kind: "min" | "gt" | "max" | "lt", limit: number): Check {
  return {
    length: false,
    run(payload) {
      const value = payload.value as number;
      if (kind === "min" && !(value >= limit)) payload.issues.push({ code: "too_small", origin: "number", minimum: limit, inclusive: true, path: [], continue: true });
      if (kind === "gt" && !(value > limit)) payload.issues.push({ code: "too_small", origin: "number", minimum: limit, inclusive: false, path: [], continue: true });
      if (kind === "max" && !(value <= limit)) payload.issues.push({ code: "too_big", origin: "number", maximum: limit, inclusive: true, path: [], continue: true });
      if (kind === "lt" && !(value < limit)) payload.issues.push({ code: "too_big", origin: "number", maximum: limit, inclusive: false, path: [], continue: true });
    },
  };
}

/** A whole number: a fraction stops the later checks; an integer beyond ±(2^53 − 1) is out of range and they still run. */
const integerCheck: Check = {
  length: false,
  run(payload) {
    const value = payload.value as number;
    if (!Number.isInteger(value)) {
      payload.issues.push({ code: "invalid_type", expected: "int", path: [], continue: false });
    } else if (value > Number.MAX_SAFE_INTEGER) {
      payload.issues.push({ code: "too_big", origin: "int", maximum: Number.MAX_SAFE_INTEGER, inclusive: true, path: [], continue: true });
    } else if (value < Number.MIN_SAFE_INTEGER) {
      payload.issues.push({ code: "too_small", origin: "int", minimum: Number.MIN_SAFE_INTEGER, inclusive: true, path: [], continue: true });
    }
  },
};

/**
 * A finite number (JSON numbers beyond about 1.8e308, read as ±Infinity, are of the wrong type).
 *
 * @example
 * validate(number({ int: true, min: 1 }), 0.5).ok; // => false ("int")
 */
export function number(options: NumberOptions = {}): Schema<number, false> {
  const checks: Check[] = [];
  if (options.int === true) checks.push(integerCheck);
  if (options.min !== undefined) checks.push(bound("min", options.min));
  if (options.gt !== undefined) checks.push(bound("gt", options.gt));
  if (options.max !== undefined) checks.push(bound("max", options.max));
  if (options.lt !== undefined) checks.push(bound("lt", options.lt));
  return {
    optional: false,
    run(payload) {
      const value = payload.value;
      if (typeof value !== "number" || !Number.isFinite(value)) payload.issues.push({ code: "invalid_type", expected: "number", path: [] });
      runChecks(payload, checks);
    },
  };
}

/**
 * One of fixed strings (a single one for a literal).
 *
 * @example
 * validate(oneOf(["fraction", "sites"]), "area").ok; // => false
 */
export function oneOf<const V extends string>(values: readonly V[]): Schema<V, false> {
  const allowed = new Set<unknown>(values);
  return {
    optional: false,
    run(payload) {
      if (!allowed.has(payload.value)) payload.issues.push({ code: "invalid_value", values, path: [] });
    },
  };
}

/**
 * A list whose items all match `item`, with at least `min` and at most `max` items. A list longer
 * than `max` is reported once and its items are not checked.
 */
export function list<T>(item: Schema<T>, options: { readonly min?: number; readonly max?: number } = {}): Schema<T[], false> {
  const checks: Check[] = [];
  if (options.min !== undefined) checks.push(minLength(options.min));
  if (options.max !== undefined) checks.push(maxLength(options.max));
  const most = options.max;
  return {
    optional: false,
    run(payload) {
      const input = payload.value;
      if (!Array.isArray(input)) {
        payload.issues.push({ code: "invalid_type", expected: "array", path: [] });
      } else if (most !== undefined && input.length > most) {
        payload.issues.push({ code: "too_big", origin: "array", maximum: most, inclusive: true, path: [], continue: false });
        return;
      } else {
        const read = new Array<unknown>(input.length);
        for (let i = 0; i < input.length; i++) {
          const child: Payload = { value: input[i], issues: [] };
          item.run(child);
          prefixed(child.issues, i, payload.issues);
          read[i] = child.value;
        }
        payload.value = read;
      }
      runChecks(payload, checks);
    },
  };
}

/**
 * An object whose keys are free text and whose values all match `value`. A key "__proto__" is
 * skipped (the caller reports it: on an ordinary object it would set the prototype).
 */
export function record<T>(value: Schema<T>): Schema<Record<string, T>, false> {
  return {
    optional: false,
    run(payload) {
      const input = payload.value;
      if (!isObject(input)) {
        payload.issues.push({ code: "invalid_type", expected: "record", path: [] });
        return;
      }
      const read: Record<string, unknown> = {};
      for (const key of Object.keys(input)) {
        if (key === "__proto__") continue;
        const child: Payload = { value: input[key], issues: [] };
        value.run(child);
        prefixed(child.issues, key, payload.issues);
        read[key] = child.value;
      }
      payload.value = read;
    },
  };
}

/**
 * An object with exactly the keys of `shape` (a key of an {@link optional} schema may be left
 * out). The keys are checked in the order of the shape, then any other key is reported, once for
 * the object, as unknown ("__proto__" too). `refine`, when given, then checks the value read as a
 * whole, unless a value inside has a wrong type.
 *
 * @example
 * const range = object({ first: number(), last: number() }, (r, report) => (r.first <= r.last ? undefined : report("backwards", ["last"])));
 */
export function object<const S extends Shape>(shape: S, refine?: (value: ObjectOutput<S>, report: Report) => void): ObjectSchema<S> {
  const keys = Object.keys(shape);
  const known = new Set(keys);
  const checks = refine === undefined ? [] : [refinement(refine)];
  return {
    optional: false,
    keys,
    run(payload) {
      const input = payload.value;
      if (!isObject(input)) {
        payload.issues.push({ code: "invalid_type", expected: "object", path: [] });
        return;
      }
      const read: Record<string, unknown> = {};
      for (const key of keys) {
        const schema = shape[key] as Schema<unknown>;
        const present = Object.hasOwn(input, key);
        if (!present && schema.optional) continue;
        const child: Payload = { value: present ? input[key] : undefined, issues: [] };
        schema.run(child);
        if (child.issues.length > 0) prefixed(child.issues, key, payload.issues);
        else if (!present) payload.issues.push({ code: "invalid_type", expected: "nonoptional", path: [key] });
        if (present) read[key] = child.value;
      }
      const unknown = Object.keys(input).filter((key) => !known.has(key));
      if (unknown.length > 0) payload.issues.push({ code: "unrecognized_keys", keys: unknown, path: [], continue: true });
      payload.value = read;
      runChecks(payload, checks);
    },
  };
}

/** The same schema for a key that may be left out of its object. */
export function optional<T>(schema: Schema<T>): Schema<T, true> {
  return {
    optional: true,
    run(payload) {
      if (payload.value !== undefined) schema.run(payload);
    },
  };
}

/**
 * Checks a value (from `JSON.parse`) against a schema.
 *
 * @returns the value read (strings trimmed where asked, objects copied with their known keys
 *   only), or every problem in the order found; never throws on a JSON value
 * @example
 * validate(object({ n: number() }), { n: "1" });
 * // => { ok: false, issues: [{ code: "invalid_type", expected: "number", path: ["n"] }] }
 */
export function validate<T>(schema: Schema<T>, value: unknown): { ok: true; value: T } | { ok: false; issues: SettingsIssue[] } {
  const payload: Payload = { value, issues: [] };
  schema.run(payload);
  return payload.issues.length === 0 ? { ok: true, value: payload.value as T } : { ok: false, issues: payload.issues };
}
