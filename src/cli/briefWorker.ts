/**
 * A worker thread of `brief <region> <region> …`: it briefs the regions the main thread hands it,
 * each exactly as `runBrief` does (load, calibrate, outlook, HTML, checks, atomic writes), and
 * sends each HTML document to the main thread, which prints it on the batch's one browser and
 * sends the PDF back. Several workers compute regions at the same time on a machine with several
 * cores; the computation is plain synchronous JavaScript, so threads are what lets it use them.
 *
 * Messages in: `{ type: "region", position, region }`, `{ type: "printed", id, pdf }` or
 * `{ type: "printed", id, error }`. Messages out: `{ type: "print", id, position, html, options }`
 * (the region's computation is done: the main thread may hand out the next region) and
 * `{ type: "done", position, outcome }`.
 */
import { parentPort, workerData } from "node:worker_threads";
import type { PrintOptions, PrintResult } from "../briefing/printPdf.js";
import { runBrief, type BriefOptions } from "./brief.js";
import { problemLines, type BatchRegionOutcome } from "./briefBatch.js";

/** What the main thread gives every worker. */
export interface BriefWorkerData {
  readonly options: BriefOptions;
  readonly cwd: string;
  /** `context.today` as milliseconds since 1970 (a Date does not cross threads as a Date in every case). */
  readonly todayMs: number;
  readonly env: Readonly<Record<string, string | undefined>>;
  readonly safetyPath?: string;
}

/** A message from the main thread. */
export type ToBriefWorker =
  | { readonly type: "region"; readonly position: number; readonly region: string }
  | { readonly type: "printed"; readonly id: number; readonly pdf?: Uint8Array; readonly error?: string };

/** A message to the main thread. */
export type FromBriefWorker =
  | { readonly type: "print"; readonly id: number; readonly position: number; readonly html: string; readonly options: PrintOptions }
  | { readonly type: "done"; readonly position: number; readonly outcome: BatchRegionOutcome };

const port = parentPort;
if (port !== null) {
  const data = workerData as BriefWorkerData;
  const waiting = new Map<number, { resolve: (result: PrintResult) => void; reject: (error: Error) => void }>();
  let nextId = 0;
  port.on("message", (message: ToBriefWorker) => {
    if (message.type === "printed") {
      const entry = waiting.get(message.id);
      waiting.delete(message.id);
      if (entry === undefined) return;
      if (message.pdf !== undefined) entry.resolve({ pdf: message.pdf, blockedRequests: [] });
      else entry.reject(new Error(message.error ?? "the printer failed"));
      return;
    }
    const { position, region } = message;
    const started = Date.now();
    const printer = {
      print(html: string, options: PrintOptions): Promise<PrintResult> {
        const id = nextId++;
        return new Promise<PrintResult>((resolve, reject) => {
          waiting.set(id, { resolve, reject });
          port.postMessage({ type: "print", id, position, html, options } satisfies FromBriefWorker);
        });
      },
    };
    const context = { cwd: data.cwd, today: new Date(data.todayMs), env: data.env, printer, ...(data.safetyPath === undefined ? {} : { safetyPath: data.safetyPath }) };
    void runBrief(region, data.options, context).then(
      (result) => port.postMessage({ type: "done", position, outcome: { region, ok: true, result, seconds: (Date.now() - started) / 1000 } } satisfies FromBriefWorker),
      (error: unknown) =>
        port.postMessage({ type: "done", position, outcome: { region, ok: false, problems: problemLines(error), seconds: (Date.now() - started) / 1000 } } satisfies FromBriefWorker),
    );
  });
}
