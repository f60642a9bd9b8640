import { cpSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync, existsSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, relative, resolve } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { runCalibration } from "../../src/calibrate/runCalibration.js";
import { runBrief } from "../../src/cli/brief.js";
import { UsageError } from "../../src/cli/errors.js";
import { checkOutputTargets, OutputPathError, writeFilesAtomic } from "../../src/cli/writeFileAtomic.js";
import { buildOutlook } from "../../src/outlook/buildOutlook.js";
import { formatPercent } from "../../src/outlook/describeChance.js";
import { toOutlookJson } from "../../src/outlook/toOutlookJson.js";
import { InputError } from "../../src/workspace/InputError.js";
import { loadWorkspace } from "../../src/workspace/loadWorkspace.js";
import { flatText, pdfPageTexts } from "../briefing/pdfText.js";
import { runInProcess } from "./helpers.js";
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

describe("runBrief(region, { out, html }, context): output safety", () => {
  it("--out x.pdf --html x.pdf is a usage error before any work, and writes nothing", async () => {
    const out = join(work, "same-out");
    mkdirSync(out);
    await expect(runBrief(DEMO, { out: "x.pdf", html: "./x.pdf" }, { ...context(), cwd: out })).rejects.toThrow(
      /--out and --html name the same file/,
    );
    expect(readdirSync(out)).toEqual([]);
  });

  it("--out in a missing folder is 'cannot write <path>: the folder … does not exist' (no temporary name)", async () => {
    const out = join(work, "missing-out");
    mkdirSync(out);
    const error: unknown = await runBrief(DEMO, { out: join(out, "nope", "x.pdf") }, context()).catch((caught: unknown) => caught);
    expect(error).toBeInstanceOf(UsageError);
    expect((error as Error).message).toBe(`cannot write ${join(out, "nope", "x.pdf")}: the folder ${join(out, "nope")} does not exist`);
    expect((error as Error).message).not.toMatch(/\.tmp|internal/);
    expect(readdirSync(out)).toEqual([]);
  });

  it("--html naming an existing folder is 'cannot write <path>: it is a folder', and no PDF is left", async () => {
    const out = join(work, "folder-out");
    mkdirSync(join(out, "page.html"), { recursive: true });
    await expect(runBrief(DEMO, { out: join(out, "x.pdf"), html: join(out, "page.html") }, context())).rejects.toThrow(
      new UsageError(`cannot write ${join(out, "page.html")}: it is a folder`),
    );
    expect(readdirSync(out)).toEqual(["page.html"]);
  });

  it("names region files as typed (relative) in input errors when run in the process's folder", async () => {
    const region = join(work, "relative-region");
    mkdirSync(region);
    writeFileSync(join(region, "region.json"), '{ "name": "Bad", "unknownKey": 1 }');
    const typed = relative(process.cwd(), region);
    const error: unknown = await runBrief(typed, { out: join(work, "relative.pdf") }, { ...context(), cwd: process.cwd() }).catch((caught: unknown) => caught);
    expect(error).toBeInstanceOf(InputError);
    const files = (error as InputError).problems.map((problem) => problem.file);
    expect(files).toContain(join(typed, "region.json"));
    expect(files.every((file) => !file.startsWith("/"))).toBe(true);
  });
});

