import { Command } from "commander";
import { runCalibration } from "../calibrate/runCalibration.js";
import { formatPercent } from "../outlook/describeChance.js";
import type { Review } from "../review/types.js";
import { loadWorkspace } from "../workspace/loadWorkspace.js";
import { progressReporter } from "./calibrate.js";
import { handleError } from "./handleError.js";
import { writeErr, writeOut } from "./terminalText.js";
import { readKeptOutlooks, reviewRegion } from "./keptOutlooks.js";
import { printJson } from "./printJson.js";
import { regionArgument } from "./regionArgument.js";
import { fixed, textTable } from "./textTable.js";

const outcomeWords = (outcome: boolean | null): string => (outcome === null ? "not known yet" : outcome ? "high-fire year" : "not a high-fire year");

/**
 * The planner's summary of a review: one line per kept outlook (season, issue date, stated
 * chance, what happened and which record says so), then the scores in words with their warnings.
 *
 * @param review - from `reviewOutlooks`
 * @returns text ending in a newline
 */
export function formatReview(review: Review): string {
  const out: string[] = [];
  out.push(`How our past outlooks turned out — ${review.region}`);
  out.push("");
  if (review.outlooks.length === 0) {
    out.push("No kept outlooks yet: every `firephase brief` keeps the outlook it issued in <region>/issued/, and this review scores them once their seasons are in the records.");
  } else {
    const scored = review.outlooks.filter((entry) => entry.scored).length;
    out.push(`${review.outlooks.length} kept outlook${review.outlooks.length === 1 ? "" : "s"} for ${scored} season${scored === 1 ? "" : "s"}: ${review.known} known, ${review.unknown} not known yet.`);
    out.push(
      textTable(
        ["season", "issued", "chance stated", "what happened", "from", "scored"],
        review.outlooks.map((entry) => [
          String(entry.season),
          entry.issued,
          formatPercent(entry.probability),
          outcomeWords(entry.outcome),
          entry.source === null ? entry.detail : `${entry.source}: ${entry.detail}`,
          entry.scored ? (entry.outcome === null ? "no (not known)" : "yes") : `no (superseded by ${entry.supersededBy ?? "a later outlook"})`,
        ]),
      ),
    );
  }
  out.push("");
  if (review.brierScore === null) {
    out.push(`Brier score: not enough data (${review.brierReason ?? "no season known"}).`);
  } else {
    const rate = review.reference.rate;
    out.push(
      `Brier score ${fixed(review.brierScore, 3)} over ${review.known} season${review.known === 1 ? "" : "s"} (0 is perfect); ` +
        `always stating the ${review.reference.source}${rate === null ? "" : ` (${formatPercent(rate)})`} would score ${fixed(review.brierScoreReference, 3)}.`,
    );
    out.push(
      review.brierSkillScore === null
        ? `Brier skill score: not enough data (${review.brierSkillReason ?? "not computable"}).`
        : `Brier skill score ${fixed(review.brierSkillScore, 2)}: ${review.brierSkillScore > 0 ? "better than" : review.brierSkillScore < 0 ? "worse than" : "no better than"} the average year's odds so far.`,
    );
  }
  out.push(
    review.rpss.value === null
      ? `Ranked probability score of the below/near/above odds: not enough data (${review.rpss.reason ?? review.rps.reason ?? "not computable"}).`
      : `Ranked probability score of the below/near/above odds ${fixed(review.rps.value, 3)} over ${review.rps.seasons} season${review.rps.seasons === 1 ? "" : "s"} (equal odds: ${fixed(review.rpsEqualOdds, 3)}); skill score ${fixed(review.rpss.value, 2)}.`,
  );
  const hit = review.hitRate;
  out.push(
    hit.value === null
      ? `Hit rate: not enough data (${hit.reason ?? "no high-fire year known"}).`
      : `Hit rate: ${hit.hits} of ${hit.highFireYears} known high-fire year${hit.highFireYears === 1 ? "" : "s"} had odds above the average year's (${formatPercent(hit.value)}).`,
  );
  const alarm = review.falseAlarmRatio;
  if (alarm.value !== null) {
    out.push(`False alarms: ${alarm.falseAlarms} of ${alarm.saidHigher} outlook${alarm.saidHigher === 1 ? "" : "s"} above the average year's odds were followed by a season that was not a high-fire year.`);
  }
  if (review.meanProbability !== null && review.observedFrequency !== null) {
    out.push(`On average the outlooks stated ${formatPercent(review.meanProbability)}; ${formatPercent(review.observedFrequency)} of the known seasons were high-fire years.`);
  }
  const skipped = review.warnings.filter((warning) => warning.code === "kept-file-skipped").length;
  const others = review.warnings.filter((warning) => warning.code !== "kept-file-skipped");
  if (others.length > 0 || skipped > 0) {
    out.push("", "Read with care:");
    for (const warning of others) out.push(`  - ${warning.message}`);
    if (skipped > 0) out.push(`  - ${skipped} kept file${skipped === 1 ? " was" : "s were"} skipped because ${skipped === 1 ? "it" : "they"} could not be read (listed on stderr)`);
  }
  out.push("", "A record of statistical outlooks, not an official verification; official agency outlooks and fire-danger forecasts come first.");
  return `${out.join("\n")}\n`;
}

/**
 * `firephase review <region> [--json]`: scores every outlook the region kept (`<region>/issued/`)
 * against what happened. A kept file that cannot be read is reported (`file:line: message`) and
 * skipped; the others are still scored.
 *
 * @returns the commander command
 */
export function reviewCommand(): Command {
  return new Command("review")
    .description("score the outlooks this region kept (issued/) against what happened: Brier score, skill, hit rate")
    .addArgument(regionArgument())
    .option("--json", "print the review as JSON (schema firephase.review/1)")
    .action(async (region: string, options: { json?: boolean }) => {
      try {
        const workspace = await loadWorkspace(region);
        const calibration = runCalibration(workspace, { onProgress: progressReporter() });
        const read = await readKeptOutlooks(workspace);
        const review = reviewRegion(workspace, calibration, read);
        if (options.json === true) {
          printJson(review);
        } else {
          for (const problem of review.warnings.filter((warning) => warning.code === "kept-file-skipped")) {
            writeErr(`warning: ${problem.message}\n`);
          }
          writeOut(formatReview(review));
        }
      } catch (error) {
        handleError(error, undefined, "review");
      }
    });
}
