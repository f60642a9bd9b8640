import type { Calibration } from "../calibrate/types.js";
import { runCurveRuleHindcast, runHindcast, withCurveRule } from "../hindcast/runHindcast.js";
import type { Skill } from "../hindcast/types.js";
import { attachHindcast, buildOutlookWithoutHindcast, outlookHindcastInput, type OutlookRequest } from "../outlook/buildOutlook.js";
import type { Outlook } from "../outlook/types.js";
import type { Workspace } from "../workspace/types.js";
import { partInNewWorker, workersUsable } from "./hindcastWorkers.js";
import type { StageMark } from "./stageTimings.js";

/**
 * The same outlook as buildOutlook, computed on several cores: the phase rule's hindcast and the curve rule's
 * (their permutation tests and bootstrap intervals, the largest part of the work) run in two worker threads while
 * this thread builds the rest of the outlook (mostly the selection-aware interval), and attachHindcast joins
 * them. This thread is then free for other work (`brief` starts its browser meanwhile).
 * Every part draws from its own seeded stream, so the result is byte-for-byte the one-thread result. Used from
 * the main thread of the compiled program; in a worker thread (a batch already uses every core) or from the
 * sources under a test runner, every part is computed here.
 *
 * @param mark - marks each part's end (stageTimer; FIREPHASE_TIMINGS=1).
 */
export async function buildOutlookBeside(
  workspace: Workspace,
  calibration: Calibration,
  request: OutlookRequest,
  mark: StageMark = () => undefined,
): Promise<Outlook> {
  const input = outlookHindcastInput(workspace, calibration, request);
  const phaseInput = { ...input, curveRule: false };
  const threads = workersUsable();
  const phaseWorker = threads ? partInNewWorker({ part: "phase rule", input }) : null;
  const curveWorker = threads && input.curveRule !== false ? partInNewWorker({ part: "curve rule", input }) : null;
  let rest: ReturnType<typeof buildOutlookWithoutHindcast>;
  try {
    rest = buildOutlookWithoutHindcast(workspace, calibration, request);
    mark("outlook but its hindcast (selection-aware interval)");
  } catch (error) {
    phaseWorker?.stop(); // this run has failed: its hindcast is not waited for
    curveWorker?.stop();
    throw error;
  }
  let curveRule: Skill | null = null;
  if (input.curveRule !== false) {
    const fromWorker = curveWorker === null ? null : await curveWorker.result;
    try {
      curveRule = fromWorker ?? runCurveRuleHindcast(input);
    } catch (error) {
      phaseWorker?.stop();
      throw error;
    }
    mark(`curve rule's hindcast${curveWorker === null ? "" : fromWorker === null ? " (worker failed: computed here)" : " received from its worker thread"}`);
  }
  const fromWorker = phaseWorker === null ? null : await phaseWorker.result;
  if (phaseWorker !== null) mark(`phase rule's hindcast ${fromWorker === null ? "(worker failed: computed here)" : "received from its worker thread"}`);
  const phaseRule = fromWorker ?? runHindcast(phaseInput);
  return attachHindcast(rest, curveRule === null ? phaseRule : withCurveRule(phaseRule, curveRule));
}
