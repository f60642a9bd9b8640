import { Command } from "commander";
import { closeSitePairs } from "../record/closeSitePairs.js";
import { compositeFireRecord } from "../record/composite.js";
import { summarizeSampleDepth, type SampleDepthSummary } from "../record/sampleDepth.js";
import type { FireActivity } from "../record/types.js";
import { loadWorkspace } from "../workspace/loadWorkspace.js";
import type { InputFile, Workspace } from "../workspace/types.js";
import { handleError } from "./handleError.js";
import { writeErr, writeOut } from "./terminalText.js";
import { printJson } from "./printJson.js";
import { regionArgument } from "./regionArgument.js";
import { textTable } from "./textTable.js";

/** A warning of `firephase check`; close-site warnings also carry the two ids and the distance. */
export interface CheckWarning {
  readonly code: string;
  readonly message: string;
  readonly sites?: readonly [string, string];
  readonly distanceKm?: number;
}

/** Coverage of one index and its overlap with the usable fire record. */
export interface IndexCoverage {
  readonly name: string;
  readonly file: string;
  readonly column: string;
  /** Month window of a monthly file, or null for a yearly file. */
  readonly months: string | null;
  readonly phases: "cuts" | "terciles";
  /** First and last year with a value; null when the index has no value. */
  readonly first: number | null;
  readonly last: number | null;
  /** Years with a value, and years inside first…last without one. */
  readonly values: number;
  readonly missing: number;
  /** Usable fire-record years that have an index value: first, last, count; null when none. */
  readonly overlap: { readonly first: number; readonly last: number; readonly years: number } | null;
}

/** What `firephase check --json` prints (schema "firephase.check/1"). */
export interface CheckReport {
  readonly schema: "firephase.check/1";
  readonly region: { readonly name: string; readonly description: string | null };
  readonly fireRecord: {
    readonly kind: "sites" | "activity";
    /** Number of sites and of distinct fire events; null for a composited record. */
    readonly sites: number | null;
    readonly events: number | null;
    readonly minSitesRecording: number;
  };
  readonly sampleDepth: SampleDepthSummary;
  readonly indices: readonly IndexCoverage[];
  /** Calibration years set in region.json, or null for the default (overlap of record and indices). */
  readonly calibration: { readonly first: number; readonly last: number } | null;
  readonly activity: readonly { readonly year: number; readonly sitesRecording: number; readonly sitesBurned: number }[];
  readonly files: readonly InputFile[];
  readonly warnings: readonly CheckWarning[];
}

/**
 * Check report: composites the fire record and summarises a loaded region — sample depth,
 * index coverage and overlap with the usable fire record — with warnings for site pairs closer
 * than `methods.independenceKm`, thin years, indices that do not overlap the record, a short
 * overlap (fewer than 3 × `methods.smallSampleYears` years, so a phase will likely be a small
 * sample), and a calibration period that reaches beyond the usable record.
 *
 * @param workspace - a workspace from `loadWorkspace`
 * @returns the report; nothing is printed
 */
export function buildCheckReport(workspace: Workspace): CheckReport {
  const { settings } = workspace;
  const activity = compositeFireRecord(workspace.fireRecord, settings.fireYears.minSitesRecording);
  const depth = summarizeSampleDepth(activity);
  const warnings: CheckWarning[] = [...workspace.warnings];
  const record = workspace.fireRecord;

  if (record.kind === "sites") {
    const limit = settings.methods.independenceKm;
    for (const pair of closeSitePairs(record.sites, limit)) {
      warnings.push({
        code: "sites-close",
        message: `sites ${pair.a} and ${pair.b} are ${pair.distanceKm.toFixed(1)} km apart, closer than ${limit} km: their fire years may not be independent evidence`,
        sites: [pair.a, pair.b],
        distanceKm: pair.distanceKm,
      });
    }
  }
  if (activity.years.length === 0) {
    warnings.push({ code: "no-record", message: "the fire record has no year with a recording site" });
  } else if (depth.thinYears > 0) {
    warnings.push({
      code: "thin-years",
      message: `${depth.thinYears} year${depth.thinYears === 1 ? " has" : "s have"} fewer than ${activity.minSitesRecording} recording sites and ${depth.thinYears === 1 ? "is" : "are"} left out of calibration`,
    });
  }
  const indices = workspace.indices.map((_, position) => coverage(workspace, position, activity));
  const minimumOverlap = 3 * settings.methods.smallSampleYears;
  for (const index of indices) {
    if (index.overlap === null) {
      warnings.push({ code: "index-no-overlap", message: `${index.name} has no value in any usable year of the fire record` });
    } else if (index.overlap.years < minimumOverlap) {
      warnings.push({
        code: "short-overlap",
        message: `${index.name} overlaps the usable fire record in only ${index.overlap.years} years (fewer than ${minimumOverlap}): phases will have few years each`,
      });
    }
  }
  const calibration = settings.calibration;
  if (calibration !== null && depth.firstUsableYear !== null && depth.lastUsableYear !== null) {
    if (calibration.first < depth.firstUsableYear || calibration.last > depth.lastUsableYear) {
      warnings.push({
        code: "calibration-beyond-record",
        message: `the calibration period ${calibration.first}–${calibration.last} reaches beyond the usable fire record ${depth.firstUsableYear}–${depth.lastUsableYear}; only usable years are calibrated`,
      });
    }
  }
  return {
    schema: "firephase.check/1",
    region: { name: settings.name, description: settings.description },
    fireRecord: {
      kind: record.kind,
      sites: record.kind === "sites" ? record.sites.length : null,
      events: record.kind === "sites" ? record.events.length : null,
      minSitesRecording: activity.minSitesRecording,
    },
    sampleDepth: depth,
    indices,
    calibration,
    activity: activity.years.map(({ year, sitesRecording, sitesBurned }) => ({ year, sitesRecording, sitesBurned })),
    files: workspace.files,
    warnings,
  };
}

