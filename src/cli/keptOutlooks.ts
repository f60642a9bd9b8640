import { constants } from "node:fs";
import { open, readdir } from "node:fs/promises";
import { join } from "node:path";
import type { Calibration } from "../calibrate/types.js";
import { readKeptOutlook } from "../review/readKeptOutlook.js";
import { reviewOutlooks } from "../review/reviewOutlooks.js";
import { outcomeRecords, seasonOutcome } from "../review/seasonOutcomes.js";
import type { KeptOutlook, Review, SeasonOutcome } from "../review/types.js";
import { formatProblem, InputError, type InputProblem } from "../workspace/InputError.js";
import type { Workspace } from "../workspace/types.js";

/** Largest kept outlook read back, in bytes (a kept outlook of 3,000 hindcast years is about 2 MiB). */
export const MAX_KEPT_OUTLOOK_BYTES = 16 * 1024 * 1024;

/** The kept outlooks of a region and the files that could not be read. */
export interface KeptOutlooks {
  readonly kept: readonly KeptOutlook[];
  /** One problem per file skipped (`file:line: message`). */
  readonly problems: readonly InputProblem[];
}

/**
 * Reads every kept outlook of a region: the `*.json` files of `<region>/issued/`, in name order.
 * A file that is not a regular file, is too large, is not JSON or lacks a required field is
 * skipped with a problem naming it (and its line where there is one); the others are read. A
 * region without the folder has no kept outlooks.
 *
 * @param workspace - the loaded region
 * @returns the kept outlooks and the problems of the files skipped
 */
export async function readKeptOutlooks(workspace: Workspace): Promise<KeptOutlooks> {
  const folder = join(workspace.root, "issued");
  const shownFolder = join(workspace.shownRoot ?? workspace.root, "issued");
  let names: string[];
  try {
    names = (await readdir(folder)).filter((name) => name.toLowerCase().endsWith(".json")).sort();
  } catch {
    return { kept: [], problems: [] };
  }
  const kept: KeptOutlook[] = [];
  const problems: InputProblem[] = [];
  for (const name of names) {
    const shown = join(shownFolder, name);
    let text: string;
    try {
      // O_NONBLOCK so that a named pipe does not block the open; then only regular files are read.
      const handle = await open(join(folder, name), constants.O_RDONLY | constants.O_NONBLOCK);
      try {
        const info = await handle.stat();
        if (!info.isFile()) {
          problems.push({ file: shown, line: null, message: "not a regular file: skipped" });
          continue;
        }
        if (info.size > MAX_KEPT_OUTLOOK_BYTES) {
          problems.push({ file: shown, line: null, message: `larger than ${MAX_KEPT_OUTLOOK_BYTES / 1024 / 1024} MiB: skipped` });
          continue;
        }
        text = await handle.readFile("utf8");
      } finally {
        await handle.close();
      }
    } catch (error) {
      problems.push({ file: shown, line: null, message: `cannot be read (${error instanceof Error && "code" in error ? String(error.code) : "error"}): skipped` });
      continue;
    }
    try {
      kept.push(readKeptOutlook(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text, shown));
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      problems.push(...error.problems);
    }
  }
  return { kept, problems };
}

/**
 * The review of a region's kept outlooks: each season's outcome from the region's records and
 * the scores (see `reviewOutlooks`); the reference rate is the modern base rate, else the
 * fire-scar base rate. Files skipped while reading become warnings of the review.
 *
 * @param workspace - the loaded region
 * @param calibration - its calibration
 * @param read - from {@link readKeptOutlooks}
 * @returns the review
 */
export function reviewRegion(workspace: Workspace, calibration: Calibration, read: KeptOutlooks): Review {
  const records = outcomeRecords(workspace, calibration);
  const outcomes = new Map<number, SeasonOutcome>();
  for (const outlook of read.kept) if (!outcomes.has(outlook.season)) outcomes.set(outlook.season, seasonOutcome(outlook.season, records));
  const modernRate = calibration.modern?.baseRate.estimate ?? null;
  const reference =
    modernRate !== null && Number.isFinite(modernRate)
      ? { rate: modernRate, source: "modern base rate" }
      : {
          rate: typeof calibration.baseRate.estimate === "number" && Number.isFinite(calibration.baseRate.estimate) ? calibration.baseRate.estimate : null,
          source: "fire-scar base rate (no modern record)",
        };
  return reviewOutlooks(read.kept, outcomes, {
    region: workspace.settings.name,
    reference,
    warnings: read.problems.map((problem) => ({ code: "kept-file-skipped", message: formatProblem(problem) })),
  });
}
