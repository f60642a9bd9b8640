import { cpSync, mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { describe, expect, it } from "vitest";
import { runInProcess } from "./helpers.js";

const REGION = resolve("test/fixtures/regions/review-small");

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
    const folder = join(mkdtempSync(join(tmpdir(), "firephase-review-")), "region");
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
    const folder = join(mkdtempSync(join(tmpdir(), "firephase-review-")), "region");
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
