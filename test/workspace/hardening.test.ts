import { execFileSync } from "node:child_process";
import { cpSync, mkdirSync, mkdtempSync, readFileSync, rmSync, truncateSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import fc from "fast-check";
import { afterAll, describe, expect, it } from "vitest";
import { runCalibration } from "../../src/calibrate/runCalibration.js";
import { currentSeasonValue } from "../../src/climate/currentSeasonValue.js";
import { DEFAULT_METHODS } from "../../src/workspace/defaults.js";
import { InputError, type InputProblem } from "../../src/workspace/InputError.js";
import { echoText, MAX_DATA_FILE_BYTES, TEXT_LIMITS } from "../../src/workspace/limits.js";
import { loadWorkspace } from "../../src/workspace/loadWorkspace.js";
import { parseRegionJson } from "../../src/workspace/regionJson.js";

const layoutLong = path.resolve("test/fixtures/regions/layout-long");
const baseRegion = JSON.parse(readFileSync(path.join(layoutLong, "region.json"), "utf8")) as Record<string, unknown>;
const folders: string[] = [];
afterAll(() => {
  for (const folder of folders) rmSync(folder, { recursive: true, force: true });
});

/** A copy of the invented layout-long region with another region.json. */
function regionWith(edit: (region: Record<string, unknown>) => unknown, text?: string): string {
  const folder = mkdtempSync(path.join(tmpdir(), "firephase-hardening-"));
  folders.push(folder);
  cpSync(layoutLong, folder, { recursive: true });
  writeFileSync(path.join(folder, "region.json"), text ?? JSON.stringify(edit(structuredClone(baseRegion)), null, 2));
  return folder;
}

async function problemsOf(folder: string): Promise<readonly InputProblem[]> {
  const error = await loadWorkspace(folder).catch((e: unknown) => e);
  if (!(error instanceof InputError)) throw new Error(`loaded without problems: ${String(error)}`);
  return error.problems;
}

const minimal = { name: "X", fireRecord: { activity: "a.csv" }, indices: { ENSO: { file: "i.csv", phases: "terciles" } } };
function messages(text: string): string[] {
  try {
    parseRegionJson(text, "region.json");
  } catch (error) {
    if (error instanceof InputError) return error.problems.map((p) => p.message);
    throw error;
  }
  return [];
}

describe("index names that are built-in property names", () => {
  const names = Object.getOwnPropertyNames(Object.prototype).filter((name) => /^[A-Za-z][A-Za-z0-9_.-]*$/.test(name));

  it("every name of Object.prototype (constructor, toString, hasOwnProperty, …) loads and calibrates as a normal index (fast-check)", async () => {
    expect(names).toEqual(expect.arrayContaining(["constructor", "toString", "hasOwnProperty", "valueOf"]));
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...names), async (name) => {
        const folder = regionWith((region) => {
          const indices = region["indices"] as Record<string, Record<string, unknown>>;
          indices[name] = { ...indices["ENSO"], column: "ENSO" };
          delete indices["ENSO"];
          return region;
        });
        const workspace = await loadWorkspace(folder);
        expect(workspace.settings.indices.map((index) => index.name)).toContain(name);
        expect(Object.hasOwn(workspace.settings.outlook.values, name)).toBe(false);
        expect(workspace.settings.outlook.values[name]).toBeUndefined();
        const series = workspace.indices.find((s) => s.name === name);
        expect(series?.years.length).toBe(61);
        const settings = workspace.settings.indices.find((index) => index.name === name);
        if (settings === undefined || series === undefined) throw new Error("index lost");
        expect(currentSeasonValue(series, settings, 1959, "1960-01-01").value).toBe(series.values[series.years.indexOf(1959)]);
        const calibration = runCalibration(workspace);
        expect(calibration.indices.map((index) => index.name)).toContain(name);
      }),
      { numRuns: 12, seed: 1313 },
    );
  });

  it("a name of Object.prototype in outlook.values is kept as an own value, or refused when it is not an index", () => {
    const { settings } = parseRegionJson(JSON.stringify({ ...minimal, indices: { constructor: { file: "i.csv", phases: "terciles" } }, outlook: { values: { constructor: 0.5 } } }), "r");
    expect(settings.outlook.values["constructor"]).toBe(0.5);
    expect(messages(JSON.stringify({ ...minimal, outlook: { values: { toString: 1 } } }))).toEqual(['"outlook.values.toString" "toString" is not an index of this region (indices: ENSO)']);
    const empty = parseRegionJson(JSON.stringify(minimal), "r").settings.outlook.values;
    for (const name of names) expect(empty[name]).toBeUndefined();
  });

  it('"__proto__" as a key of indices, outlook.values, methods or the top level is refused with its line (JSON.parse keeps it as an own key)', () => {
    expect(Object.hasOwn(JSON.parse('{"__proto__": 1}'), "__proto__")).toBe(true);
    const index = '{\n"name": "X",\n"fireRecord": {"activity": "a.csv"},\n"indices": {\n"ENSO": {"file": "i.csv", "phases": "terciles"},\n"__proto__": {"file": "i.csv", "phases": "terciles"}\n}\n}';
    expect(() => parseRegionJson(index, "region.json")).toThrow(InputError);
    try {
      parseRegionJson(index, "region.json");
    } catch (error) {
      expect((error as InputError).problems[0]).toMatchObject({ line: 6, message: expect.stringContaining('"__proto__" cannot be an index name') });
    }
    expect(messages(JSON.stringify(minimal).replace('"indices"', '"outlook": {"values": {"__proto__": 1}}, "indices"'))).toEqual([
      '"outlook.values.__proto__" "__proto__" is not an index of this region',
    ]);
    expect(messages(JSON.stringify(minimal).replace('"indices"', '"methods": {"__proto__": {"seaDraws": 5}}, "indices"'))[0]).toMatch(/^unknown key "__proto__" in "methods"/);
    expect(messages(JSON.stringify(minimal).replace('"indices"', '"__proto__": {}, "indices"'))[0]).toMatch(/^unknown key "__proto__"/);
  });
});

