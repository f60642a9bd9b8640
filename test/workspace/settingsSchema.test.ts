import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { InputError } from "../../src/workspace/InputError.js";
import { parseRegionJson } from "../../src/workspace/regionJson.js";
import { list, number, object, oneOf, optional, record, text, validate, type SettingsIssue } from "../../src/workspace/settingsSchema.js";

const issuesOf = (result: ReturnType<typeof validate>): SettingsIssue[] => (result.ok ? [] : result.issues);
const codes = (result: ReturnType<typeof validate>): string[] => issuesOf(result).map((issue) => `${issue.path.join(".")}:${issue.code}`);

describe("settingsSchema: text, number, oneOf", () => {
  it("text trims before measuring and reads the trimmed text; lengths count code points", () => {
    expect(validate(text({ trim: true, min: 1, max: 3 }), "  ab  ")).toEqual({ ok: true, value: "ab" });
    expect(codes(validate(text({ trim: true, min: 1 }), "   "))).toEqual([":too_small"]);
    expect(validate(text({ max: 2 }), "😀😀").ok).toBe(true);
    expect(issuesOf(validate(text({ max: 2 }), "😀😀😀"))).toMatchObject([{ code: "too_big", origin: "string", maximum: 2 }]);
  });

  it("a value of the wrong type is reported, and a list given for a string is still measured", () => {
    expect(issuesOf(validate(text({ min: 1 }), 5))).toMatchObject([{ code: "invalid_type", expected: "string" }]);
    expect(issuesOf(validate(text({ min: 1 }), []))).toMatchObject([
      { code: "invalid_type", expected: "string" },
      { code: "too_small", origin: "array", minimum: 1 },
    ]);
  });

  it("a refinement of a text runs only on a string", () => {
    const date = text({ refine: { test: (value) => value.length === 10, message: "must be a date" } });
    expect(issuesOf(validate(date, "2027"))).toMatchObject([{ code: "custom", message: "must be a date" }]);
    expect(codes(validate(date, 2027))).toEqual([":invalid_type"]);
  });

  it("number: finite only; a fraction stops the later checks, an unsafe integer does not", () => {
    expect(codes(validate(number(), Infinity))).toEqual([":invalid_type"]);
    expect(issuesOf(validate(number({ int: true, min: 1 }), 0.5))).toMatchObject([{ code: "invalid_type", expected: "int", continue: false }]);
    expect(issuesOf(validate(number({ int: true, max: 10 }), 1e20))).toMatchObject([
      { code: "too_big", origin: "int", maximum: Number.MAX_SAFE_INTEGER },
      { code: "too_big", origin: "number", maximum: 10 },
    ]);
    expect(issuesOf(validate(number({ gt: 0, lt: 1 }), 1))).toMatchObject([{ code: "too_big", maximum: 1, inclusive: false }]);
    expect(issuesOf(validate(number({ min: 0 }), -1))).toMatchObject([{ code: "too_small", minimum: 0, inclusive: true }]);
  });

  it("oneOf accepts exactly its values", () => {
    expect(validate(oneOf(["a", "b"]), "b")).toEqual({ ok: true, value: "b" });
    expect(issuesOf(validate(oneOf(["a", "b"]), "c"))).toMatchObject([{ code: "invalid_value", values: ["a", "b"] }]);
  });
});

describe("settingsSchema: list, record, object", () => {
  it("list: item problems carry their position; a list over its maximum is reported once, its items unchecked", () => {
    const cuts = list(number(), { min: 1, max: 2 });
    expect(codes(validate(cuts, [1, "x"]))).toEqual(["1:invalid_type"]);
    expect(codes(validate(cuts, []))).toEqual([":too_small"]);
    expect(issuesOf(validate(cuts, ["x", "y", "z"]))).toMatchObject([{ code: "too_big", origin: "array", maximum: 2, continue: false }]);
    expect(issuesOf(validate(cuts, "abc"))).toMatchObject([{ code: "invalid_type", expected: "array" }, { code: "too_big", origin: "string" }]);
  });

  it("record: every value checked under its key; __proto__ skipped; built-in names kept as own keys", () => {
    const values = record(number());
    const parsed = validate(values, JSON.parse('{"a": 1, "__proto__": 2, "constructor": 3}'));
    expect(parsed).toEqual({ ok: true, value: { a: 1, constructor: 3 } });
    expect(codes(validate(values, { a: "1" }))).toEqual(["a:invalid_type"]);
    expect(codes(validate(values, [1]))).toEqual([":invalid_type"]);
  });

  it("object: keys in shape order, then one problem naming every unknown key, then the refinement", () => {
    const range = object({ first: number(), last: optional(number()) }, (value, report) => {
      if (value.last !== undefined && value.last < value.first) report("backwards", ["last"]);
    });
    expect(range.keys).toEqual(["first", "last"]);
    expect(validate(range, { first: 1 })).toEqual({ ok: true, value: { first: 1 } });
    expect(issuesOf(validate(range, { zz: 1, last: "x", yy: 2 }))).toMatchObject([
      { code: "invalid_type", path: ["first"] },
      { code: "invalid_type", path: ["last"] },
      { code: "unrecognized_keys", keys: ["zz", "yy"], path: [] },
    ]);
    expect(issuesOf(validate(range, { first: 2, last: 1, zz: 0 }))).toMatchObject([
      { code: "unrecognized_keys", keys: ["zz"] },
      { code: "custom", message: "backwards", path: ["last"] },
    ]);
    expect(codes(validate(range, JSON.parse('{"first": 1, "__proto__": {}}')))).toEqual([":unrecognized_keys"]);
  });

  it("an object's refinement does not run after a wrong type inside it, but does after a value out of range", () => {
    let runs = 0;
    const schema = object({ n: number({ max: 1 }) }, () => void runs++);
    validate(schema, { n: "1" });
    expect(runs).toBe(0);
    validate(schema, { n: 5 });
    expect(runs).toBe(1);
  });
});

