import { performance } from "node:perf_hooks";
import { writeErr } from "./terminalText.js";

/** Marks one stage of a run: its name, written with the time since the process started. */
export type StageMark = (stage: string) => void;

/**
 * Stage timings for the bench and for anyone asking why a run is slow: with FIREPHASE_TIMINGS=1 in the
 * environment, each stage of a run is written to stderr as `firephase: timing <ms> ms <stage>`, the
 * milliseconds counted from the start of the process (performance.now, whose origin is the process start);
 * otherwise nothing is written.
 *
 * @param env - the environment the command was given.
 * @returns the mark function (a no-op unless asked for).
 * @example
 * const mark = stageTimer({ FIREPHASE_TIMINGS: "1" }); mark("region loaded"); // stderr: firephase: timing 412 ms region loaded
 */
export function stageTimer(env: Readonly<Record<string, string | undefined>>): StageMark {
  if (env["FIREPHASE_TIMINGS"] !== "1") return () => undefined;
  return (stage) => writeErr(`firephase: timing ${performance.now().toFixed(0)} ms ${stage}\n`);
}