describe("data files must be regular files of a bounded size", () => {
  const withIndexFile = (file: string) =>
    regionWith((region) => {
      (region["indices"] as Record<string, Record<string, unknown>>)["ENSO"]!["file"] = file;
      return region;
    });

  it('"file": "/dev/zero" is refused at once as a device, never read', async () => {
    const problems = await problemsOf(withIndexFile("/dev/zero"));
    expect(problems).toEqual([{ file: expect.stringMatching(/dev\/zero$/), line: null, message: "this is a device, not a regular file (data files must be regular files)" }]);
  });

  it("a named pipe is refused without opening it (no hang)", async () => {
    const folder = withIndexFile("pipe.csv");
    execFileSync("mkfifo", [path.join(folder, "pipe.csv")]);
    expect((await problemsOf(folder))[0]?.message).toBe("this is a named pipe, not a regular file (data files must be regular files)");
  });

  it("a folder is refused", async () => {
    const folder = withIndexFile("sub");
    mkdirSync(path.join(folder, "sub"));
    expect((await problemsOf(folder))[0]?.message).toBe("this is a folder, not a file");
  });

  it(`a file over ${MAX_DATA_FILE_BYTES / 1024 / 1024} MiB is refused with its size (a sparse file: nothing is read)`, async () => {
    const folder = withIndexFile("huge.csv");
    writeFileSync(path.join(folder, "huge.csv"), "year,ENSO\n");
    truncateSync(path.join(folder, "huge.csv"), MAX_DATA_FILE_BYTES + 1);
    expect((await problemsOf(folder))[0]?.message).toBe("the file is too large: 33,554,433 bytes; at most 32 MiB (33,554,432 bytes) is read");
    writeFileSync(path.join(folder, "huge.csv"), "year,ENSO\n");
    truncateSync(path.join(folder, "huge.csv"), 200 * 1024 * 1024);
    expect((await problemsOf(folder))[0]?.message).toBe("the file is too large: 209,715,200 bytes; at most 32 MiB (33,554,432 bytes) is read");
  });

  it("a region.json over 1 MiB is refused", async () => {
    const folder = regionWith(() => null, "{}");
    truncateSync(path.join(folder, "region.json"), 2 * 1024 * 1024);
    expect((await problemsOf(folder))[0]?.message).toBe("the file is too large: 2,097,152 bytes; at most 1 MiB (1,048,576 bytes) is read");
  });

  it("a problem echoes only a short excerpt of a bad line, with control characters escaped", async () => {
    const folder = regionWith((region) => region);
    const bad = `1900,\u001b]0;title\u0007${"9".repeat(5000)}\n`;
    writeFileSync(path.join(folder, "enso.csv"), `year,ENSO\n${bad}`);
    const message = (await problemsOf(folder))[0]?.message ?? "";
    expect(message.length).toBeLessThan(120);
    expect(message).not.toMatch(/[\u0000-\u001f\u007f-\u009f]/);
    expect(message).toContain("\\u{1b}]0;title\\u{7}");
    expect(echoText("a\u2028b\u009bc\r\n")).toBe("a\\u{2028}b\\u{9b}c\\r\\n");
  });
});