describe("settingsSchema never throws (fast-check)", () => {
  const schema = object(
    {
      name: text({ trim: true, min: 1, max: 5 }),
      tags: optional(list(text({ trim: true, min: 1 }), { min: 1, max: 3 })),
      values: optional(record(number({ int: true, min: 0, max: 9 }))),
      kind: optional(oneOf(["a", "b"])),
      inner: optional(object({ x: number({ gt: 0, lt: 1 }) }, (inner, report) => (inner.x > 0.5 ? report("too high", ["x"]) : undefined))),
    },
    (value, report) => (value.tags !== undefined && value.tags.includes(value.name) ? report("name among tags") : undefined),
  );
  const keys = ["name", "tags", "values", "kind", "inner", "x", "__proto__", "length"];
  const json = fc.jsonValue({ maxDepth: 4 });
  const shaped = fc.dictionary(fc.constantFrom(...keys), json, { maxKeys: 6 });

  it("validate(schema, value) only reports problems, whose paths lead into the value", () => {
    fc.assert(
      fc.property(fc.oneof(json, shaped), (value) => {
        const result = validate(schema, value);
        for (const issue of issuesOf(result)) {
          let at: unknown = value;
          for (const key of issue.path.slice(0, -1)) {
            expect(at !== null && typeof at === "object" && Object.hasOwn(at, key)).toBe(true);
            at = (at as Record<string | number, unknown>)[key];
          }
        }
      }),
      { numRuns: 3000, seed: 14 },
    );
  });

  it("parseRegionJson on region-shaped JSON with arbitrary values returns settings or throws InputError", () => {
    const indexKeys = ["file", "column", "months", "cuts", "phases", "labels", "missing", "units", "x"];
    const regionKeys = ["name", "description", "calibration", "fireRecord", "fireYears", "indices", "outlook", "seed", "methods", "x"];
    const index = fc.dictionary(fc.constantFrom(...indexKeys), json, { maxKeys: 5 });
    const region = fc
      .tuple(fc.dictionary(fc.constantFrom(...regionKeys), json, { maxKeys: 6 }), fc.dictionary(fc.constantFrom("ENSO", "1x", "__proto__"), index, { maxKeys: 2 }))
      .map(([top, indices]) => ({ ...top, indices, name: top["name"] ?? "X", fireRecord: top["fireRecord"] ?? { activity: "a.csv" } }));
    fc.assert(
      fc.property(region, fc.boolean(), (value, pretty) => {
        try {
          parseRegionJson(JSON.stringify(value, null, pretty ? 2 : undefined), "region.json");
        } catch (error) {
          expect(error).toBeInstanceOf(InputError);
        }
      }),
      { numRuns: 3000, seed: 15 },
    );
  });
});

describe("isIssueDate(date)", () => {
  it("accepts exactly the YYYY-MM-DD days that date-fns parseISO reads as valid", async () => {
    const { isValid } = await import("date-fns/isValid");
    const { parseISO } = await import("date-fns/parseISO");
    const { isIssueDate } = await import("../../src/workspace/regionJson.js");
    const pad = (n: number, width: number) => String(n).padStart(width, "0");
    for (const year of [0, 1, 4, 100, 400, 1600, 1700, 1900, 2000, 2023, 2024, 2027, 2100, 9996, 9999]) {
      for (let month = 0; month <= 13; month++) {
        for (let day = 0; day <= 32; day++) {
          const text = `${pad(year, 4)}-${pad(month, 2)}-${pad(day, 2)}`;
          expect(isIssueDate(text), text).toBe(isValid(parseISO(text)));
        }
      }
    }
    for (const text of ["2027-3-10", "27-03-10", "2027-03-10T00:00", "+2027-03-10", " 2027-03-10", "2027/03/10", "", "２０２７-03-10"]) {
      expect(isIssueDate(text), text).toBe(false);
    }
  });
});
