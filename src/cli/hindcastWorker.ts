/**
 * Worker thread of the outlook's hindcast (started by hindcastWorkers.ts for startHindcastBeside): runs one part of a hindcast on the input it is given — the phase rule's
 * (runHindcast with `curveRule: false`) or the curve rule's (runCurveRuleHindcast) — and posts the result (or
 * the error's message) back. It loads only the hindcast's modules.
 */
import { parentPort, workerData } from "node:worker_threads";
import { runCurveRuleHindcast, runHindcast, type HindcastInput } from "../hindcast/runHindcast.js";

/** What the worker is given: which part, and the hindcast's input. */
export interface HindcastWorkerData {
  readonly part: "phase rule" | "curve rule";
  readonly input: HindcastInput;
}

/** What the worker posts back. */
export type FromHindcastWorker = { readonly ok: true; readonly skill: ReturnType<typeof runHindcast> } | { readonly ok: false; readonly message: string };

try {
  const { part, input } = workerData as HindcastWorkerData;
  const skill = part === "curve rule" ? runCurveRuleHindcast(input) : runHindcast({ ...input, curveRule: false });
  parentPort?.postMessage({ ok: true, skill } satisfies FromHindcastWorker);
} catch (error) {
  parentPort?.postMessage({ ok: false, message: error instanceof Error ? error.message : String(error) } satisfies FromHindcastWorker);
}
