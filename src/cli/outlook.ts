import { Command } from "commander";
import { calibrationBasis, runCalibration } from "../calibrate/runCalibration.js";
import type { Calibration } from "../calibrate/types.js";
import { buildOutlookBeside, startHindcastBeside } from "./buildOutlookBeside.js";
import { comparisonSentence, formatPercent, formatPercentRange, headline } from "../outlook/describeChance.js";
import { toOutlookJson } from "../outlook/toOutlookJson.js";
import type { Outlook } from "../outlook/types.js";
import { loadWorkspace } from "../workspace/loadWorkspace.js";
import { progressReporter } from "./calibrate.js";
import { handleError } from "./handleError.js";
import { writeErr, writeOut } from "./terminalText.js";
import { addOutlookOptions, resolveOutlookRequest } from "./outlookRequest.js";
import { printJson } from "./printJson.js";
import { fixed, textTable } from "./textTable.js";

/** `firephase outlook <region> [--values NAME=V,…] [--issued DATE] [--season YEAR] [--json]`. */
export function outlookCommand(): Command {
  return addOutlookOptions(
    new Command("outlook")
      .description("odds of a high-fire year for this season's index values, analog years and hindcast skill")
      .argument("<regions...>", "region folder(s) (each holds region.json)"),
  )
    .option("--json", "print the outlook as JSON (schema firephase.outlook/1; with several regions one object per line)")
    .action(async (regions: readonly string[], options: { values?: string | readonly string[]; issued?: string; season?: string; json?: boolean }) => {
      try {
        if (regions.length > 1) {
          await (await import("./outlookBatch.js")).outlookBatchAction(regions, options);
          return;
        }
        const region = regions[0] as string;
        const workspace = await loadWorkspace(region);
        const request = resolveOutlookRequest(workspace, options, new Date());
        // The hindcast starts in its worker threads from the calibration years alone, while the rest is calibrated here.
        const basis = calibrationBasis(workspace);
        const hindcast = startHindcastBeside(workspace, { years: basis.period.years, activity: basis.calibrationActivity }, request);
        let calibration: Calibration;
        try {
          calibration = runCalibration(workspace, { onProgress: progressReporter() }, basis);
        } catch (error) {
          hindcast.stop();
          throw error;
        }
        const outlook = await buildOutlookBeside(workspace, calibration, request, undefined, hindcast);
        if (options.json === true) printJson(toOutlookJson(outlook));
        else writeOut(formatOutlook(outlook));
      } catch (error) {
        handleError(error, undefined, "outlook");
      }
    });
}

