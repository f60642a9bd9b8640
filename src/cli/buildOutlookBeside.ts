import { isMainThread, Worker } from "node:worker_threads";
import type { Calibration } from "../calibrate/types.js";
import { runHindcast } from "../hindcast/runHindcast.js";
import type { Skill } from "../hindcast/types.js";
import { attachHindcast, buildOutlookWithoutHindcast, outlookHindcastInput, type OutlookRequest } from "../outlook/buildOutlook.js";
import type { Outlook } from "../outlook/types.js";
import type { Workspace } from "../workspace/types.js";
import type { FromHindcastWorker } from "./hindcastWorker.js";

const WORKER_URL = new URL("./hindcastWorker.js", import.meta.url);
/** Running from the compiled JavaScript (not from the TypeScript sources under a test runner). */
const COMPILED = import.meta.url.endsWith(".js");

/** The hindcast computed in a worker thread; null when no worker could be used (the caller computes it here). */
function hindcastInWorker(input: ReturnType<typeof outlookHindcastInput>): Promise<Skill | null> {
  return new Promise((resolve, reject) => {
    let worker: Worker;
    try {
      worker = new Worker(WORKER_URL, { workerData: input });
    } catch {
      resolve(null);
      return;
    }
    let settled = false;
    worker.once("message", (message: FromHindcastWorker) => {
      settled = true;
      if (message.ok) resolve(message.skill);
      else reject(new Error(message.message));
    });
    // A worker that fails to start or dies is not an error of the computation: compute it here instead.
    worker.once("error", () => {
      if (!settled) resolve(null);
      settled = true;
    });
    worker.once("exit", () => {
      if (!settled) resolve(null);
      settled = true;
    });
  });
}

/**
 * The same outlook as buildOutlook, computed on two cores: the hindcast (its permutation tests and bootstrap
 * intervals, most of the work) runs in a worker thread while this thread builds the rest (the selection-aware
 * interval is the larger part of it), and the two are joined by attachHindcast. Every part is seeded on its own,
 * so the result is byte-for-byte the one-thread result. Used from the main thread of the compiled program; in a
 * worker thread (a batch already uses every core) or from the sources under a test runner, it computes both
 * parts here.
 */
export async function buildOutlookBeside(workspace: Workspace, calibration: Calibration, request: OutlookRequest): Promise<Outlook> {
  const input = outlookHindcastInput(workspace, calibration, request);
  const pending = COMPILED && isMainThread ? hindcastInWorker(input) : Promise.resolve(null);
  const rest = buildOutlookWithoutHindcast(workspace, calibration, request);
  const skill = (await pending) ?? runHindcast(input);
  return attachHindcast(rest, skill);
}
