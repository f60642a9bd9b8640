import { cpSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { runInProcess } from "./helpers.js";

const REGION = resolve("test/fixtures/regions/review-small");

/** A region folder inside a new temporary folder, removed after this file. */
const made: string[] = [];
afterAll(() => {
  for (const folder of made) rmSync(folder, { recursive: true, force: true });
});
function tempRegion(): string {
  const parent = mkdtempSync(join(tmpdir(), "firephase-review-"));
  made.push(parent);
  return join(parent, "region");
}

describe("firephase review <region>", () => {
  it("--json prints firephase.review/1 with the promised keys, and the skipped files inside", async () => {
    const run = await runInProcess(["review", REGION, "--json"]);
    expect(run.code).toBe(0);
    expect(run.stderr).toBe("");
    const json = JSON.parse(run.stdout);
    expect(json.schema).toBe("firephase.review/1");
    expect(json.known).toBe(4);
    expect(json.brierScore).toBeCloseTo(0.173125, 12);
    expect(typeof json.brierSkillScore).toBe("number");
    expect(Object.keys(json.outlooks[0])).toEqual(expect.arrayContaining(["season", "issued", "probability", "outcome", "source"]));
    expect(json.outlooks.find((entry: { season: number }) => entry.season === 1713)).toMatchObject({ outcome: null, source: null });
    expect(json.warnings.filter((warning: { code: string }) => warning.code === "kept-file-skipped")).toHaveLength(2);
  });

  it("prints a planner's table and the scores in words, the skipped files as warnings on stderr", async () => {
    const run = await runInProcess(["review", REGION]);
    expect(run.code).toBe(0);
    expect(run.stdout).toMatch(/^How our past outlooks turned out — Review Bench\n/);
    expect(run.stdout).toMatch(/1704\s+1704-03-01\s+30%\s+high-fire year\s+modern record: area burned 900 ha ≥ modern threshold 900 ha\s+yes/);
    expect(run.stdout).toMatch(/1713\s+1713-03-01\s+25%\s+not known yet/);
    expect(run.stdout).toMatch(/Brier score 0\.173 over 4 seasons/);
    expect(run.stdout).toMatch(/Hit rate: 1 of 1 known high-fire year had odds above the average year's \(100%\)/);
    expect(run.stdout).toMatch(/only 4 seasons are known so far/);
    expect(run.stderr).toMatch(/^warning: .*broken\.json:3: not valid JSON/m);
  });

  it("says there is nothing to review in a region without kept outlooks", async () => {
    const folder = tempRegion();
    cpSync(resolve("test/fixtures/regions/valid"), folder, { recursive: true });
    const run = await runInProcess(["review", folder, "--json"]);
    expect(run.code).toBe(0);
    const json = JSON.parse(run.stdout);
    expect(json.outlooks).toEqual([]);
    expect(json.brierScore).toBeNull();
    expect(json.brierReason).toBe("no kept outlook's season is known yet");
    const text = await runInProcess(["review", folder]);
    expect(text.stdout).toMatch(/No kept outlooks yet/);
  });

  it("skips a named pipe among the kept files without blocking", async () => {
    const folder = tempRegion();
    cpSync(REGION, folder, { recursive: true });
    const { execFileSync } = await import("node:child_process");
    execFileSync("mkfifo", [join(folder, "issued", "pipe.json")]);
    writeFileSync(join(folder, "issued", "empty.json"), "");
    const run = await runInProcess(["review", folder, "--json"]);
    expect(run.code).toBe(0);
    const messages = JSON.parse(run.stdout).warnings.map((warning: { message: string }) => warning.message);
    expect(messages).toContainEqual(expect.stringMatching(/pipe\.json: not a regular file: skipped$/));
    expect(messages).toContainEqual(expect.stringMatching(/empty\.json:1: not valid JSON/));
  });
});

describe("briefingMemory(workspace, calibration, outlookText, keptTarget)", () => {
  it("gives the review of the earlier kept outlooks and what changed since the latest of the same season", async () => {
    const { loadWorkspace } = await import("../../src/workspace/loadWorkspace.js");
    const { runCalibration } = await import("../../src/calibrate/runCalibration.js");
    const { briefingMemory, keptOutlookPath } = await import("../../src/cli/brief.js");
    const workspace = await loadWorkspace(REGION);
    const calibration = runCalibration(workspace);
    const now = {
      schema: "firephase.outlook/1",
      issued: "1711-04-01",
      season: 1711,
      phases: { ENSO: "warm" },
      current: [{ index: "ENSO", value: 0.9 }],
      fireYear: { estimate: 0.35 },
    };
    const target = keptOutlookPath(REGION, 1711, "1711-04-01");
    const memory = await briefingMemory(workspace, calibration, `${JSON.stringify(now)}\n`, target);
    expect(memory.review?.known).toBe(4);
    expect(memory.sinceLast?.previous.issued).toBe("1711-03-01");
    expect(memory.sinceLast?.sentence).toBe("Since the outlook of 1711-03-01: ENSO moved from cold to warm; the chance of a high-fire year fell from 40% to 35%.");
    // The outlook being replaced with --force is not compared with itself.
    const same = await briefingMemory(workspace, calibration, `${JSON.stringify({ ...now, issued: "1711-03-01" })}\n`, keptOutlookPath(REGION, 1711, "1711-03-01"));
    expect(same.sinceLast?.previous.issued).toBe("1711-02-01");
    expect(same.review?.outlooks.map((entry) => entry.issued)).not.toContain("1711-03-01");
  });
});
