import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { DEFAULT_METHODS } from "../../src/workspace/defaults.js";
import { didYouMean, editDistance } from "../../src/workspace/didYouMean.js";
import { InputError, type InputProblem } from "../../src/workspace/InputError.js";
import { locateJson } from "../../src/workspace/jsonLocations.js";
import { parseRegionJson } from "../../src/workspace/regionJson.js";

const minimal = {
  name: "X",
  fireRecord: { activity: "a.csv" },
  indices: { ENSO: { file: "i.csv", cuts: [-0.5, 0.5], labels: ["cold", "neutral", "warm"] } },
};

function problems(value: unknown): readonly InputProblem[] {
  try {
    parseRegionJson(JSON.stringify(value, null, 2), "region.json");
  } catch (error) {
    expect(error).toBeInstanceOf(InputError);
    return (error as InputError).problems;
  }
  throw new Error("parsed without problems");
}

const messages = (value: unknown): string[] => problems(value).map((p) => p.message);

describe("parseRegionJson(text, file)", () => {
  it("fills every default: methods, fireYears, seed 1, column = index name, no calibration, empty outlook", () => {
    const { settings, files } = parseRegionJson(JSON.stringify(minimal), "region.json");
    expect(settings.methods).toEqual(DEFAULT_METHODS);
    expect(settings.fireYears).toEqual({ top: 0.1, measure: "fraction", minSitesRecording: 3 });
    expect(settings.seed).toBe(1);
    expect(settings.calibration).toBeNull();
    expect(settings.description).toBeNull();
    expect(settings.outlook).toEqual({ season: null, values: {}, issued: null });
    expect(settings.indices).toEqual([
      { name: "ENSO", file: "i.csv", column: "ENSO", months: null, phases: { kind: "cuts", cuts: [-0.5, 0.5], labels: ["cold", "neutral", "warm"] }, missing: [], units: null },
    ]);
    expect(files).toEqual({ fireRecord: { kind: "activity", activity: "a.csv" }, modern: null });
  });

  it("keeps given method values and fills the rest", () => {
    const { settings } = parseRegionJson(JSON.stringify({ ...minimal, methods: { seaDraws: 5000, interval: "jeffreys" } }), "r");
    expect(settings.methods).toEqual({ ...DEFAULT_METHODS, seaDraws: 5000, interval: "jeffreys" });
  });

  it("reads the sites form with modern fires, a month window, terciles with default labels and a custom column", () => {
    const { settings, files } = parseRegionJson(
      JSON.stringify({
        ...minimal,
        fireRecord: { sites: "s.csv", events: "e.csv", modern: "m.csv" },
        indices: { NAO: { file: "n.csv", column: "nao_djfm", months: "dec-mar", phases: "terciles" } },
        outlook: { season: 2027, values: { NAO: 0.4 }, issued: "2027-03-10" },
        calibration: { first: 1700, last: 1990 },
        seed: 12345,
      }),
      "r",
    );
    expect(files).toEqual({ fireRecord: { kind: "sites", sites: "s.csv", events: "e.csv" }, modern: "m.csv" });
    expect(settings.indices[0]).toEqual({ name: "NAO", file: "n.csv", column: "nao_djfm", months: "Dec-Mar", phases: { kind: "terciles", labels: ["low", "middle", "high"] }, missing: [], units: null });
    expect(settings.outlook).toEqual({ season: 2027, values: { NAO: 0.4 }, issued: "2027-03-10" });
    expect(settings.calibration).toEqual({ first: 1700, last: 1990 });
    expect(settings.seed).toBe(12345);
  });

  it("names an unknown key with its line and a did-you-mean suggestion from the known keys", () => {
    const text = '{\n  "name": "X",\n  "fireRecord": { "activity": "a.csv" },\n  "fireYears": { "minSiteRecording": 2 },\n  "indices": { "ENSO": { "file": "i.csv", "phases": "terciles" } },\n  "sede": 4\n}';
    expect(() => parseRegionJson(text, "region.json")).toThrow(InputError);
    try {
      parseRegionJson(text, "region.json");
    } catch (error) {
      expect((error as InputError).problems).toEqual([
        { file: "region.json", line: 4, message: 'unknown key "minSiteRecording" in "fireYears" (did you mean "minSitesRecording"?)' },
        { file: "region.json", line: 6, message: 'unknown key "sede" (did you mean "seed"?)' },
      ]);
    }
  });

  it("lists the allowed keys when no known key is close", () => {
    expect(messages({ ...minimal, colour: "red" })).toEqual([
      'unknown key "colour" (allowed: name, description, preparedBy, contact, calibration, fireRecord, fireYears, indices, outlook, seed, methods)',
    ]);
  });

  it("reports wrong types and ranges with the value found", () => {
    expect(messages({ ...minimal, fireYears: { top: 1.5, measure: "area" }, methods: { seaDraws: 50, blockYears: 2.5 } })).toEqual([
      '"fireYears.top" must be less than 1 (found 1.5)',
      '"fireYears.measure" must be one of "fraction", "sites" (found "area")',
      '"methods.seaDraws" must be at least 1000 (found 50)',
      '"methods.blockYears" must be an integer (found 2.5)',
    ]);
  });

  it("requires name, fireRecord and indices", () => {
    expect(messages({})).toEqual(['"name" is required', '"fireRecord" is required', '"indices" is required']);
  });

  it("requires exactly one of cuts or terciles, labels.length = cuts.length + 1, ascending cuts", () => {
    expect(messages({ ...minimal, indices: { A: { file: "i.csv" } } })).toEqual(['"indices.A" give exactly one of "cuts" or "phases": "terciles"']);
    expect(messages({ ...minimal, indices: { A: { file: "i.csv", cuts: [0.5, -0.5], labels: ["a", "b", "c"] } } })).toEqual([
      '"indices.A.cuts[1]" cuts must be strictly ascending',
    ]);
    expect(messages({ ...minimal, indices: { A: { file: "i.csv", cuts: [0], labels: ["a", "b", "c"] } } })).toEqual([
      '"indices.A.labels" needs 2 labels for 1 cuts',
    ]);
    expect(messages({ ...minimal, indices: { A: { file: "i.csv", cuts: [0] } } })).toEqual(['"indices.A" "labels" is required with "cuts" (2 labels)']);
    expect(messages({ ...minimal, indices: { A: { file: "i.csv", phases: "terciles", labels: ["a", "b"] } } })).toEqual([
      '"indices.A.labels" terciles need exactly 3 labels',
    ]);
  });

  it("rejects an empty indices object, a bad month window, a bad issue date and an outlook value for an unknown index", () => {
    expect(messages({ ...minimal, indices: {} })).toEqual(['"indices" name at least one index']);
    expect(messages({ ...minimal, indices: { A: { file: "i.csv", phases: "terciles", months: "Winter" } } })).toEqual([
      '"indices.A.months" must be a month window such as "Dec-Mar" or "Jul" (found "Winter")',
    ]);
    expect(messages({ ...minimal, outlook: { issued: "2027-02-30" } })).toEqual(['"outlook.issued" must be a date YYYY-MM-DD (found "2027-02-30")']);
    expect(messages({ ...minimal, outlook: { values: { ENS0: 1 } } })).toEqual(['"outlook.values.ENS0" "ENS0" is not an index of this region (did you mean "ENSO"?)']);
  });

  it("rejects both fire-record forms at once, and events without sites", () => {
    expect(messages({ ...minimal, fireRecord: { activity: "a.csv", sites: "s.csv", events: "e.csv" } })).toEqual([
      '"fireRecord.activity" give either "sites" and "events", or "activity", not both',
    ]);
    expect(messages({ ...minimal, fireRecord: { events: "e.csv" } })).toEqual(['"fireRecord" "sites" is required with "events"']);
  });

  it("reports a calibration period whose first year is after its last", () => {
    expect(problems({ ...minimal, calibration: { first: 1990, last: 1700 } })).toEqual([
      { file: "region.json", line: 22, message: '"calibration.last" must not be before calibration.first (found 1700)' },
    ]);
  });

  it("reports JSON syntax errors, a repeated key, an empty file and a non-object", () => {
    expect(() => parseRegionJson("", "r")).toThrow("r: the file is empty");
    expect(() => parseRegionJson('{\n  "name": "X",\n  "name": "Y"\n}', "r")).toThrow(InputError);
    try {
      parseRegionJson('{\n  "name": "X",\n  "name": "Y"\n}', "r");
    } catch (error) {
      expect((error as InputError).problems).toContainEqual({ file: "r", line: 3, message: 'key "name" appears twice' });
    }
    expect(() => parseRegionJson("[1, 2]", "r")).toThrow("r:1: region.json must hold one JSON object (found [1,2])");
    expect(() => parseRegionJson('{\n"name": tru\n}', "r")).toThrow('r:2: invalid JSON: expected a value (found "t")');
  });
});

