/**
 * Finding a Chromium-family browser to print the briefing with.
 *
 * Discovery order: an explicit path (the `--browser` flag), then the `FIREPHASE_BROWSER`
 * environment variable, then a system Chrome/Chromium on PATH or at a usual location, then the
 * Chromium that the `@sparticuz/chromium` package carries (unpacked once into the temp folder).
 */
import { accessSync, constants, existsSync, mkdirSync, rmdirSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import { delimiter, join } from "node:path";

/** Where the browser was found, for messages and for the bench. */
export type BrowserSource = "flag" | "env" | "system" | "bundled";

/** A browser executable and how it was found. */
export interface FoundBrowser {
  /** Absolute path of the executable. */
  readonly executablePath: string;
  readonly source: BrowserSource;
}

/** Options of {@link findBrowser}; every field is optional and defaults to the real process state. */
export interface FindBrowserOptions {
  /** Path given with `--browser`; checked first and never silently skipped. */
  readonly explicit?: string | undefined;
  /** Environment to read `FIREPHASE_BROWSER` and `PATH` from (default `process.env`). */
  readonly env?: Readonly<Record<string, string | undefined>>;
  /** Whether a path is an executable file (default: a real file-system check). */
  readonly isExecutable?: (path: string) => boolean;
  /** Unpacks the bundled Chromium and returns its path (default: `@sparticuz/chromium`). */
  readonly unpackBundled?: () => Promise<string>;
}

/** Thrown when no usable browser exists, or a browser named by flag or environment is missing. */
export class BrowserNotFoundError extends Error {
  override name = "BrowserNotFoundError";
}

/** How every browser message ends: the two ways to choose another browser. */
export const CHOOSE_BROWSER_HINT = "choose another with --browser PATH or FIREPHASE_BROWSER";

/**
 * Thrown when a browser was found (or named) but does not start as one: `could not start the
 * browser <path> (<what happened>): choose another with --browser PATH or FIREPHASE_BROWSER`.
 * A subclass of {@link BrowserNotFoundError}, so a caller that maps that error to a usage error
 * (exit 2) maps this one too. The message never carries a third-party link.
 *
 * @example
 * new BrowserLaunchError("/bin/false", "it exited with code 1 before it was ready").message;
 * // => "could not start the browser /bin/false (it exited with code 1 before it was ready): choose another with --browser PATH or FIREPHASE_BROWSER"
 */
export class BrowserLaunchError extends BrowserNotFoundError {
  override name = "BrowserLaunchError";
  /** The executable that was tried. */
  readonly executablePath: string;
  /** What happened, in plain words. */
  readonly reason: string;
  constructor(executablePath: string, reason: string, source?: BrowserSource) {
    const from = source === "env" ? "named by FIREPHASE_BROWSER; " : "";
    super(`could not start the browser ${executablePath} (${from}${reason}): ${CHOOSE_BROWSER_HINT}`);
    this.executablePath = executablePath;
    this.reason = reason;
  }
}

/** Why a path named by flag or environment cannot be a browser: missing, a folder, or not executable. */
function notExecutableReason(path: string): string {
  try {
    const found = statSync(path);
    if (found.isDirectory()) return "it is a folder";
    if (!found.isFile()) return "it is not a regular file";
    return "it is not executable";
  } catch {
    return "no such file";
  }
}

/** Program names looked up on PATH, in order. */
export const SYSTEM_BROWSER_NAMES: readonly string[] = Object.freeze([
  "chromium",
  "chromium-browser",
  "google-chrome",
  "google-chrome-stable",
  "chrome",
]);

/** Usual install locations checked after PATH, in order. */
export const SYSTEM_BROWSER_LOCATIONS: readonly string[] = Object.freeze([
  "/usr/bin/chromium",
  "/usr/bin/chromium-browser",
  "/usr/bin/google-chrome",
  "/usr/bin/google-chrome-stable",
  "/snap/bin/chromium",
  "/opt/google/chrome/chrome",
  "/Applications/Google Chrome.app/Contents/MacOS/Google Chrome",
  "/Applications/Chromium.app/Contents/MacOS/Chromium",
]);

function defaultIsExecutable(path: string): boolean {
  try {
    if (!statSync(path).isFile()) return false;
    accessSync(path, constants.X_OK);
    return true;
  } catch {
    return false;
  }
}

let bundledPromise: Promise<string> | null = null;

/**
 * Unpack the Chromium carried by `@sparticuz/chromium` into the temp folder, once per process
 * and, through a lock folder, once per machine: two processes starting together (two test
 * files, two CLI runs) would otherwise both write the same 190 MB file and one could start a
 * half-written binary.
 *
 * @returns the absolute path of the unpacked executable (the package puts it at `<tmp>/chromium`).
 * @throws Error when the package is missing or unpacking fails.
 * @example
 * await unpackBundledChromium(); // => "/tmp/chromium"
 * @see @sparticuz/chromium README, "executablePath()".
 */
export function unpackBundledChromium(): Promise<string> {
  bundledPromise ??= unpackWithLock().catch((error: unknown) => {
    bundledPromise = null;
    throw error;
  });
  return bundledPromise;
}

async function unpackWithLock(): Promise<string> {
  const lock = join(tmpdir(), "firephase-chromium-unpack.lock");
  const started = Date.now();
  // mkdir is atomic: whoever creates the folder unpacks; the others wait for it to go away.
  for (;;) {
    try {
      mkdirSync(lock);
      break;
    } catch {
      let age = 0;
      try {
        age = Date.now() - statSync(lock).mtimeMs;
      } catch {
        continue; // the lock vanished between the two calls: try again
      }
      if (age > 180_000) {
        // A process died while unpacking: take the lock over.
        try {
          rmdirSync(lock);
        } catch {
          /* another waiter took it over first */
        }
        continue;
      }
      if (Date.now() - started > 240_000) throw new BrowserNotFoundError("timed out waiting for another process to unpack the bundled Chromium");
      await new Promise((resolve) => setTimeout(resolve, 200));
    }
  }
  try {
    const chromium = (await import("@sparticuz/chromium")).default;
    return await chromium.executablePath();
  } finally {
    try {
      rmdirSync(lock);
    } catch {
      /* already gone */
    }
  }
}

/**
 * Find a Chromium-family browser for printing.
 *
 * Order: `explicit` (the `--browser` flag) → env `FIREPHASE_BROWSER` → a system browser named in
 * {@link SYSTEM_BROWSER_NAMES} on PATH → one of {@link SYSTEM_BROWSER_LOCATIONS} → the bundled
 * Chromium of `@sparticuz/chromium`. A path given by flag or environment must exist: it is an
 * error, not a reason to fall back, so a user never prints with a browser they did not choose.
 *
 * @param options - see {@link FindBrowserOptions}; all optional.
 * @returns the executable path and where it came from.
 * @throws BrowserLaunchError (a BrowserNotFoundError) when the flag or environment names a path
 *   that is not an executable file ("could not start the browser <path> (no such file): choose
 *   another with --browser PATH or FIREPHASE_BROWSER"); BrowserNotFoundError when nothing is
 *   found and the bundled browser cannot be unpacked.
 * @example
 * await findBrowser({ explicit: "/usr/bin/chromium" }); // => { executablePath: "/usr/bin/chromium", source: "flag" }
 * @see @sparticuz/chromium README; puppeteer-core `launch({ executablePath })`.
 */
export async function findBrowser(options: FindBrowserOptions = {}): Promise<FoundBrowser> {
  const env = options.env ?? process.env;
  const isExecutable = options.isExecutable ?? defaultIsExecutable;
  if (options.explicit !== undefined) {
    if (options.explicit.trim() === "") throw new BrowserNotFoundError(`--browser is empty: give the path of a Chrome or Chromium, or leave it out to use FIREPHASE_BROWSER or a found browser`);
    if (!isExecutable(options.explicit)) throw new BrowserLaunchError(options.explicit, notExecutableReason(options.explicit), "flag");
    return { executablePath: options.explicit, source: "flag" };
  }
  const fromEnv = env["FIREPHASE_BROWSER"];
  if (fromEnv !== undefined && fromEnv !== "") {
    if (!isExecutable(fromEnv)) throw new BrowserLaunchError(fromEnv, notExecutableReason(fromEnv), "env");
    return { executablePath: fromEnv, source: "env" };
  }
  const pathFolders = (env["PATH"] ?? "").split(delimiter).filter((folder) => folder !== "");
  for (const name of SYSTEM_BROWSER_NAMES) {
    for (const folder of pathFolders) {
      const candidate = join(folder, name);
      if (isExecutable(candidate)) return { executablePath: candidate, source: "system" };
    }
  }
  for (const candidate of SYSTEM_BROWSER_LOCATIONS) {
    if (isExecutable(candidate)) return { executablePath: candidate, source: "system" };
  }
  const unpack = options.unpackBundled ?? unpackBundledChromium;
  try {
    const path = await unpack();
    if (!existsSync(path)) throw new Error(`unpacked path ${path} does not exist`);
    return { executablePath: path, source: "bundled" };
  } catch (error) {
    const detail = error instanceof Error ? error.message : String(error);
    throw new BrowserNotFoundError(
      `no browser found: choose one with --browser PATH or FIREPHASE_BROWSER, or install Chrome or Chromium (the bundled Chromium failed: ${detail})`,
    );
  }
}