describe("free text is bounded at load", () => {
  const cases: [string, (region: Record<string, unknown>) => void, number, string][] = [
    ["name", (r) => (r["name"] = "n".repeat(TEXT_LIMITS.name + 1)), TEXT_LIMITS.name, '"name" is too long'],
    ["description", (r) => (r["description"] = "d".repeat(TEXT_LIMITS.description + 1)), TEXT_LIMITS.description, '"description" is too long'],
    ["preparedBy", (r) => (r["preparedBy"] = "p".repeat(TEXT_LIMITS.preparedBy + 1)), TEXT_LIMITS.preparedBy, '"preparedBy" is too long'],
    ["contact", (r) => (r["contact"] = "c".repeat(TEXT_LIMITS.contact + 1)), TEXT_LIMITS.contact, '"contact" is too long'],
    ["units", (r) => ((r["indices"] as Record<string, Record<string, unknown>>)["ENSO"]!["units"] = "u".repeat(TEXT_LIMITS.units + 1)), TEXT_LIMITS.units, '"indices.ENSO.units" is too long'],
    ["label", (r) => ((r["indices"] as Record<string, Record<string, unknown>>)["ENSO"]!["labels"] = ["cold", "l".repeat(TEXT_LIMITS.label + 1), "warm"]), TEXT_LIMITS.label, '"indices.ENSO.labels[1]" is too long'],
  ];
  for (const [field, edit, limit, start] of cases) {
    it(`${field}: at most ${limit} characters`, async () => {
      const problems = await problemsOf(regionWith((region) => (edit(region), region)));
      expect(problems.map((p) => p.message)).toEqual([`${start}: at most ${limit} characters (found ${limit + 1} characters)`]);
    });
  }

  it(`an index name of more than ${TEXT_LIMITS.indexName} characters, and a 100,000-character name, are refused without echoing them`, () => {
    const long = `I${"x".repeat(TEXT_LIMITS.indexName)}`;
    const [message] = messages(JSON.stringify({ ...minimal, indices: { [long]: { file: "i.csv", phases: "terciles" } } }));
    expect(message).toContain(`an index name has at most ${TEXT_LIMITS.indexName} characters (this one has ${TEXT_LIMITS.indexName + 1})`);
    const huge = messages(JSON.stringify({ ...minimal, name: "n".repeat(100_000) }));
    expect(huge).toEqual([`"name" is too long: at most ${TEXT_LIMITS.name} characters (found 100000 characters)`]);
  });

  it("a site id or name beyond its limit is a problem on its line", async () => {
    const folder = mkdtempSync(path.join(tmpdir(), "firephase-sites-"));
    folders.push(folder);
    cpSync("test/fixtures/regions/valid", folder, { recursive: true });
    const sites = readFileSync(path.join(folder, "fire-sites.csv"), "utf8").replace("Lower Flat", "L".repeat(TEXT_LIMITS.siteName + 1));
    writeFileSync(path.join(folder, "fire-sites.csv"), sites);
    expect((await problemsOf(folder))[0]).toMatchObject({ line: 5, message: `name is too long: at most ${TEXT_LIMITS.siteName} characters (found ${TEXT_LIMITS.siteName + 1})` });
  });
});