describe("locateJson(text)", () => {
  it("locateJson(text).lineOf(path) gives the line of a key, an array item, or the nearest parent", () => {
    const located = locateJson('{\n  "a": {\n    "b": [\n      1,\n      2\n    ]\n  }\n}');
    expect(located.lineOf(["a", "b"])).toBe(3);
    expect(located.lineOf(["a", "b", 1])).toBe(5);
    expect(located.lineOf(["a", "zzz"])).toBe(2);
    expect(located.lineOf([])).toBe(1);
  });
  it("throws JsonSyntaxError for deep nesting instead of overflowing the stack", () => {
    expect(() => locateJson("[".repeat(10_000))).toThrow("nested more than 64 levels");
  });
});

describe("parseRegionJson and locateJson on arbitrary text (fast-check)", () => {
  const jsonish = fc.oneof(
    fc.json(),
    fc.string({ unit: fc.constantFrom("{", "}", "[", "]", ",", ":", '"', "\\", "0", "1", "-", ".", "e", "t", "n", " ", "\n", "a") }),
    fc.json().chain((text) => fc.nat({ max: Math.max(0, text.length - 1) }).map((at) => text.slice(0, at) + text.slice(at + 1))),
  );
  it("locateJson(text) accepts exactly what JSON.parse accepts", () => {
    fc.assert(
      fc.property(jsonish, (text) => {
        let parses = true;
        try {
          JSON.parse(text);
        } catch {
          parses = false;
        }
        let located = true;
        try {
          locateJson(text);
        } catch {
          located = false;
        }
        expect(located).toBe(parses);
      }),
      { numRuns: 2000, seed: 5 },
    );
  });
  it("parseRegionJson(text) returns settings or throws InputError, never another exception", () => {
    fc.assert(
      fc.property(jsonish, (text) => {
        try {
          parseRegionJson(text, "region.json");
        } catch (error) {
          expect(error).toBeInstanceOf(InputError);
        }
      }),
      { numRuns: 1000, seed: 6 },
    );
  });
});

