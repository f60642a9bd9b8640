import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import fc from "fast-check";
import { afterAll, describe, expect, it } from "vitest";
import { jsonText } from "../../src/cli/printJson.js";
import { terminalSafe } from "../../src/cli/terminalText.js";
import { runInProcess } from "./helpers.js";

/** Any character a terminal may act on: C0 except LF and TAB, DEL, C1, separators, bidi controls. */
const CONTROL = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/;

describe("terminalSafe(text)", () => {
  it("escapes ESC/OSC/CSI, CR, 8-bit CSI and a right-to-left override, and keeps LF, TAB and printable text", () => {
    expect(terminalSafe("Ridge\u001b]0;owned\u0007 \u001b[2K\r\u009b31m \u202eevil\n\tÉté 🔥")).toBe(
      "Ridge\\u{1b}]0;owned\\u{7} \\u{1b}[2K\\r\\u{9b}31m \\u{202e}evil\n\tÉté 🔥",
    );
  });

  it("leaves no control character in any string (fast-check, fixed seed)", () => {
    fc.assert(
      fc.property(fc.string({ unit: "binary", maxLength: 60 }), (text) => {
        expect(CONTROL.test(terminalSafe(text))).toBe(false);
      }),
      { seed: 20270310, numRuns: 500 },
    );
  });
});

describe("jsonText(value)", () => {
  it("writes C1 controls, DEL, separators and bidi controls as \\u escapes of the same JSON value", () => {
    const value = { name: "a\u009b\u007f\u2028\u202eb\u001b" };
    const text = jsonText(value);
    expect(CONTROL.test(text.replace(/\n/g, ""))).toBe(false);
    expect(JSON.parse(text)).toEqual(value);
  });
});

/** Temporary folders made by this file, removed after it. */
const made: string[] = [];
afterAll(() => {
  for (const folder of made) rmSync(folder, { recursive: true, force: true });
});

function regionWithText(fields: { name: string; description: string }): string {
  const parent = mkdtempSync(join(tmpdir(), "firephase-ctl-"));
  made.push(parent);
  const folder = join(parent, "region");
  cpSync(resolve("test/fixtures/regions/valid"), folder, { recursive: true });
  const settings = JSON.parse(readFileSync(join(folder, "region.json"), "utf8"));
  settings.name = fields.name;
  settings.description = fields.description;
  writeFileSync(join(folder, "region.json"), JSON.stringify(settings));
  return folder;
}

describe("control characters in region text never reach the terminal raw", () => {
  it("check and calibrate print an escaped region name and description (fast-check over control-laden text)", async () => {
    const printable = fc.string({ unit: "grapheme-ascii", minLength: 1, maxLength: 8 });
    const control = fc.constantFrom("\u001b]0;owned\u0007", "\u001b[2J", "\r", "\u009b1m", "\u202e", "\u0000", "\u2028");
    await fc.assert(
      fc.asyncProperty(fc.tuple(printable, control, printable), fc.tuple(control, printable), async ([a, c, b], [d, e]) => {
        const folder = regionWithText({ name: `${a}${c}${b}`, description: `${d}${e}` });
        for (const command of ["check", "calibrate"]) {
          const run = await runInProcess([command, folder]);
          expect(CONTROL.test(run.stdout)).toBe(false);
          expect(CONTROL.test(run.stderr)).toBe(false);
          if (run.code === 0 && command === "check") expect(run.stdout).toContain(terminalSafe(`${a}${c}${b}`));
        }
      }),
      { seed: 13_9, numRuns: 6 },
    );
  });

  it("an error message echoing a typed name escapes it", async () => {
    const run = await runInProcess(["outlook", resolve("test/fixtures/regions/valid"), "--values", "EN\u001b]0;x\u0007SO=1"]);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain('unknown index "EN\\u{1b}]0;x\\u{7}SO"');
    expect(CONTROL.test(run.stderr)).toBe(false);
  });
});