/** The one-screen human outlook: plain statement first, then odds, analogs and skill. */
export function formatOutlook(outlook: Outlook): string {
  const out: string[] = [];
  const skill = outlook.hindcast;
  out.push(`Fire-season outlook — ${outlook.region}, ${outlook.season} season (issued ${outlook.issued})`);
  out.push("");
  out.push(headline(outlook.fireYear, outlook.baseRate));
  out.push(comparisonSentence(outlook.fireYear, outlook.baseRate));
  out.push(skill.verdict);
  if (outlook.warnings.length > 0) {
    out.push("", "Read with care:");
    for (const warning of outlook.warnings) out.push(`  - ${warning.message}`);
  }
  out.push("");
  out.push(
    `Chance of a high-fire year: ${formatPercent(outlook.fireYear.estimate)} (95% interval ${formatPercentRange(outlook.fireYear.lower, outlook.fireYear.upper)}); ` +
      `base rate ${formatPercent(outlook.baseRate.estimate)} (${formatPercentRange(outlook.baseRate.lower, outlook.baseRate.upper)})`,
  );
  out.push(`  read from ${outlook.fireYear.basis}`);
  out.push(...oddsDetailLines(outlook));
  const c = outlook.categories;
  out.push(
    `Fire activity: below normal ${formatPercent(c.below.estimate)}, near normal ${formatPercent(c.near.estimate)}, above normal ${formatPercent(c.above.estimate)}`,
  );
  out.push("");
  out.push("This season's index phases:");
  out.push(
    textTable(
      ["index", "value", "from", "phase", "P(high-fire year) in this phase", "95% interval", "years"],
      outlook.current.map((phase) => {
        const odds = outlook.perIndex.find((entry) => entry.index === phase.index);
        return [
          phase.index,
          fixed(phase.value, 2),
          phase.source,
          phase.label + (phase.nearBoundary ? " (near a phase boundary)" : ""),
          formatPercent(odds?.probability.estimate ?? null),
          formatPercentRange(odds?.probability.lower ?? null, odds?.probability.upper ?? null),
          String(odds?.years ?? 0),
        ];
      }),
    ),
  );
  if (outlook.missing.length > 0) out.push(`  no current value (left out): ${outlook.missing.join(", ")}`);
  out.push("");
  if (outlook.analogs.length === 0) {
    out.push(
      outlook.current.length === 0
        ? "Analog years: none (no current index values were given)."
        : "Analog years: none (no calibration year has values for all of this season's indices).",
    );
  } else {
    out.push(
      `Analog years (nearest in standardized index space): ${outlook.analogs.filter((a) => a.fireYear).length} of ${outlook.analogs.length} were high-fire years` +
        ` (${formatPercent(outlook.analogFireShare.estimate)}, 95% interval ${formatPercentRange(outlook.analogFireShare.lower, outlook.analogFireShare.upper)})`,
    );
    out.push(
      textTable(
        ["year", "distance", "high-fire year", "activity", "category"],
        outlook.analogs.map((analog) => [
          String(analog.year),
          fixed(analog.distance, 2),
          analog.fireYear ? "yes" : "no",
          fixed(analog.activity, 3),
          `${analog.category} normal`,
        ]),
      ),
    );
  }
  out.push("");
  out.push(
    `Hindcast (${skill.years} years, each left out with ${skill.exclusion} years either side): ` +
      `Brier skill score ${fixed(skill.brierSkillScore, 3)}${interval(skill.intervals?.brierSkillScore)}, ` +
      `RPSS ${fixed(skill.rpss, 3)}${interval(skill.intervals?.rpss)}, ROC area ${fixed(skill.rocArea, 3)}${interval(skill.intervals?.rocArea)}` +
      (skill.reason !== undefined ? ` — not enough data: ${skill.reason}` : ""),
  );
  if (skill.intervals !== null && skill.intervals !== undefined) {
    out.push(`  [95% moving-block bootstrap intervals: ${skill.intervals.resamples} resamples in blocks of ${skill.intervals.blockYears} years]`);
  }
  if (skill.skillPValue !== undefined) {
    out.push(
      skill.skillPValue === null
        ? `  chance test: not enough data${skill.skillPValueReason === undefined ? "" : ` (${skill.skillPValueReason})`}`
        : `  chance test: ${skill.permutations ?? "?"} block-shuffled fire records; share scoring at least as well, p = ${fixed(skill.skillPValue, 3)}`,
    );
  }
  const other = skill.phaseRule ?? skill.curveRule;
  if (other !== null && other !== undefined) {
    const name = skill.phaseRule !== null && skill.phaseRule !== undefined ? "phase rule (not issued)" : "curve rule (not issued)";
    out.push(
      `  ${name}: Brier skill score ${fixed(other.brierSkillScore, 3)}${interval(other.intervals?.brierSkillScore)}, ROC area ${fixed(other.rocArea, 3)}` +
        (other.skillPValue === null || other.skillPValue === undefined ? "" : `, p = ${fixed(other.skillPValue, 3)} (${other.permutations ?? "?"} shuffles)`) +
        ` — ${other.hasSkill ? "some skill" : "no skill shown"}`,
    );
  }
  out.push(`  rule: ${skill.rule}`);
  out.push("");
  out.push("Caution: a statistical long-range outlook. It does not replace official agency outlooks, fire-danger ratings,");
  out.push("local codes or the direction of qualified fire personnel, and must never be used for tactical or evacuation decisions.");
  return `${out.join("\n")}\n`;
}

/**
 * The lines under the headline odds that the JSON and the briefing also carry: the interval that
 * allows for the rule's choice of index (`fireYear.selectionInterval`) with its note, and the
 * response curve's reading at this season's value (`fireYear.curveOdds`) with the strength note.
 * A reading that could not be made is "not enough data" with its reason.
 */
export function oddsDetailLines(outlook: Outlook): string[] {
  const fireYear = outlook.fireYear;
  const lines: string[] = [];
  const selection = fireYear.selectionInterval;
  if (selection !== undefined) {
    lines.push(
      selection === null
        ? `  95% interval allowing for the rule's choice of index: not enough data${fireYear.selectionIntervalReason === undefined ? "" : ` (${fireYear.selectionIntervalReason})`}`
        : `  95% interval allowing for the rule's choice of index: ${formatPercentRange(selection.lower, selection.upper)}` +
            ` (${selection.resamples} block-bootstrap resamples of the whole rule)`,
    );
  }
  if (fireYear.selectionNote !== null && fireYear.selectionNote !== undefined) lines.push(`  ${fireYear.selectionNote}`);
  const curve = fireYear.curveOdds;
  if (curve !== undefined) {
    const headlineMark = fireYear.response === "curve" ? " (the headline above)" : "";
    if (curve === null) {
      lines.push(`  response curve: not enough data${fireYear.curveOddsReason === undefined ? "" : ` (${fireYear.curveOddsReason})`}`);
    } else {
      const beyond =
        curve.beyondRange === null
          ? ""
          : `; ${fixed(curve.value, 2)} is ${curve.beyondRange} every calibration year (${fixed(curve.range.min, 2)} to ${fixed(curve.range.max, 2)}), so the curve is read at ${fixed(curve.readAt, 2)}, the record's edge`;
      lines.push(
        `  response curve of ${curve.index} at ${fixed(curve.value, 2)}: ${formatPercent(curve.estimate)} (${formatPercentRange(curve.lower, curve.upper)})${headlineMark}${beyond}`,
      );
    }
  }
  if (fireYear.strengthNote !== null && fireYear.strengthNote !== undefined) lines.push(`  ${fireYear.strengthNote}`);
  return lines;
}

/** " [lo, hi]" of a bootstrap interval, or "" when there is none. */
function interval(bounds: readonly [number, number] | null | undefined): string {
  return bounds === null || bounds === undefined ? "" : ` [${fixed(bounds[0], 3)}, ${fixed(bounds[1], 3)}]`;
}
