import { spawnSync } from "node:child_process";
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { dirname, join, resolve } from "node:path";
import { pathToFileURL } from "node:url";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BUILT_BIN, buildOnce, UNBUNDLED_BIN } from "./helpers.js";

// Which modules a command loads, seen by a module-resolution hook (node:module register) in the
// built CLI: start-up time is paid per module, so a command must not load what it does not use.
let work: string;
let hooks: string;

beforeAll(() => {
  buildOnce();
  work = mkdtempSync(join(tmpdir(), "firephase-cold-test-"));
  const hookFile = join(work, "hooks.mjs");
  writeFileSync(
    hookFile,
    `import { appendFileSync } from "node:fs";
export async function resolve(specifier, context, next) {
  const result = await next(specifier, context);
  appendFileSync(process.env.FIREPHASE_MODULE_LOG, result.url + "\\n");
  return result;
}
`,
  );
  hooks = join(work, "register.mjs");
  writeFileSync(hooks, `import { register } from "node:module";\nregister(${JSON.stringify(pathToFileURL(hookFile).href)});\n`);
}, 240_000);

afterAll(() => {
  rmSync(work, { recursive: true, force: true });
});

function modulesOf(args: readonly string[], name: string, bin = UNBUNDLED_BIN): string[] {
  const log = join(work, `${name}.log`);
  writeFileSync(log, "");
  const run = spawnSync(process.execPath, ["--import", pathToFileURL(hooks).href, bin, ...args], { encoding: "utf8", env: { ...process.env, FIREPHASE_MODULE_LOG: log } });
  expect(run.status, run.stderr).toBe(0);
  return [...new Set(readFileSync(log, "utf8").split("\n").filter((line) => line !== ""))];
}

const HEAVY = [/node_modules\/puppeteer-core\//, /node_modules\/@sparticuz\//, /node_modules\/handlebars\//, /node_modules\/d3-/, /node_modules\/@stdlib\//, /\/dist\/briefing\//, /\/dist\/stats\//, /\/dist\/hindcast\//, /\/dist\/calibrate\//];

describe("start-up loads only what a command needs", () => {
  it("firephase check loads no browser, chart, template or statistics module, and date-fns by function path only", () => {
    const loaded = modulesOf(["check", resolve("test/fixtures/regions/valid"), "--json"], "check");
    expect(loaded.some((url) => url.endsWith("/dist/cli/check.js"))).toBe(true);
    for (const pattern of HEAVY) expect(loaded.filter((url) => pattern.test(url)), String(pattern)).toEqual([]);
    expect(loaded.filter((url) => /node_modules\/date-fns\/index\.js$/.test(url))).toEqual([]);
    expect(loaded.filter((url) => /\/dist\/cli\/(brief|outlook|calibrate|review)\.js$/.test(url))).toEqual([]);
  });

  it("the bundle (dist/bin, what the package runs): check loads neither the chunk holding puppeteer-core nor the packed browser, and fewer than 25 files", () => {
    const loaded = modulesOf(["check", resolve("test/fixtures/regions/valid"), "--json"], "check-bundle", BUILT_BIN);
    expect(loaded.filter((url) => /node_modules\/(puppeteer-core|@sparticuz)\//.test(url))).toEqual([]);
    const files = loaded.filter((url) => url.startsWith("file:"));
    expect(files.length).toBeLessThan(25);
    // puppeteer-core is bundled into a chunk of its own; its code names its pinned browser revisions.
    const puppeteerChunks = readdirSync(dirname(BUILT_BIN)).filter((name) => readFileSync(join(dirname(BUILT_BIN), name), "utf8").includes("PUPPETEER_REVISIONS"));
    expect(puppeteerChunks.length).toBeGreaterThan(0);
    expect(files.filter((url) => puppeteerChunks.some((name) => url.endsWith(`/${name}`)))).toEqual([]);
  });

  it("firephase --version loads no command module and no region reader", () => {
    const loaded = modulesOf(["--version"], "version");
    expect(loaded.filter((url) => /\/dist\/cli\/(check|brief|outlook|calibrate|review)\.js$/.test(url))).toEqual([]);
    // InputError.js (no imports of its own) is the error class handleError needs; the reader itself is not loaded.
    expect(loaded.filter((url) => /\/dist\/workspace\/(?!InputError\.js$)|node_modules\/zod\//.test(url))).toEqual([]);
  });
});

describe("the hindcast beside the rest (a worker thread in the built CLI)", () => {
  it("outlook --json of the built CLI equals the one-thread outlook of the sources byte for byte (demo region)", async () => {
    const { runBuilt, runInProcess } = await import("./helpers.js");
    const args = ["outlook", resolve("demo-region"), "--issued", "2027-03-10", "--json"];
    const built = runBuilt(args);
    expect(built.code, built.stderr).toBe(0);
    const inProcess = await runInProcess(args);
    expect(inProcess.code, inProcess.stderr).toBe(0);
    expect(built.stdout).toBe(inProcess.stdout);
    expect(JSON.parse(built.stdout).hindcast.skillPValue).toBeGreaterThan(0);
  }, 120_000);
});
