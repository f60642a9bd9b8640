import { afterEach, describe, expect, it, vi } from "vitest";
import { stageTimer } from "../../src/cli/stageTimings.js";

afterEach(() => {
  vi.restoreAllMocks();
});

describe("stageTimer(env)", () => {
  it("with FIREPHASE_TIMINGS=1 writes 'firephase: timing <ms> ms <stage>' to stderr, the times rising", () => {
    const written: string[] = [];
    vi.spyOn(process.stderr, "write").mockImplementation((chunk: string | Uint8Array) => {
      written.push(String(chunk));
      return true;
    });
    const mark = stageTimer({ FIREPHASE_TIMINGS: "1" });
    mark("region read");
    mark("calibrated");
    expect(written).toHaveLength(2);
    const times = written.map((line) => Number(/^firephase: timing (\d+) ms (region read|calibrated)\n$/.exec(line)?.[1]));
    expect(times.every(Number.isFinite)).toBe(true);
    expect(times[1]).toBeGreaterThanOrEqual(times[0] as number);
  });

  it("writes nothing otherwise", () => {
    const write = vi.spyOn(process.stderr, "write").mockImplementation(() => true);
    stageTimer({})("region read");
    stageTimer({ FIREPHASE_TIMINGS: "0" })("region read");
    expect(write).not.toHaveBeenCalled();
  });
});