function coverage(workspace: Workspace, position: number, activity: FireActivity): IndexCoverage {
  const settings = workspace.settings.indices[position];
  const series = workspace.indices[position];
  if (settings === undefined || series === undefined) throw new RangeError(`no index at position ${position}`);
  const present = series.years.filter((_, i) => series.values[i] !== null && series.values[i] !== undefined);
  const first = present[0] ?? null;
  const last = present[present.length - 1] ?? null;
  const presentSet = new Set(present);
  const overlapYears = activity.usableYears.filter((year) => presentSet.has(year));
  const overlapFirst = overlapYears[0];
  const overlapLast = overlapYears[overlapYears.length - 1];
  return {
    name: series.name,
    file: settings.file,
    column: settings.column,
    months: settings.months,
    phases: settings.phases.kind,
    first,
    last,
    values: present.length,
    missing: first === null || last === null ? 0 : last - first + 1 - present.length,
    overlap:
      overlapFirst === undefined || overlapLast === undefined
        ? null
        : { first: overlapFirst, last: overlapLast, years: overlapYears.length },
  };
}

/**
 * The calibration period `calibrate`, `outlook` and `brief` will use, from the report alone (the
 * same rule as the calibration, which `check` does not load): region.json's `calibration` when
 * set; else the full overlap of the usable fire record and the indices — from the later of the
 * first usable fire-record year and the first year any index has a value, to the earlier of the
 * last of each. `years` counts the usable fire-record years inside it (those calibrated).
 *
 * @param report - from {@link buildCheckReport}
 * @returns the period and its usable years, with where it comes from; null when the default
 *   period is empty (the record and the indices do not overlap)
 * @example
 * calibrationYears(report); // the "valid" fixture => { first: 1702, last: 1710, years: 9, fromRegionJson: false }
 */
export function calibrationYears(report: CheckReport): { readonly first: number; readonly last: number; readonly years: number; readonly fromRegionJson: boolean } | null {
  const usable = report.activity.filter((row) => row.sitesRecording >= report.fireRecord.minSitesRecording).map((row) => row.year);
  let first: number;
  let last: number;
  if (report.calibration !== null) {
    ({ first, last } = report.calibration);
  } else {
    let indexFirst = Infinity;
    let indexLast = -Infinity;
    for (const index of report.indices) {
      if (index.first !== null && index.first < indexFirst) indexFirst = index.first;
      if (index.last !== null && index.last > indexLast) indexLast = index.last;
    }
    first = Math.max(usable[0] ?? Infinity, indexFirst);
    last = Math.min(usable[usable.length - 1] ?? -Infinity, indexLast);
    if (!(first <= last)) return null;
  }
  return { first, last, years: usable.filter((year) => year >= first && year <= last).length, fromRegionJson: report.calibration !== null };
}

const span = (first: number | null, last: number | null): string =>
  first === null || last === null ? "none" : `${first}–${last} (${last - first + 1} years)`;

/**
 * The human summary of `firephase check`: region, fire record, sample depth by century, index
 * coverage and overlap, calibration period, and the number of warnings (the warnings themselves
 * go to stderr).
 *
 * @param report - from {@link buildCheckReport}
 * @returns text ending in a newline
 */
