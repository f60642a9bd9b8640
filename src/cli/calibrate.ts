import { Command } from "commander";
import { runCalibration } from "../calibrate/runCalibration.js";
import { toCalibrationJson } from "../calibrate/toCalibrationJson.js";
import type { Calibration, IndexCalibration, ModernSummary } from "../calibrate/types.js";
import { formatPercent, formatPercentRange } from "../outlook/describeChance.js";
import { loadWorkspace } from "../workspace/loadWorkspace.js";
import { handleError } from "./handleError.js";
import { writeErr, writeOut } from "./terminalText.js";
import { printJson } from "./printJson.js";
import { fixed, formatP, textTable } from "./textTable.js";

/** `firephase calibrate <region> [--json]`: how each index phase has shifted the odds of a high-fire year. */
export function calibrateCommand(): Command {
  return new Command("calibrate")
    .description("calibrate how each climate-index phase has shifted the odds of a high-fire year in this region's record")
    .argument("<region>", "region folder (holds region.json)")
    .option("--json", "print the calibration as JSON (schema firephase.calibration/1)")
    .action(async (region: string, options: { json?: boolean }) => {
      try {
        const workspace = await loadWorkspace(region);
        const calibration = runCalibration(workspace, { onProgress: progressReporter() });
        if (options.json === true) printJson(toCalibrationJson(calibration));
        else writeOut(formatCalibration(calibration));
      } catch (error) {
        handleError(error, undefined, "calibrate");
      }
    });
}

/** Progress lines on stderr, only when stderr is a terminal (never in pipes, logs or tests). */
export function progressReporter(): ((message: string) => void) | undefined {
  if (process.stderr.isTTY !== true) return undefined;
  return (message) => writeErr(`${message}\n`);
}

/** The human summary of a calibration: one compact table per index. */
export function formatCalibration(calibration: Calibration): string {
  const out: string[] = [];
  const { period, fireYears, baseRate, categories } = calibration;
  const measure = fireYears.measure === "fraction" ? "share of recording sites burned" : "number of sites burned";
  out.push(`Calibration — ${calibration.region.name}`);
  out.push(`Period ${period.first}–${period.last}: ${period.years} years with enough recording sites`);
  out.push(
    `High-fire years: ${fireYears.years.length} (top ${formatPercent(fireYears.top)} by ${measure}; threshold ${fixed(fireYears.threshold, 3)}; realised share ${formatPercent(fireYears.realisedShare)})`,
  );
  out.push(`Base rate: ${formatPercent(baseRate.estimate)} of years are high-fire years (95% interval ${formatPercentRange(baseRate.lower, baseRate.upper)})`);
  const shares = categories.realisedShares;
  out.push(
    `Activity categories (terciles): below normal ≤ ${fixed(categories.lowerCut, 3)} (${formatPercent(shares.below)} of years), near normal (${formatPercent(shares.near)}), above normal > ${fixed(categories.upperCut, 3)} (${formatPercent(shares.above)})`,
  );
  for (const index of calibration.indices) out.push("", ...formatIndex(index, fireYears.years.length));
  out.push("", ...formatModern(calibration));
  if (calibration.warnings.length > 0) {
    out.push("", "Warnings:");
    for (const warning of calibration.warnings) out.push(`  - ${warning.message}`);
  }
  out.push("", "Statistical odds from past years only; see SAFETY.md. Official agency outlooks and fire-danger forecasts come first.");
  return `${out.join("\n")}\n`;
}

const amount = (value: number | null, measure: "area" | "fires"): string =>
  value === null || !Number.isFinite(value) ? "—" : `${value.toLocaleString("en-US", { maximumFractionDigits: 0 })}${measure === "area" ? " ha" : " fires"}`;

function summaryText(summary: ModernSummary, measure: "area" | "fires"): string {
  if (summary.median === null) return `not enough data (${summary.reason ?? "no value"})`;
  return `median ${amount(summary.median, measure)} (${amount(summary.min, measure)} to ${amount(summary.max, measure)}, ${summary.years} years)`;
}

