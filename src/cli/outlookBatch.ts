/**
 * `firephase outlook <region> <region> …`: the outlooks of several regions in one run. With
 * `--json` each region's outlook is one JSON object on one line (JSON Lines, schema
 * firephase.outlook/1 as for one region), in the order given; without it the text outlooks
 * follow one another. A region that fails is reported on stderr with its problems
 * (`file:line: message` lines, as for one region) and the others go on; the exit code is 1 if any
 * region failed.
 */
import { runCalibration } from "../calibrate/runCalibration.js";
import { buildOutlook } from "../outlook/buildOutlook.js";
import { toOutlookJson } from "../outlook/toOutlookJson.js";
import { loadWorkspace } from "../workspace/loadWorkspace.js";
import { progressReporter } from "./calibrate.js";
import { handleError } from "./handleError.js";
import { formatOutlook } from "./outlook.js";
import { resolveOutlookRequest, type OutlookOptions } from "./outlookRequest.js";
import { writeErr, writeOut } from "./terminalText.js";

/**
 * One JSON value on one line: compact `JSON.stringify`, with the characters that could steer a
 * terminal or reorder text (DEL, C1 controls, bidirectional marks, line and paragraph separators)
 * written as `\u` escapes, as `printJson` does for the indented form.
 *
 * @param value - a JSON value.
 * @returns the line, ending in a line feed.
 * @example
 * jsonLine({ a: 1 }); // => '{"a":1}\n'
 * @see Ward I., JSON Lines (jsonlines.org): one JSON value per line, UTF-8, LF line ends.
 */
export function jsonLine(value: unknown): string {
  return `${JSON.stringify(value)}\n`.replace(
    /[\u007f-\u009f\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g,
    (character) => `\\u${character.charCodeAt(0).toString(16).padStart(4, "0")}`,
  );
}

/**
 * The action of `outlook` with several regions (see the module comment).
 *
 * @param regions - region folders as typed.
 * @param options - the options of `outlook` (`--values`, `--issued`, `--season` apply to every region).
 * @returns when done; `process.exitCode` is 1 if a region failed, else 0.
 * @throws never: each region's error is reported and the run goes on.
 * @example
 * await outlookBatchAction(["north", "south"], { json: true });
 */
export async function outlookBatchAction(regions: readonly string[], options: OutlookOptions & { readonly json?: boolean }): Promise<void> {
  let failed = 0;
  const today = new Date();
  for (const [position, region] of regions.entries()) {
    try {
      const workspace = await loadWorkspace(region);
      const request = resolveOutlookRequest(workspace, options, today);
      const calibration = runCalibration(workspace, { onProgress: progressReporter() });
      const outlook = buildOutlook(workspace, calibration, request);
      if (options.json === true) writeOut(jsonLine(toOutlookJson(outlook)));
      else writeOut(`${position === 0 ? "" : "\n"}${formatOutlook(outlook)}`);
    } catch (error) {
      failed += 1;
      writeErr(`firephase: ${region}: no outlook:\n`);
      handleError(error, undefined);
    }
  }
  if (failed > 0) writeErr(`firephase: ${regions.length - failed} of ${regions.length} regions have an outlook; ${failed} failed (listed above)\n`);
  process.exitCode = failed > 0 ? 1 : 0;
}
