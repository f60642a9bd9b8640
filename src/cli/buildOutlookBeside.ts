import { isMainThread, Worker } from "node:worker_threads";
import type { Calibration } from "../calibrate/types.js";
import { runCurveRuleHindcast, runHindcast, withCurveRule } from "../hindcast/runHindcast.js";
import type { Skill } from "../hindcast/types.js";
import { attachHindcast, buildOutlookWithoutHindcast, outlookHindcastInput, type OutlookRequest } from "../outlook/buildOutlook.js";
import type { Outlook } from "../outlook/types.js";
import type { Workspace } from "../workspace/types.js";
import type { FromHindcastWorker, HindcastWorkerData } from "./hindcastWorker.js";
import type { StageMark } from "./stageTimings.js";

const WORKER_URL = new URL("./hindcastWorker.js", import.meta.url);
/** Running from the compiled JavaScript (not from the TypeScript sources under a test runner). */
const COMPILED = import.meta.url.endsWith(".js");

/**
 * A hindcast computed in a worker thread; null when no worker could be used or the worker's computation failed
 * (the caller then computes it here, which reproduces any error with its own class and stack).
 */
function hindcastInWorker(data: HindcastWorkerData): { readonly result: Promise<Skill | null>; readonly stop: () => void } {
  let worker: Worker | null = null;
  const result = new Promise<Skill | null>((resolve) => {
    try {
      worker = new Worker(WORKER_URL, { workerData: data });
    } catch {
      resolve(null);
      return;
    }
    worker.once("message", (message: FromHindcastWorker) => resolve(message.ok ? message.skill : null));
    // A worker that fails to start or dies is not an error of the computation: compute it here instead.
    worker.once("error", () => resolve(null));
    worker.once("exit", () => resolve(null));
  });
  return { result, stop: () => void (worker as Worker | null)?.terminate() };
}

/**
 * The same outlook as buildOutlook, computed on two cores: the phase rule's hindcast (its permutation test and
 * bootstrap intervals, the largest part of the work) runs in a worker thread while this thread builds the rest
 * of the outlook (mostly the selection-aware interval) and the curve rule's hindcast; attachHindcast joins them.
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
  const threads = COMPILED && isMainThread;
  const phaseWorker = threads ? hindcastInWorker({ part: "phase rule", input }) : null;
  const curveWorker = threads && input.curveRule !== false ? hindcastInWorker({ part: "curve rule", input }) : null;
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
