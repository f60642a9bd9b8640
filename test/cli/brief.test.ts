import { execFileSync } from "node:child_process";
import { cpSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, symlinkSync, writeFileSync, existsSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, relative, resolve } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { runCalibration } from "../../src/calibrate/runCalibration.js";
import { defaultBriefingName, keptOutlookPath, runBrief } from "../../src/cli/brief.js";
import { resolveOutlookRequest } from "../../src/cli/outlookRequest.js";
import { jsonText } from "../../src/cli/printJson.js";
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

let DEMO: string;
let demoKept: string[];
let work: string;
let safetyPath: string;

beforeAll(() => {
  work = mkdtempSync(join(tmpdir(), "firephase-brief-test-"));
  safetyPath = join(work, "SAFETY.md");
  writeFileSync(safetyPath, SAMPLE_SAFETY_MARKDOWN);
  // A copy of the demo region, named as the original: brief keeps its outlooks inside the region folder
  // (beside the demo's own kept outlooks of earlier seasons, which the briefing reviews).
  DEMO = join(work, "copies", "demo-region");
  cpSync(resolve("demo-region"), DEMO, { recursive: true });
  rmSync(join(DEMO, "issued", "2027-2027-03-10.json"), { force: true });
  demoKept = existsSync(join(DEMO, "issued")) ? readdirSync(join(DEMO, "issued")) : [];
});

afterAll(() => {
  rmSync(work, { recursive: true, force: true });
});

const context = () => ({ cwd: work, today: new Date(2027, 2, 10), env: { PATH: process.env.PATH }, safetyPath });

describe("runBrief(region, options, context)", () => {
  it("writes briefing-<folder>-<season>-<issue date>.pdf by default, keeps its outlook, and never replaces either without --force", async () => {
    const out = join(work, "default");
    mkdirSync(out);
    const result = await runBrief(DEMO, { html: "brief.html" }, { ...context(), cwd: out });
    expect(result.pdfPath).toBe(join(out, "briefing-demo-region-2027-2027-03-10.pdf"));
    expect(result.htmlPath).toBe(join(out, "brief.html"));
    expect(result.keptPath).toBe(join(DEMO, "issued", "2027-2027-03-10.json"));
    expect(readdirSync(out).sort()).toEqual(["brief.html", "briefing-demo-region-2027-2027-03-10.pdf"]);
    expect(readdirSync(join(DEMO, "issued")).sort()).toEqual([...demoKept, "2027-2027-03-10.json"].sort());

    const workspace = await loadWorkspace(DEMO);
    const calibration = runCalibration(workspace);
    const outlookJson = toOutlookJson(buildOutlook(workspace, calibration, resolveOutlookRequest(workspace, {}, context().today)));
    // The kept outlook is the firephase.outlook/1 object exactly as `outlook --json` prints it.
    const keptText = readFileSync(result.keptPath ?? "", "utf8");
    expect(keptText).toBe(jsonText(outlookJson));
    const json = outlookJson as { fireYear: { estimate: number | null } };
    const pages = await pdfPageTexts(new Uint8Array(readFileSync(result.pdfPath)));
    const first = (pages[0] ?? "").replace(/\s+/g, " ");
    expect(first).toContain(workspace.settings.name);
    expect(first).toContain("Issued 10 March 2027");
    expect(first).toContain(`This season: ${formatPercent(json.fireYear.estimate)}`);
    expect(first).toContain("not an official forecast");
    expect(flatText(pages).replace(/\s+/g, " ")).toContain("Official agency seasonal outlooks and daily fire-danger forecasts come first");
    expect(result.pages).toBe(pages.length);
    expect(flatText(pages)).toContain("Benjamini Y., Hochberg Y. (1995)");
    const html = readFileSync(result.htmlPath ?? "", "utf8");
    expect(html.startsWith("<!DOCTYPE html>")).toBe(true);
    expect(html).not.toMatch(/<script/i);

    // A second brief refuses the existing PDF, naming it and --force; nothing changes.
    const pdfBefore = readFileSync(result.pdfPath);
    await expect(runBrief(DEMO, {}, { ...context(), cwd: out })).rejects.toThrow(
      new UsageError(`cannot write ${join(out, "briefing-demo-region-2027-2027-03-10.pdf")}: it already exists; give --force to replace it`),
    );
    // Another PDF name still refuses to replace the kept outlook of the same season and date.
    await expect(runBrief(DEMO, { out: "other.pdf" }, { ...context(), cwd: out })).rejects.toThrow(
      /^the outlook of the 2027 season issued 2027-03-10 is already kept in .*issued\/2027-2027-03-10\.json; give --force to replace it, or --no-keep$/,
    );
    expect(readFileSync(result.pdfPath).equals(pdfBefore)).toBe(true);
    expect(readFileSync(result.keptPath ?? "", "utf8")).toBe(keptText);
    expect(readdirSync(out).sort()).toEqual(["brief.html", "briefing-demo-region-2027-2027-03-10.pdf"]);

    // --force replaces the PDF and the kept outlook (same inputs: the same kept text).
    const forced = await runBrief(DEMO, { force: true }, { ...context(), cwd: out });
    expect(forced.pdfPath).toBe(result.pdfPath);
    expect(readFileSync(forced.keptPath ?? "", "utf8")).toBe(keptText);
    expect(readdirSync(join(DEMO, "issued")).sort()).toEqual([...demoKept, "2027-2027-03-10.json"].sort());
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
    await expect(runBrief(DEMO, { out: join(out, "x.pdf"), browser: join(work, "no-browser"), keep: false }, context())).rejects.toThrow(/--browser/);
    expect(readdirSync(out)).toEqual([]);
  });
});