describe("firephase brief (in process)", () => {
  it("prints the PDF path on stdout and each outlook warning as 'note: …' on stderr", async () => {
    const out = join(work, "notes-out");
    mkdirSync(out);
    const pdf = join(out, "notes.pdf");
    const run = await runInProcess(["brief", DEMO, "--values", "ENSO=40", "--out", pdf]);
    expect(run.code).toBe(0);
    expect(run.stdout).toBe(`${pdf}\n`);
    expect(run.stderr).toMatch(/^note: ENSO = 40 is \d+\.\d standard deviations from its calibration mean/m);
    expect(existsSync(pdf)).toBe(true);
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
    ).rejects.toThrow(new OutputPathError(join(folder, "missing-folder", "c.txt"), `the folder ${join(folder, "missing-folder")} does not exist`));
    expect(readdirSync(folder)).toEqual(["a.txt"]);
    expect(existsSync(join(folder, "b.txt"))).toBe(false);
  });

  it("removes the first file again when renaming the second fails (the second target is a folder)", async () => {
    const folder = join(work, "atomic-rename");
    mkdirSync(join(folder, "b.html", "inside"), { recursive: true });
    const error: unknown = await writeFilesAtomic([
      { path: join(folder, "a.pdf"), data: "new PDF" },
      { path: join(folder, "b.html"), data: "HTML" },
    ]).catch((caught: unknown) => caught);
    expect(error).toBeInstanceOf(OutputPathError);
    expect((error as OutputPathError).path).toBe(join(folder, "b.html"));
    expect((error as Error).message).not.toMatch(/\.tmp/);
    expect(readdirSync(folder)).toEqual(["b.html"]);
  });

  it("restores the old first file when renaming the second fails", async () => {
    const folder = join(work, "atomic-restore");
    mkdirSync(join(folder, "b.html", "inside"), { recursive: true });
    writeFileSync(join(folder, "a.pdf"), "old PDF");
    await expect(
      writeFilesAtomic([
        { path: join(folder, "a.pdf"), data: "new PDF" },
        { path: join(folder, "b.html"), data: "HTML" },
      ]),
    ).rejects.toThrow(OutputPathError);
    expect(readFileSync(join(folder, "a.pdf"), "utf8")).toBe("old PDF");
    expect(readdirSync(folder).sort()).toEqual(["a.pdf", "b.html"]);
  });

  it("replaces an existing file and leaves no side file on success", async () => {
    const folder = join(work, "atomic-replace");
    mkdirSync(folder);
    writeFileSync(join(folder, "a.pdf"), "old");
    await writeFilesAtomic([{ path: join(folder, "a.pdf"), data: "new" }]);
    expect(readFileSync(join(folder, "a.pdf"), "utf8")).toBe("new");
    expect(readdirSync(folder)).toEqual(["a.pdf"]);
  });
});

describe("checkOutputTargets(paths)", () => {
  it("refuses a path named twice, a missing folder, a folder as target and a file used as folder", async () => {
    const folder = join(work, "targets");
    mkdirSync(join(folder, "sub"), { recursive: true });
    writeFileSync(join(folder, "plain.txt"), "x");
    await expect(checkOutputTargets([join(folder, "a.pdf"), join(folder, "b.html")])).resolves.toBeUndefined();
    await expect(checkOutputTargets([join(folder, "a.pdf"), join(folder, "sub", "..", "a.pdf")])).rejects.toThrow(/it is named twice/);
    await expect(checkOutputTargets([join(folder, "a.pdf"), join(folder, "a.pdf")])).rejects.toThrow(/it is named twice$/);
    await expect(checkOutputTargets(["a.pdf", join(process.cwd(), "a.pdf")])).rejects.toThrow(/it is named twice \(also as a\.pdf\)/);
    await expect(checkOutputTargets([join(folder, "no", "a.pdf")])).rejects.toThrow(`the folder ${join(folder, "no")} does not exist`);
    await expect(checkOutputTargets([join(folder, "sub")])).rejects.toThrow(`cannot write ${join(folder, "sub")}: it is a folder`);
    await expect(checkOutputTargets([join(folder, "plain.txt", "a.pdf")])).rejects.toThrow(`${join(folder, "plain.txt")} is not a folder`);
  });
});

describe("runBrief(region, { out }) on the region's own files", () => {
  it("refuses to overwrite an input file of the region and leaves it as it was", async () => {
    const region = join(work, "own-region");
    cpSync(DEMO, region, { recursive: true });
    const before = readFileSync(join(region, "fire-events.csv"));
    await expect(runBrief(region, { out: join(region, "fire-events.csv") }, context())).rejects.toThrow(
      /cannot write .*fire-events\.csv: it is the region's input file fire-events\.csv/,
    );
    expect(readFileSync(join(region, "fire-events.csv")).equals(before)).toBe(true);
  });
});
