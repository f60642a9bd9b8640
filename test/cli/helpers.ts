import { execFileSync, spawnSync } from "node:child_process";
import { existsSync } from "node:fs";
import path from "node:path";
import { vi } from "vitest";
import { runCli } from "../../src/cli/main.js";

/** What one run of the CLI produced. */
export interface CliRun {
  readonly code: number;
  readonly stdout: string;
  readonly stderr: string;
}

/**
 * Run firephase in this process (commander's exits are overridden) and capture stdout and stderr.
 * Restores the streams and process.exitCode afterwards.
 */
export async function runInProcess(argv: readonly string[], env: Record<string, string | undefined> = {}): Promise<CliRun> {
  let stdout = "";
  let stderr = "";
  const out = vi.spyOn(process.stdout, "write").mockImplementation((chunk: string | Uint8Array) => {
    stdout += String(chunk);
    return true;
  });
  const err = vi.spyOn(process.stderr, "write").mockImplementation((chunk: string | Uint8Array) => {
    stderr += String(chunk);
    return true;
  });
  const saved = Object.fromEntries(Object.keys(env).map((key) => [key, process.env[key]]));
  for (const [key, value] of Object.entries(env)) {
    if (value === undefined) delete process.env[key];
    else process.env[key] = value;
  }
  try {
    const code = await runCli(argv);
    return { code, stdout, stderr };
  } finally {
    out.mockRestore();
    err.mockRestore();
    for (const [key, value] of Object.entries(saved)) {
      if (value === undefined) delete process.env[key];
      else process.env[key] = value;
    }
    process.exitCode = undefined;
  }
}

/** The built CLI as the package runs it: the bundle of scripts/bundle.mjs ("bin" in package.json). */
export const BUILT_BIN = path.resolve("dist/bin/main.js");

/** The compiled, unbundled entry (dist/cli/, one file per module), for tests of which modules a command loads. */
export const UNBUNDLED_BIN = path.resolve("dist/cli/main.js");

/**
 * Build src → dist with the project's build config, then bundle dist/cli → dist/bin. The build of
 * other folders may report type errors while they are in progress; tsc still emits, so only a
 * missing entry file is fatal. The bundle keeps recent chunks, as other test files may be running it.
 */
export function buildOnce(): void {
  try {
    execFileSync("npx", ["tsc", "-p", "tsconfig.build.json"], { stdio: "pipe" });
  } catch {
    // Type errors elsewhere do not stop tsc from emitting; checked below.
  }
  if (!existsSync(UNBUNDLED_BIN)) throw new Error(`build did not produce ${UNBUNDLED_BIN}`);
  execFileSync(process.execPath, ["scripts/bundle.mjs"], { stdio: "pipe", env: { ...process.env, FIREPHASE_BUNDLE_KEEP_RECENT: "1" } });
  if (!existsSync(BUILT_BIN)) throw new Error(`build did not produce ${BUILT_BIN}`);
}

/** Run the built CLI as a separate node process. */
export function runBuilt(argv: readonly string[], env: Record<string, string> = {}): CliRun {
  const result = spawnSync(process.execPath, [BUILT_BIN, ...argv], { encoding: "utf8", env: { ...process.env, ...env } });
  return { code: result.status ?? -1, stdout: result.stdout, stderr: result.stderr };
}