describe("didYouMean(unknown, known)", () => {
  it('editDistance("kitten", "sitting") = 3 (the classic example)', () => {
    expect(editDistance("kitten", "sitting")).toBe(3);
    expect(editDistance("", "abc")).toBe(3);
    expect(editDistance("same", "same")).toBe(0);
    expect(editDistance("sede", "seed")).toBe(1);
  });
  it("suggests close names only, and nothing for a one-letter name", () => {
    expect(didYouMean("seaDraw", ["seaDraws", "seaFirstLag"])).toBe("seaDraws");
    expect(didYouMean("INDEPENDENCEKM", ["independenceKm"])).toBe("independenceKm");
    expect(didYouMean("colour", ["name", "seed"])).toBeNull();
    expect(didYouMean("E", ["A", "B"])).toBeNull();
  });
});

describe("parseRegionJson(text, file) limits", () => {
  it("rejects calibration years beyond ±9999, lags beyond ±100 and more than a million random draws", () => {
    const text = JSON.stringify({
      name: "x",
      calibration: { first: -1e15, last: 1700 },
      fireRecord: { activity: "a.csv" },
      indices: { E: { file: "i.csv", cuts: [0], labels: ["lo", "hi"] } },
      methods: { seaDraws: 1e9, seaFirstLag: -300000000, blockMaxLag: 1e9 },
    });
    let problems: readonly { message: string }[] = [];
    try {
      parseRegionJson(text, "region.json");
    } catch (error) {
      problems = (error as InputError).problems;
    }
    expect(problems.map((p) => p.message)).toEqual([
      expect.stringMatching(/"calibration.first" must be at least -9999/),
      expect.stringMatching(/"methods.seaFirstLag" .*-100/),
      expect.stringMatching(/"methods.seaDraws" must be at most 1000000/),
      expect.stringMatching(/"methods.blockMaxLag" .*100/),
    ]);
  });
});

describe("parseRegionJson type words", () => {
  it("says 'an object' and 'a list (JSON array)' for wrong types, never 'a object' or 'a array'", () => {
    const problemsOf = (text: string): string[] => {
      try {
        parseRegionJson(text, "region.json");
        return [];
      } catch (error) {
        return (error as InputError).problems.map((problem: InputProblem) => problem.message);
      }
    };
    expect(problemsOf('{"name":"X","fireRecord":{"activity":"a.csv"},"indices":[]}')).toEqual(['"indices" must be an object (found [])']);
    expect(problemsOf('{"name":"X","fireRecord":{"activity":"a.csv"},"indices":{"A":{"file":"i.csv","cuts":3}}}')).toEqual(['"indices.A.cuts" must be a list (JSON array) (found 3)']);
    expect(problemsOf('{"name":"X","fireRecord":5,"indices":{}}').join(" ")).not.toMatch(/ a (object|array|record)\b/);
  });
});