describe("runBrief(region, { out, html }, context): output safety", () => {
  it("--out x.pdf --html x.pdf is a usage error before any work, and writes nothing", async () => {
    const out = join(work, "same-out");
    mkdirSync(out);
    await expect(runBrief(DEMO, { out: "x.pdf", html: "./x.pdf" }, { ...context(), cwd: out })).rejects.toThrow(
      new UsageError('--html must name an .html or .htm file (found "./x.pdf")'),
    );
    expect(readdirSync(out)).toEqual([]);
  });

  it.each([
    ["brief.txt", '--out must name a .pdf file (found "brief.txt")'],
    ["indices.csv", '--out must name a .pdf file (found "indices.csv")'],
  ])("refuses --out %s (not a .pdf) before any work", async (name, message) => {
    await expect(runBrief(DEMO, { out: name }, { ...context(), cwd: work })).rejects.toThrow(new UsageError(message));
  });

  it.each([
    ["", "--out is empty: give a file name ending in .pdf"],
    ["sub/new/", "cannot write sub/new/: the name ends in a folder, not a file: add a file name"],
    ["/proc/x.pdf", "cannot write /proc/x.pdf: the folder /proc does not accept new files (a system folder such as /proc or /sys?)"],
  ])("gives an accurate message for --out %j", async (name, message) => {
    await expect(runBrief(DEMO, { out: name }, { ...context(), cwd: work })).rejects.toThrow(new UsageError(message));
  });

  it("refuses --out onto a named pipe or /dev/null, and leaves them as they were", async () => {
    const folder = join(work, "special");
    mkdirSync(folder);
    const fifo = join(folder, "pipe.pdf");
    execFileSync("mkfifo", [fifo]);
    const reason = "it is not a regular file (a device, named pipe or socket), which is never replaced: choose another name";
    await expect(runBrief(DEMO, { out: fifo }, context())).rejects.toThrow(new UsageError(`cannot write ${fifo}: ${reason}`));
    expect(statSync(fifo).isFIFO()).toBe(true);
    await expect(checkOutputTargets(["/dev/null"])).rejects.toThrow(`cannot write /dev/null: ${reason}`);
    await expect(writeFilesAtomic([{ path: fifo, data: "x" }])).rejects.toThrow(`cannot write ${fifo}: ${reason}`);
    expect(statSync(fifo).isFIFO()).toBe(true);
    expect(statSync("/dev/null").isCharacterDevice()).toBe(true);
    expect(readdirSync(folder)).toEqual(["pipe.pdf"]);
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
    const run = await runInProcess(["brief", DEMO, "--values", "ENSO=40", "--issued", "2027-03-11", "--out", pdf, "--no-keep"]);
    expect(run.code).toBe(0);
    expect(run.stdout).toBe(`${pdf}\n`);
    expect(run.stderr).toMatch(/^note: ENSO = 40 is \d+\.\d standard deviations from its calibration mean/m);
    expect(existsSync(pdf)).toBe(true);
    expect(existsSync(join(DEMO, "issued", "2027-2027-03-11.json"))).toBe(false);
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
  it("compares real paths: --html through a link to the region, or onto region.json via a link, is refused", async () => {
    const region = join(work, "linked-region");
    cpSync(resolve("test/fixtures/regions/valid"), region, { recursive: true });
    // An input file with an .html name, so that only the real-path guard stands between --html and it.
    const settings = JSON.parse(readFileSync(join(region, "region.json"), "utf8"));
    settings.indices.ENSO.file = "indices.html";
    writeFileSync(join(region, "region.json"), JSON.stringify(settings));
    cpSync(join(region, "indices.csv"), join(region, "indices.html"));
    const rlink = join(work, "rlink");
    symlinkSync(region, rlink);
    const jsonLink = join(work, "settings-link.html");
    symlinkSync(join(region, "region.json"), jsonLink);
    const before = readFileSync(join(region, "indices.html"));
    const regionBefore = readFileSync(join(region, "region.json"));
    const options = { out: join(work, "linked.pdf"), force: true };
    await expect(runBrief(region, { ...options, html: join(rlink, "indices.html") }, context())).rejects.toThrow(
      new UsageError(`cannot write ${join(rlink, "indices.html")}: it is the region's input file indices.html`),
    );
    await expect(runBrief(region, { ...options, html: jsonLink }, context())).rejects.toThrow(
      new UsageError(`cannot write ${jsonLink}: it is the region's input file region.json`),
    );
    expect(readFileSync(join(region, "indices.html")).equals(before)).toBe(true);
    expect(readFileSync(join(region, "region.json")).equals(regionBefore)).toBe(true);
    expect(existsSync(join(work, "linked.pdf"))).toBe(false);
  });

  it("refuses --out rlink/indices.csv (rlink → region) by its name, leaving the input as it was", async () => {
    const region = join(work, "linked-region-csv");
    cpSync(resolve("test/fixtures/regions/valid"), region, { recursive: true });
    const rlink = join(work, "rlink-csv");
    symlinkSync(region, rlink);
    const before = readFileSync(join(region, "indices.csv"));
    const run = await runInProcess(["brief", region, "--out", join(rlink, "indices.csv")]);
    expect(run.code).toBe(2);
    expect(readFileSync(join(region, "indices.csv")).equals(before)).toBe(true);
  });

  it("refuses to overwrite an input file of the region and leaves it as it was", async () => {
    const region = join(work, "own-region");
    cpSync(DEMO, region, { recursive: true });
    const before = readFileSync(join(region, "fire-events.csv"));
    await expect(runBrief(region, { out: join(region, "fire-events.csv") }, context())).rejects.toThrow(/--out must name a \.pdf file/);
    expect(readFileSync(join(region, "fire-events.csv")).equals(before)).toBe(true);
  });
});

describe("defaultBriefingName(region, season, issued) and keptOutlookPath(region, season, issued)", () => {
  it("keep the season and the issue date in both names", () => {
    expect(defaultBriefingName("demo-region", 2027, "2027-03-10")).toBe("briefing-demo-region-2027-2027-03-10.pdf");
    expect(keptOutlookPath("demo-region", 2028, "2027-10-02")).toBe(join("demo-region", "issued", "2028-2027-10-02.json"));
  });
});

describe("writeFilesAtomic(files, { replace: false })", () => {
  it("puts a new file in place but never replaces an existing one", async () => {
    const folder = join(work, "no-clobber");
    mkdirSync(folder);
    await writeFilesAtomic([{ path: join(folder, "a.json"), data: "first" }], { replace: false });
    await expect(writeFilesAtomic([{ path: join(folder, "a.json"), data: "second" }], { replace: false, hint: "give --force to replace it" })).rejects.toThrow(
      new OutputPathError(join(folder, "a.json"), "it already exists; give --force to replace it"),
    );
    expect(readFileSync(join(folder, "a.json"), "utf8")).toBe("first");
    expect(readdirSync(folder)).toEqual(["a.json"]);
  });
});
