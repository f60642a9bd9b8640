import { readFileSync } from "node:fs";

/**
 * The version of firephase, read from package.json (two folders up from this module, both in
 * src/cli and in the built dist/cli).
 *
 * @returns the version string, e.g. "0.1.0"
 * @throws Error when package.json cannot be read or has no version
 */
export function firephaseVersion(): string {
  const text = readFileSync(new URL("../../package.json", import.meta.url), "utf8");
  const version = (JSON.parse(text) as { version?: unknown }).version;
  if (typeof version !== "string") throw new Error("package.json has no version");
  return version;
}