export function formatCheckReport(report: CheckReport): string {
  const out: string[] = [];
  const depth = report.sampleDepth;
  out.push(`Region: ${report.region.name}${report.region.description === null ? "" : ` — ${report.region.description}`}`);
  const record = report.fireRecord;
  out.push(
    record.kind === "sites"
      ? `Fire record: ${record.sites} sites, ${record.events} fire events (site-years), ${span(depth.firstYear, depth.lastYear)}`
      : `Fire record: composited activity, ${depth.events} site-years burned, ${span(depth.firstYear, depth.lastYear)}`,
  );
  out.push(
    `Usable years (at least ${record.minSitesRecording} sites recording): ${depth.usableYears}` +
      (depth.firstUsableYear === null || depth.lastUsableYear === null ? "" : ` between ${depth.firstUsableYear} and ${depth.lastUsableYear}`) +
      (depth.thinYears > 0 ? `; ${depth.thinYears} thin years left out` : "") +
      (depth.gapYears > 0 ? `; ${depth.gapYears} years with no recording site` : ""),
  );
  if (depth.maxSites !== null) out.push(`Largest sample depth: ${depth.maxSites} sites (first in ${depth.maxSitesYear})`);
  if (depth.byCentury.length > 0) {
    out.push("", "Sample depth by century:");
    out.push(
      textTable(
        ["century", "years", "sites min", "max", "mean", "fire events"],
        depth.byCentury.map((c) => [
          `${c.century}s`,
          String(c.yearsRecorded),
          String(c.minSites),
          String(c.maxSites),
          c.meanSites.toFixed(1),
          String(c.events),
        ]),
      ),
    );
  }
  out.push("", "Climate indices:");
  out.push(
    textTable(
      ["index", "season", "file", "values", "span", "missing", "overlap with usable record"],
      report.indices.map((index) => [
        index.name,
        index.months ?? "yearly",
        index.column === index.name ? index.file : `${index.file} (${index.column})`,
        String(index.values),
        index.first === null || index.last === null ? "none" : `${index.first}–${index.last}`,
        String(index.missing),
        index.overlap === null ? "none" : `${index.overlap.first}–${index.overlap.last} (${index.overlap.years} years)`,
      ]),
    ),
  );
  const period = calibrationYears(report);
  const usableYears = (years: number): string => `${years} usable year${years === 1 ? "" : "s"}`;
  out.push(
    "",
    period === null
      ? "Calibration period: none (default: the overlap of the usable fire record and the indices, which do not overlap)"
      : period.fromRegionJson
        ? `Calibration period: ${period.first}–${period.last}, ${usableYears(period.years)} (set in region.json)`
        : `Calibration period: ${period.first}–${period.last}, ${usableYears(period.years)} (default: the overlap of the usable fire record and the indices; set "calibration" in region.json to choose)`,
  );
  const count = report.warnings.length;
  out.push(count === 0 ? "Warnings: none" : `Warnings: ${count} (listed on stderr)`);
  return `${out.join("\n")}\n`;
}

/** Close site pairs printed in the terminal; the rest are counted (all are in `check --json`). */
export const CLOSE_PAIRS_SHOWN = 5;

/**
 * The warning lines for the terminal: every warning except close site pairs, then the
 * {@link CLOSE_PAIRS_SHOWN} closest pairs and one line counting the others.
 *
 * @param warnings - the report's warnings
 * @param limitKm - the region's `methods.independenceKm`, named in the count line
 * @returns lines starting "warning: ", without line ends
 */
export function terminalWarnings(warnings: readonly CheckWarning[], limitKm: number): string[] {
  const close = warnings.filter((warning) => warning.code === "sites-close");
  const lines = warnings.filter((warning) => warning.code !== "sites-close").map((warning) => `warning: ${warning.message}`);
  const sorted = [...close].sort((a, b) => (a.distanceKm ?? 0) - (b.distanceKm ?? 0));
  for (const warning of sorted.slice(0, CLOSE_PAIRS_SHOWN)) lines.push(`warning: ${warning.message}`);
  const more = sorted.length - CLOSE_PAIRS_SHOWN;
  if (more > 0) lines.push(`warning: and ${more} more site pair${more === 1 ? "" : "s"} closer than ${limitKm} km; all in check --json`);
  return lines;
}

/**
 * `firephase check <region> [--json]`: validate a region folder and summarise it. Human summary
 * on stdout and warnings on stderr; with `--json`, one JSON object (schema "firephase.check/1")
 * on stdout with the warnings inside. Exit 0 when the region can be used (even with warnings),
 * 1 for bad input.
 *
 * @returns the commander command, to add to the program
 */
export function checkCommand(): Command {
  return new Command("check")
    .description("validate a region folder and summarise its fire record, sample depth and climate indices")
    .addArgument(regionArgument())
    .option("--json", "print the summary as JSON (schema firephase.check/1)")
    .action(async (region: string, options: { json?: boolean }) => {
      try {
        const workspace = await loadWorkspace(region);
        const report = buildCheckReport(workspace);
        if (options.json === true) {
          printJson(report);
        } else {
          writeOut(formatCheckReport(report));
          for (const line of terminalWarnings(report.warnings, workspace.settings.methods.independenceKm)) writeErr(`${line}\n`);
        }
      } catch (error) {
        handleError(error, undefined, "check");
      }
    });
}
