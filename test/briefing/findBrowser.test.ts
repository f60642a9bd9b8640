import { describe, expect, it } from "vitest";
import { BrowserLaunchError, BrowserNotFoundError, findBrowser } from "../../src/briefing/findBrowser.js";

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

describe("findBrowser(options) messages for a browser that cannot be used", () => {
  it("names the path, says what is wrong and how to choose another, without a third-party link", async () => {
    await expect(findBrowser({ explicit: "/no/such/browser", env: {} })).rejects.toThrow(
      "could not start the browser /no/such/browser (no such file): choose another with --browser PATH or FIREPHASE_BROWSER",
    );
    await expect(findBrowser({ explicit: "/tmp", env: {} })).rejects.toThrow("could not start the browser /tmp (it is a folder): choose another with --browser PATH or FIREPHASE_BROWSER");
    await expect(findBrowser({ env: { FIREPHASE_BROWSER: "/no/such" } })).rejects.toThrow(
      "could not start the browser /no/such (named by FIREPHASE_BROWSER; no such file): choose another with --browser PATH or FIREPHASE_BROWSER",
    );
    await expect(findBrowser({ explicit: "/no/such", env: {} })).rejects.toBeInstanceOf(BrowserLaunchError);
    await expect(findBrowser({ explicit: " ", env: {} })).rejects.toThrow(/--browser is empty/);
  });
});
