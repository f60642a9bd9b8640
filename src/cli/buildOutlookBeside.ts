import type { Calibration } from "../calibrate/types.js";
import { runCurveRuleHindcast, runHindcast, withCurveRule, type HindcastInput } from "../hindcast/runHindcast.js";
import type { Skill } from "../hindcast/types.js";
import { attachHindcast, buildOutlookWithoutHindcast, outlookHindcastInput, type OutlookRequest } from "../outlook/buildOutlook.js";
import type { Outlook } from "../outlook/types.js";
import type { Workspace } from "../workspace/types.js";
import { partInNewWorker, workersUsable, type PartInWorker } from "./hindcastWorkers.js";
import type { StageMark } from "./stageTimings.js";

/** The hindcast's two parts under way in worker threads (see {@link startHindcastBeside}). */
export interface HindcastBeside {
  /** The input both parts were given. */
  readonly input: HindcastInput;
  readonly phaseRule: PartInWorker | null;
  readonly curveRule: PartInWorker | null;
  /** End both workers (the run has failed, or the parts are not wanted). */
  stop(): void;
}

/**
 * Start the outlook's hindcast in two worker threads — the phase rule's and the curve rule's (their permutation
 * tests and bootstrap intervals, the largest part of the work) — from the calibration years and their activity
 * alone, so it runs while the rest of the calibration and of the outlook is computed here.
 *
 * @param calibration - the calibration years and their activity: a Calibration, or calibrationBasis's
 *   `{ years: period.years, activity: calibrationActivity }` before the rest is calibrated.
 * @returns the parts under way; their results are null where workers are not used (in a worker thread, where a
 *   batch already uses every core, or from the sources under a test runner) or fail, and the caller computes
 *   them itself.
 */
export function startHindcastBeside(workspace: Workspace, calibration: Pick<Calibration, "years" | "activity">, request: OutlookRequest): HindcastBeside {
  const input = outlookHindcastInput(workspace, calibration, request);
  const threads = workersUsable() && input.years.length > 0;
  const phaseRule = threads ? partInNewWorker({ part: "phase rule", input }) : null;
  const curveRule = threads && input.curveRule !== false ? partInNewWorker({ part: "curve rule", input }) : null;
  return {
    input,
    phaseRule,
    curveRule,
    stop(): void {
      phaseRule?.stop();
      curveRule?.stop();
    },
  };
}

/**
 * Started from this calibration's own years and activity: runCalibration with a calibrationBasis returns the
 * basis's arrays themselves, so a hindcast started from that basis holds the very same objects.
 */
function sameRecord(input: HindcastInput, calibration: Pick<Calibration, "years" | "activity">): boolean {
  return input.years === calibration.years && input.activity === calibration.activity;
}

/**
 * The same outlook as buildOutlook, computed on several cores: the hindcast's two rules in worker threads
 * ({@link startHindcastBeside}, started here unless `started` is given) while this thread builds the rest of
 * the outlook (mostly the selection-aware interval); attachHindcast joins them. This thread is then free for
 * other work (`brief` starts its browser meanwhile). Every part draws from its own seeded stream, so the result
 * is byte-for-byte the one-thread result. A part whose worker fails, or that has no worker, is computed here.
 *
 * @param mark - marks each part's end (stageTimer; FIREPHASE_TIMINGS=1).
 * @param started - the hindcast started earlier (startHindcastBeside) for the same workspace and request, from
 *   this calibration's basis; one started from other years or activity is stopped and started anew here.
 */
export async function buildOutlookBeside(
  workspace: Workspace,
  calibration: Calibration,
  request: OutlookRequest,
  mark: StageMark = () => undefined,
  started?: HindcastBeside,
): Promise<Outlook> {
  const usable = started !== undefined && sameRecord(started.input, calibration) ? started : undefined;
  if (started !== undefined && usable === undefined) started.stop();
  const beside = usable ?? startHindcastBeside(workspace, calibration, request);
  const { input, phaseRule: phaseWorker, curveRule: curveWorker } = beside;
  const phaseInput = { ...input, curveRule: false };
  let rest: ReturnType<typeof buildOutlookWithoutHindcast>;
  try {
    rest = buildOutlookWithoutHindcast(workspace, calibration, request);
    mark("outlook but its hindcast (selection-aware interval)");
  } catch (error) {
    beside.stop(); // this run has failed: its hindcast is not waited for
    throw error;
  }
  let curveRule: Skill | null = null;
  if (input.curveRule !== false) {
    const fromWorker = curveWorker === null ? null : await curveWorker.result;
    try {
      curveRule = fromWorker ?? runCurveRuleHindcast(input);
    } catch (error) {
      beside.stop();
      throw error;
    }
    mark(`curve rule's hindcast${curveWorker === null ? "" : fromWorker === null ? " (worker failed: computed here)" : " received from its worker thread"}`);
  }
  const fromWorker = phaseWorker === null ? null : await phaseWorker.result;
  if (phaseWorker !== null) mark(`phase rule's hindcast ${fromWorker === null ? "(worker failed: computed here)" : "received from its worker thread"}`);
  const phaseRule = fromWorker ?? runHindcast(phaseInput);
  return attachHindcast(rest, curveRule === null ? phaseRule : withCurveRule(phaseRule, curveRule));
}
