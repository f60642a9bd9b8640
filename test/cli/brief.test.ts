import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync, existsSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { runCalibration } from "../../src/calibrate/runCalibration.js";
import { runBrief } from "../../src/cli/brief.js";
import { UsageError } from "../../src/cli/errors.js";
import { writeFilesAtomic } from "../../src/cli/writeFileAtomic.js";
import { buildOutlook } from "../../src/outlook/buildOutlook.js";
import { formatPercent } from "../../src/outlook/describeChance.js";
import { toOutlookJson } from "../../src/outlook/toOutlookJson.js";
import { InputError } from "../../src/workspace/InputError.js";
import { loadWorkspace } from "../../src/workspace/loadWorkspace.js";
import { flatText, pdfPageTexts } from "../briefing/pdfText.js";
import { SAMPLE_SAFETY_MARKDOWN } from "../briefing/sampleBriefingInputs.js";

const DEMO = resolve("demo-region");
let work: string;
let safetyPath: string;

beforeAll(() => {
  work = mkdtempSync(join(tmpdir(), "firephase-brief-test-"));
  safetyPath = join(work, "SAFETY.md");
  writeFileSync(safetyPath, SAMPLE_SAFETY_MARKDOWN);
});

afterAll(() => {
  rmSync(work, { recursive: true, force: true });
});

const context = () => ({ cwd: work, today: new Date(2027, 2, 10), env: { PATH: process.env.PATH }, safetyPath });

describe("runBrief(region, options, context)", () => {
  it("writes briefing-<folder>-<issue date>.pdf by default, with the JSON's headline probability on page 1", async () => {
    const out = join(work, "default");
    mkdirSync(out);
    const result = await runBrief(DEMO, { html: "brief.html" }, { ...context(), cwd: out });
    expect(result.pdfPath).toBe(join(out, "briefing-demo-region-2027-03-10.pdf"));
    expect(result.htmlPath).toBe(join(out, "brief.html"));
    expect(readdirSync(out).sort()).toEqual(["brief.html", "briefing-demo-region-2027-03-10.pdf"]);

    const workspace = await loadWorkspace(DEMO);
    const calibration = runCalibration(workspace);
    const json = toOutlookJson(buildOutlook(workspace, calibration, { values: workspace.settings.outlook.values, issued: "2027-03-10", season: 2027 })) as {
      fireYear: { estimate: number | null };
    };
    const pages = await pdfPageTexts(new Uint8Array(readFileSync(result.pdfPath)));
    const first = (pages[0] ?? "").replace(/\s+/g, " ");
    expect(first).toContain(workspace.settings.name);
    expect(first).toContain("Issued 10 March 2027");
    expect(first).toContain(`This season: ${formatPercent(json.fireYear.estimate)}`);
    expect(first).toContain("Official agency seasonal outlooks and daily fire-danger forecasts come first");
    expect(result.pages).toBe(pages.length);
    expect(flatText(pages)).toContain("Benjamini Y., Hochberg Y. (1995)");
    const html = readFileSync(result.htmlPath ?? "", "utf8");
    expect(html.startsWith("<!DOCTYPE html>")).toBe(true);
    expect(html).not.toMatch(/<script/i);
  });

  it("leaves no file at --out (and no temporary file) when the region is bad", async () => {
    const region = join(work, "bad-region");
    mkdirSync(region);
    writeFileSync(join(region, "region.json"), '{ "name": "Bad", "unknownKey": 1 }');
    const out = join(work, "bad-out");
    mkdirSync(out);
    await expect(runBrief(region, { out: join(out, "x.pdf") }, context())).rejects.toThrow(InputError);
    expect(readdirSync(out)).toEqual([]);
  });

  it("refuses --paper tabloid as a usage error before doing any work", async () => {
    const out = join(work, "paper-out");
    mkdirSync(out);
    await expect(runBrief(DEMO, { out: join(out, "x.pdf"), paper: "tabloid" }, context())).rejects.toThrow(UsageError);
    expect(readdirSync(out)).toEqual([]);
  });

  it("reports a --browser that does not exist as a usage error and writes nothing", async () => {
    const out = join(work, "browser-out");
    mkdirSync(out);
    await expect(runBrief(DEMO, { out: join(out, "x.pdf"), browser: join(work, "no-browser") }, context())).rejects.toThrow(/--browser/);
    expect(readdirSync(out)).toEqual([]);
  });
});

describe("writeFilesAtomic(files)", () => {
  it("writes every file or none, and leaves no temporary file after a failure", async () => {
    const folder = join(work, "atomic");
    mkdirSync(folder);
    await writeFilesAtomic([{ path: join(folder, "a.txt"), data: "A" }]);
    expect(readFileSync(join(folder, "a.txt"), "utf8")).toBe("A");
    await expect(
      writeFilesAtomic([
        { path: join(folder, "b.txt"), data: "B" },
        { path: join(folder, "missing-folder", "c.txt"), data: "C" },
      ]),
    ).rejects.toThrow(/ENOENT/);
    expect(readdirSync(folder)).toEqual(["a.txt"]);
    expect(existsSync(join(folder, "b.txt"))).toBe(false);
  });
});
