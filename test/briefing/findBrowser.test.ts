import { describe, expect, it } from "vitest";
import { BrowserNotFoundError, findBrowser } from "../../src/briefing/findBrowser.js";

const never = (): boolean => false;
const bundled = async (): Promise<string> => process.execPath; // any existing file stands in for the unpacked browser

describe("findBrowser(options)", () => {
  it("takes --browser first, then FIREPHASE_BROWSER, then PATH, then usual places, then the bundled one", async () => {
    const all = (path: string): boolean => ["/flag/chrome", "/env/chrome", "/opt/bin/chromium", "/usr/bin/chromium"].includes(path);
    const env = { FIREPHASE_BROWSER: "/env/chrome", PATH: "/opt/bin:/usr/local/bin" };
    expect(await findBrowser({ explicit: "/flag/chrome", env, isExecutable: all, unpackBundled: bundled })).toEqual({ executablePath: "/flag/chrome", source: "flag" });
    expect(await findBrowser({ env, isExecutable: all, unpackBundled: bundled })).toEqual({ executablePath: "/env/chrome", source: "env" });
    expect(await findBrowser({ env: { PATH: env.PATH }, isExecutable: all, unpackBundled: bundled })).toEqual({ executablePath: "/opt/bin/chromium", source: "system" });
    expect(await findBrowser({ env: { PATH: "/nowhere" }, isExecutable: all, unpackBundled: bundled })).toEqual({ executablePath: "/usr/bin/chromium", source: "system" });
    expect(await findBrowser({ env: { PATH: "" }, isExecutable: never, unpackBundled: bundled })).toEqual({ executablePath: process.execPath, source: "bundled" });
  });
  it("refuses a --browser or FIREPHASE_BROWSER path that is not there instead of falling back", async () => {
    await expect(findBrowser({ explicit: "/no/such/browser", env: {}, isExecutable: never, unpackBundled: bundled })).rejects.toThrow(BrowserNotFoundError);
    await expect(findBrowser({ env: { FIREPHASE_BROWSER: "/no/such" }, isExecutable: never, unpackBundled: bundled })).rejects.toThrow(/FIREPHASE_BROWSER/);
  });
  it("explains what to do when nothing is found", async () => {
    const failing = async (): Promise<string> => {
      throw new Error("package missing");
    };
    await expect(findBrowser({ env: { PATH: "" }, isExecutable: never, unpackBundled: failing })).rejects.toThrow(/--browser PATH.*package missing/);
  });
});
