import { spawn, spawnSync } from "node:child_process";
import { cpSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { findBrowser } from "../../src/briefing/findBrowser.js";
import { BUILT_BIN, buildOnce } from "./helpers.js";

// Fault test: `firephase brief` is started as a child process and interrupted at seeded moments
// (SIGINT, SIGTERM and SIGHUP in turn). Each child gets its own temp folder (TMPDIR), so every
// browser it starts has `--user-data-dir=<that folder>/firephase-browser-…` on its command line:
// after the child has exited, no process may still carry that folder, and the folder may hold no
// profile folder.

let work: string;
let region: string;
let browserPath: string;
let fullRunMs = 0;

const SIGNALS = ["SIGINT", "SIGTERM", "SIGHUP"] as const;
const EXIT_CODES = { SIGINT: 130, SIGTERM: 143, SIGHUP: 129 } as const;

/** Park–Miller minimal standard generator (Park & Miller 1988, CACM 31(10)): seeded, so the moments repeat. */
function seededFractions(seed: number, count: number): number[] {
  let state = seed;
  const out: number[] = [];
  for (let i = 0; i < count; i++) {
    state = (state * 16807) % 2147483647;
    out.push(state / 2147483647);
  }
  return out;
}

/** Process ids whose command line names a profile folder inside `folder`. */
function browsersUsing(folder: string): number[] {
  const found: number[] = [];
  for (const name of readdirSync("/proc")) {
    if (!/^\d+$/.test(name)) continue;
    try {
      if (readFileSync(`/proc/${name}/cmdline`, "latin1").split("\0").some((arg) => arg.startsWith(`--user-data-dir=${folder}`))) found.push(Number(name));
    } catch {
      /* gone meanwhile */
    }
  }
  return found;
}

async function settled(folder: string): Promise<{ readonly processes: number[]; readonly profiles: string[] }> {
  // Killed processes take a moment to vanish from /proc: look again for up to 3 s.
  let processes = browsersUsing(folder);
  for (let waited = 0; processes.length > 0 && waited < 3000; waited += 100) {
    await new Promise((done) => setTimeout(done, 100));
    processes = browsersUsing(folder);
  }
  return { processes, profiles: readdirSync(folder).filter((name) => name.startsWith("firephase-browser-")) };
}

interface Run {
  readonly code: number | null;
  readonly signal: NodeJS.Signals | null;
  readonly ms: number;
  /** Whether a browser of this run was running when the first signal was sent. */
  readonly browserAtKill: boolean;
}

function briefChild(tmp: string, out: string): ReturnType<typeof spawn> {
  return spawn(process.execPath, [BUILT_BIN, "brief", region, "--out", out, "--force", "--no-keep", "--issued", "2027-03-10", "--browser", browserPath], {
    env: { ...process.env, TMPDIR: tmp, FIREPHASE_DEBUG: "" },
    stdio: "ignore",
  });
}

async function interrupted(tmp: string, out: string, delayMs: number, signals: readonly NodeJS.Signals[]): Promise<Run> {
  const started = Date.now();
  const child = briefChild(tmp, out);
  const exit = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((done) => child.once("exit", (code, signal) => done({ code, signal })));
  let browserAtKill = false;
  const timer = setTimeout(() => {
    if (child.exitCode !== null || child.signalCode !== null) return;
    browserAtKill = browsersUsing(tmp).length > 0;
    signals.forEach((signal, position) => setTimeout(() => child.kill(signal), position * 30));
  }, delayMs);
  const guard = setTimeout(() => child.kill("SIGKILL"), 30_000);
  const result = await exit;
  clearTimeout(timer);
  clearTimeout(guard);
  return { ...result, ms: Date.now() - started, browserAtKill };
}

beforeAll(async () => {
  buildOnce();
  work = mkdtempSync(join(tmpdir(), "firephase-interrupt-test-"));
  region = join(work, "region");
  cpSync(resolve("test/fixtures/regions/valid"), region, { recursive: true });
  browserPath = (await findBrowser({})).executablePath;
  // One run to its end: how long a whole brief takes here, so the interrupts land inside it.
  const tmp = join(work, "tmp-full");
  mkdirSync(tmp);
  const started = Date.now();
  const full = spawnSync(process.execPath, [BUILT_BIN, "brief", region, "--out", join(work, "full.pdf"), "--no-keep", "--issued", "2027-03-10", "--browser", browserPath], {
    env: { ...process.env, TMPDIR: tmp },
    encoding: "utf8",
  });
  fullRunMs = Date.now() - started;
  if (full.status !== 0) throw new Error(`the uninterrupted brief failed: ${full.stderr}`);
}, 240_000);

afterAll(() => {
  rmSync(work, { recursive: true, force: true });
});

describe("an interrupted `firephase brief` leaves no browser and no profile folder", () => {
  it("after an uninterrupted run, nothing is left either", async () => {
    const left = await settled(join(work, "tmp-full"));
    expect(left).toEqual({ processes: [], profiles: [] });
  });

  it("10 interrupts at seeded moments (SIGINT, SIGTERM, SIGHUP in turn): exit 128 + signal, no browser, no profile", async () => {
    const fractions = seededFractions(20270310, 10);
    const runs: Run[] = [];
    for (const [position, fraction] of fractions.entries()) {
      const signal = SIGNALS[position % SIGNALS.length] as (typeof SIGNALS)[number];
      const tmp = join(work, `tmp-${position}`);
      mkdirSync(tmp);
      // Moments spread over the whole run: module loading, launch, computation, printing, writing.
      const run = await interrupted(tmp, join(work, `out-${position}.pdf`), Math.round(fraction * fullRunMs), [signal]);
      runs.push(run);
      const left = await settled(tmp);
      expect(left, `run ${position}: ${signal} after ${Math.round(fraction * fullRunMs)} ms`).toEqual({ processes: [], profiles: [] });
      // Finished before the signal (0), cleaned up and exited 128 + n, or ended by the signal before any browser existed.
      const endedBySignal = run.code === null && run.signal === signal;
      expect(run.code === 0 || run.code === EXIT_CODES[signal] || endedBySignal, `run ${position}: code ${run.code}, signal ${run.signal}`).toBe(true);
      // With a browser running the handler cleans up and exits 128 + n (unless the browser was closing
      // and the handlers went away between the look at /proc and the signal: then the signal ends it).
      if (run.browserAtKill) expect(run.code === EXIT_CODES[signal] || endedBySignal, `run ${position}: interrupted with a browser running, code ${run.code}`).toBe(true);
    }
    // The test means something only if several interrupts caught a browser running. On a loaded machine the
    // seeded moments can all land before the browser exists (a slower start than the timed run): then more
    // interrupts are sent, from half-way through the timed run, until three have caught one (at most ten more).
    for (let extra = 0; runs.filter((run) => run.browserAtKill).length < 3 && extra < 10; extra += 1) {
      const signal = SIGNALS[extra % SIGNALS.length] as (typeof SIGNALS)[number];
      const tmp = join(work, `tmp-extra-${extra}`);
      mkdirSync(tmp);
      const run = await interrupted(tmp, join(work, `out-extra-${extra}.pdf`), Math.round((0.5 + 0.05 * extra) * fullRunMs), [signal]);
      runs.push(run);
      expect(await settled(tmp), `extra run ${extra}: ${signal}`).toEqual({ processes: [], profiles: [] });
      if (run.browserAtKill) expect(run.code === EXIT_CODES[signal] || (run.code === null && run.signal === signal), `extra run ${extra}: code ${run.code}`).toBe(true);
    }
    expect(runs.filter((run) => run.browserAtKill).length).toBeGreaterThanOrEqual(3);
  }, 300_000);

  it("an interrupted batch of regions (worker threads, one browser) leaves nothing behind either", async () => {
    const tmp = join(work, "tmp-batch");
    const outDir = join(work, "out-batch");
    mkdirSync(tmp);
    mkdirSync(outDir);
    const second = join(work, "region-b");
    cpSync(region, second, { recursive: true });
    const child = spawn(process.execPath, [BUILT_BIN, "brief", region, second, "--out-dir", outDir, "--force", "--no-keep", "--issued", "2027-03-10", "--browser", browserPath], {
      env: { ...process.env, TMPDIR: tmp, FIREPHASE_THREADS: "2" },
      stdio: "ignore",
    });
    const exit = new Promise<{ code: number | null }>((done) => child.once("exit", (code) => done({ code })));
    const started = Date.now();
    while (browsersUsing(tmp).length === 0 && Date.now() - started < 20_000 && child.exitCode === null) await new Promise((done) => setTimeout(done, 20));
    expect(browsersUsing(tmp).length).toBeGreaterThan(0);
    child.kill("SIGTERM");
    const { code } = await exit;
    expect(code).toBe(143);
    expect(await settled(tmp)).toEqual({ processes: [], profiles: [] });
  }, 60_000);

  it("a second signal during the clean-up still leaves nothing behind", async () => {
    const tmp = join(work, "tmp-double");
    mkdirSync(tmp);
    // Wait until this run's browser is up, then SIGINT and SIGTERM 30 ms apart.
    const child = briefChild(tmp, join(work, "out-double.pdf"));
    const exit = new Promise<{ code: number | null }>((done) => child.once("exit", (code) => done({ code })));
    const started = Date.now();
    while (browsersUsing(tmp).length === 0 && Date.now() - started < 20_000 && child.exitCode === null) await new Promise((done) => setTimeout(done, 20));
    expect(browsersUsing(tmp).length).toBeGreaterThan(0);
    child.kill("SIGINT");
    setTimeout(() => child.kill("SIGTERM"), 30);
    const { code } = await exit;
    expect(code).toBe(130); // the first signal's code
    expect(await settled(tmp)).toEqual({ processes: [], profiles: [] });
  }, 60_000);
});
