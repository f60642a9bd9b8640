/**
 * The hindcast's worker threads (see buildOutlookBeside and hindcastWorker.ts): one hindcast part computed in a
 * new worker thread, and its answer.
 */
import { isMainThread, Worker } from "node:worker_threads";
import type { Skill } from "../hindcast/types.js";
import type { FromHindcastWorker, HindcastWorkerData } from "./hindcastWorker.js";

const WORKER_URL = new URL("./hindcastWorker.js", import.meta.url);
/** Running from the compiled JavaScript (not from the TypeScript sources under a test runner). */
const COMPILED = import.meta.url.endsWith(".js");

/**
 * A hindcast part being computed in a worker: its result, null when the worker could not be used or its
 * computation failed (the caller then computes it in its own thread, which reproduces any error with its own
 * class and stack); `stop` ends the worker early.
 */
export interface PartInWorker {
  readonly result: Promise<Skill | null>;
  readonly stop: () => void;
}

/**
 * Workers are used from the main thread of the compiled program: not in a worker thread (a batch already uses
 * every core), and not when `FIREPHASE_THREADS=1` asks for one thread.
 */
export function workersUsable(env: Readonly<Record<string, string | undefined>> = process.env): boolean {
  return COMPILED && isMainThread && env["FIREPHASE_THREADS"] !== "1";
}

/** Follow one worker to its answer: its first message, or null when it fails or dies. */
function answerOf(worker: Worker, exited: Promise<void>): PartInWorker {
  const result = new Promise<Skill | null>((resolve) => {
    worker.once("message", (message: FromHindcastWorker) => resolve(message.ok ? message.skill : null));
    // A worker that fails to start or dies is not an error of the computation: it is computed here instead.
    worker.once("error", () => resolve(null));
    void exited.then(() => resolve(null));
  });
  return { result, stop: () => void worker.terminate() };
}

function exitOf(worker: Worker): Promise<void> {
  return new Promise<void>((resolve) => worker.once("exit", () => resolve()));
}

/**
 * Compute one hindcast part in a new worker thread, given its input at start.
 *
 * @returns the part's answer (see {@link PartInWorker}); its result is null when no worker could be started.
 */
export function partInNewWorker(data: HindcastWorkerData): PartInWorker {
  let worker: Worker;
  try {
    worker = new Worker(WORKER_URL, { workerData: data });
  } catch {
    return { result: Promise.resolve(null), stop: () => undefined };
  }
  return answerOf(worker, exitOf(worker));
}
