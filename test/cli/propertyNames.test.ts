import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import fc from "fast-check";
import { afterAll, describe, expect, it } from "vitest";
import { runInProcess } from "./helpers.js";

// Regression (issue 13.1): an index named after a built-in object property must be looked up as
// a plain name everywhere — never read as the inherited property (a function) or as a prototype.
const NAMES = Object.getOwnPropertyNames(Object.prototype);

/** Temporary folders made by this file, removed after it. */
const made: string[] = [];
afterAll(() => {
  for (const folder of made) rmSync(folder, { recursive: true, force: true });
});

/** The "valid" fixture with its ENSO index renamed (its column stays "ENSO"), no outlook block. */
function regionWithIndex(name: string, outlookValues?: Record<string, number>): string {
  const parent = mkdtempSync(join(tmpdir(), "firephase-names-"));
  made.push(parent);
  const folder = join(parent, "region");
  cpSync(resolve("test/fixtures/regions/valid"), folder, { recursive: true });
  const text = readFileSync(join(folder, "region.json"), "utf8");
  const settings = JSON.parse(text);
  const enso = { ...settings.indices.ENSO, column: "ENSO" };
  // Build the indices object as text so that "__proto__" stays an own key, as in a user's file.
  const indices = `{ ${JSON.stringify(name)}: ${JSON.stringify(enso)}, "NAO": ${JSON.stringify(settings.indices.NAO)} }`;
  delete settings.indices;
  const outlook = outlookValues === undefined ? "" : `, "outlook": { "season": 1712, "issued": "1712-03-01", "values": { ${Object.entries(outlookValues).map(([key, value]) => `${JSON.stringify(key)}: ${value}`).join(", ")} } }`;
  writeFileSync(join(folder, "region.json"), `${JSON.stringify(settings).slice(0, -1)}, "indices": ${indices}${outlook} }`);
  return folder;
}

describe("indices named after Object.prototype properties (fast-check over Object.getOwnPropertyNames(Object.prototype))", () => {
  it("check, calibrate and outlook --json treat each as a plain name; names like __proto__ are refused by name", async () => {
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...NAMES), async (name) => {
        const folder = regionWithIndex(name);
        const check = await runInProcess(["check", folder, "--json"]);
        if (!/^[A-Za-z]/.test(name)) {
          // __proto__, __defineGetter__ …: not an index name (it must start with a letter), refused by name.
          expect(check.code).toBe(1);
          expect(check.stderr).toContain(`indices.${name}`);
          expect(check.stdout).toBe("");
          return;
        }
        expect(check.code).toBe(0);
        expect(JSON.parse(check.stdout).indices.map((index: { name: string }) => index.name)).toEqual([name, "NAO"]);

        const calibrate = await runInProcess(["calibrate", folder, "--json"]);
        expect(calibrate.code).toBe(0);
        const calibration = JSON.parse(calibrate.stdout);
        expect(Object.hasOwn(calibration.indices, name)).toBe(true);
        expect(Array.isArray(calibration.indices[name].phases)).toBe(true);

        // No current value for the renamed index (the files end in 1712; the season is today's):
        // it must be left out, never given odds from an inherited property.
        const outlook = await runInProcess(["outlook", folder, "--json"]);
        expect(outlook.code).toBe(0);
        const json = JSON.parse(outlook.stdout);
        expect(json.missing).toContain(name);
        expect(Object.hasOwn(json.phases, name)).toBe(false);
        expect(json.current.map((entry: { index: string }) => entry.index)).not.toContain(name);

        // With a value on the command line it is used like any other.
        const given = await runInProcess(["outlook", folder, "--values", `${name}=1.1`, "--json"]);
        expect(given.code).toBe(0);
        const withValue = JSON.parse(given.stdout);
        expect(withValue.phases[name]).toBe("warm");
        expect(withValue.current.find((entry: { index: string }) => entry.index === name)).toMatchObject({ value: 1.1, source: "--values" });
      }),
      { seed: 131, numRuns: NAMES.length * 2, examples: NAMES.map((name) => [name]) },
    );
  }, 240_000);

  it("region.json outlook.values keyed by a property name is read as its own value; a __proto__ key is refused", async () => {
    const folder = regionWithIndex("constructor", { constructor: -0.9 });
    const outlook = await runInProcess(["outlook", folder, "--issued", "1712-03-01", "--json"]);
    expect(outlook.code).toBe(0);
    const json = JSON.parse(outlook.stdout);
    expect(json.phases.constructor).toBe("cold");
    expect(json.current.find((entry: { index: string }) => entry.index === "constructor")).toMatchObject({ value: -0.9, source: "region.json" });

    const proto = regionWithIndex("toString", { __proto__: 1 } as unknown as Record<string, number>);
    // The literal above has no own __proto__ key; write the key into the file by hand instead.
    const text = readFileSync(join(proto, "region.json"), "utf8").replace('"values": {  }', '"values": { "__proto__": 1 }');
    writeFileSync(join(proto, "region.json"), text);
    const refused = await runInProcess(["outlook", proto, "--json"]);
    expect(refused.code).toBe(1);
    expect(refused.stderr).toMatch(/__proto__/);
  });
});