/** The modern record as a second era: its high-fire years in its own units, odds by phase and the two-era test per index. */
function formatModern(calibration: Calibration): string[] {
  const modern = calibration.modern ?? null;
  if (modern === null) return [`Modern record: not enough data (${calibration.modernReason ?? "no modern fire record"})`];
  const measure = modern.measure === "area" ? "area burned" : "number of fires";
  const lines = [
    `Modern record ${modern.period.first}–${modern.period.last} (${modern.period.years} years), high-fire years by ${measure}: ${modern.fireYears.length}` +
      ` (at least ${amount(modern.threshold, modern.measure)}; ${modern.fireYears.join(", ") || "none"}); base rate ${formatPercent(modern.baseRate.estimate)} (95% interval ${formatPercentRange(modern.baseRate.lower, modern.baseRate.upper)})`,
    `  A high-fire year in hectares: ${summaryText(modern.meaning.areaHa.highFire, "area")}; other years ${summaryText(modern.meaning.areaHa.other, "area")}`,
    `  In fires: ${summaryText(modern.meaning.fires.highFire, "fires")}; other years ${summaryText(modern.meaning.fires.other, "fires")}`,
  ];
  const agreement = modern.agreement;
  lines.push(
    agreement.agreementShare === null
      ? `  Years in both records: not enough data (${agreement.reason ?? "none"})`
      : `  Years in both records: ${agreement.years}; both call ${agreement.both} a high-fire year, the fire-scar record alone ${agreement.fireScarOnly}, the modern record alone ${agreement.modernOnly}; they agree on ${formatPercent(agreement.agreementShare)} of years`,
  );
  for (const index of modern.indices) {
    lines.push(`  ${index.name} in the modern record (${index.years} years):`);
    lines.push(
      textTable(
        ["phase", "years", "high-fire years", "P(high-fire year)", "95% interval"],
        index.phases.map((phase) => [
          phase.label,
          String(phase.years),
          String(phase.fireYears),
          formatPercent(phase.probability.estimate),
          formatPercentRange(phase.probability.lower, phase.probability.upper),
        ]),
        "    ",
      ),
    );
    lines.push(`    ${index.homogeneity.sentence}`);
  }
  for (const warning of modern.warnings) lines.push(`  - ${warning.message}`);
  return lines;
}

function formatIndex(index: IndexCalibration, fireYearCount: number): string[] {
  const rule =
    index.definition.rule === "cuts"
      ? `fixed cuts ${index.definition.cuts.join(" / ")}`
      : `terciles of the calibration period (${index.definition.cuts.map((cut) => cut.toFixed(2)).join(" / ")})`;
  const c = index.contingency;
  const lines = [
    `${index.name} — ${index.years} years, phases by ${rule}`,
    `  chi-square ${fixed(c.chiSquare, 2)} (df ${c.df}), p ${formatP(c.pValue)}, q ${formatP(c.qValue)} (false discovery rate across indices)` +
      (c.reason !== undefined ? ` — not enough data: ${c.reason}` : ""),
  ];
  const rows = index.phases.map((phase, i) => [
    phase.label + (phase.smallSample ? " (few years)" : ""),
    String(phase.years),
    String(phase.fireYears),
    formatPercent(phase.probability.estimate),
    formatPercentRange(phase.probability.lower, phase.probability.upper),
    fixed(phase.ratioToBase, 2),
    formatP(c.perPhase[i]?.fisherPValue),
  ]);
  lines.push(textTable(["phase", "years", "high-fire years", "P(high-fire year)", "95% interval", "× base rate", "Fisher p"], rows));
  const sea = index.sea;
  if (sea.reason !== undefined) {
    lines.push(`  Superposed epoch analysis: not enough data (${sea.reason})`);
  } else {
    // A departure is clear by its q-value (Benjamini–Hochberg across the lags): with seven lags, one
    // raw p below 0.05 turns up by chance about one time in three.
    const departure = (lag: number, i: number, clear: boolean): string[] => {
      const p = sea.pValue[i];
      const q = sea.qValue[i];
      const mean = sea.mean[i];
      if (p === null || p === undefined || mean === null || mean === undefined || p >= 0.05) return [];
      const isClear = q !== null && q !== undefined && q <= 0.05;
      return isClear === clear ? [`lag ${lag > 0 ? "+" : ""}${lag}: ${mean >= 0 ? "+" : ""}${mean.toFixed(2)} (p ${formatP(p)}, q ${formatP(q)})`] : [];
    };
    const significant = sea.lags.flatMap((lag, i) => departure(lag, i, true));
    const chanceLevel = sea.lags.flatMap((lag, i) => departure(lag, i, false));
    lines.push(
      `  Superposed epoch analysis (${sea.eventYears.length} of ${fireYearCount} high-fire years` +
        (sea.eventYears.length < fireYearCount ? ", the others lack index values somewhere in their window" : "") +
        `; ${sea.draws} random draws): ` +
        (significant.length === 0
          ? "no lag departs clearly from chance (q at most 0.05, false discovery rate across lags)"
          : `clear departures (q at most 0.05, false discovery rate across lags) — ${significant.join("; ")}`) +
        (chanceLevel.length === 0 ? "" : `; p below 0.05 but not clear among ${sea.lags.length} lags — ${chanceLevel.join("; ")}`),
    );
  }
  const agg = index.aggregated;
  const zero = agg.lags.indexOf(0);
  lines.push(
    agg.reason !== undefined
      ? `  ${agg.blockYears}-year blocks: not enough data (${agg.reason})`
      : `  ${agg.blockYears}-year blocks (${agg.blocks}): r at lag 0 = ${fixed(agg.r[zero], 2)} (p ${formatP(agg.pValue[zero])}, effective n ${fixed(agg.effectiveN[zero], 1)})`,
  );
  return lines;
}
