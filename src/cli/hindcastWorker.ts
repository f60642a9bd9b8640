/**
 * Worker thread of buildOutlookBeside: runs a hindcast (runHindcast; there, the phase rule's) on the input it is
 * given and posts the result (or the error's message) back. It loads only the hindcast's modules.
 */
import { parentPort, workerData } from "node:worker_threads";
import { runHindcast, type HindcastInput } from "../hindcast/runHindcast.js";

/** What the worker posts back. */
export type FromHindcastWorker = { readonly ok: true; readonly skill: ReturnType<typeof runHindcast> } | { readonly ok: false; readonly message: string };

try {
  const skill = runHindcast(workerData as HindcastInput);
  parentPort?.postMessage({ ok: true, skill } satisfies FromHindcastWorker);
} catch (error) {
  parentPort?.postMessage({ ok: false, message: error instanceof Error ? error.message : String(error) } satisfies FromHindcastWorker);
}