describe("region.json numbers and new settings", () => {
  it('"seed": 1e400 says it is out of range, not "(found null)"', () => {
    expect(messages(JSON.stringify(minimal).replace('"indices"', '"seed": 1e400, "indices"'))).toEqual([
      '"seed" is out of range: not a finite number (JSON numbers beyond about 1.8e308 cannot be used) (found 1e400)',
    ]);
  });

  it("a valid 500-digit JSON number is read as JSON and reported as out of range where it is used", () => {
    const digits = `1${"0".repeat(499)}`;
    const found = messages(JSON.stringify(minimal).replace('"indices"', `"seed": ${digits}, "indices"`));
    expect(found).toHaveLength(1);
    expect(found[0]).toMatch(/^"seed" is out of range: not a finite number/);
    expect(found[0]).not.toContain("invalid JSON");
    expect(found[0]?.length).toBeLessThan(200);
    const precise = messages(JSON.stringify(minimal).replace('"indices"', `"methods": {"jointMaxQ": 0.${"0".repeat(498)}5}, "indices"`));
    expect(precise).toEqual(['"methods.jointMaxQ" must be greater than 0 (found 0)']);
  });

  it("fills the new method defaults and checks their bounds", () => {
    const { settings } = parseRegionJson(JSON.stringify(minimal), "r");
    expect(settings.methods).toMatchObject({ response: "phase", nearBoundarySd: 0.1, modernMeasure: "area", permutations: 999, bootstrapResamples: 999 });
    expect(settings.preparedBy).toBeNull();
    expect(settings.contact).toBeNull();
    expect(settings.indices[0]).toMatchObject({ missing: [], units: null });
    const custom = parseRegionJson(
      JSON.stringify({
        ...minimal,
        preparedBy: "Invented Planner",
        contact: "planner@example.org",
        indices: { ENSO: { file: "i.csv", phases: "terciles", missing: [-99.99, -999], units: "°C anomaly" } },
        methods: { response: "curve", nearBoundarySd: 0.25, modernMeasure: "fires", permutations: 199, bootstrapResamples: 100_000 },
      }),
      "r",
    ).settings;
    expect(custom.methods).toEqual({ ...DEFAULT_METHODS, response: "curve", nearBoundarySd: 0.25, modernMeasure: "fires", permutations: 199, bootstrapResamples: 100_000 });
    expect(custom.indices[0]).toMatchObject({ missing: [-99.99, -999], units: "°C anomaly" });
    expect(custom).toMatchObject({ preparedBy: "Invented Planner", contact: "planner@example.org" });
    expect(messages(JSON.stringify({ ...minimal, methods: { permutations: 198 } }))).toEqual(['"methods.permutations" must be at least 199 (found 198)']);
    expect(messages(JSON.stringify({ ...minimal, methods: { bootstrapResamples: 100_001 } }))).toEqual(['"methods.bootstrapResamples" must be at most 100000 (found 100001)']);
    expect(messages(JSON.stringify({ ...minimal, methods: { response: "line" } }))).toEqual(['"methods.response" must be one of "phase", "curve" (found "line")']);
  });

  it("the old methods.nearBoundaryMargin is an unknown key that points to nearBoundarySd", () => {
    expect(messages(JSON.stringify({ ...minimal, methods: { nearBoundaryMargin: 0.1 } }))).toEqual([
      `unknown key "nearBoundaryMargin" in "methods" (did you mean "nearBoundarySd"? it is now a share of the index's standard deviation, e.g. 0.1)`,
    ]);
  });
});

describe("region.json with a Unicode minus sign", () => {
  it("says to write the minus sign as '-'", () => {
    expect(messages(JSON.stringify(minimal).replace('"indices"', '"seed": \u22125, "indices"'))).toEqual([
      'invalid JSON: expected a value: write a minus sign as "-", not the Unicode minus sign U+2212 (found "−")',
    ]);
  });
});
