import { format, getMonth, isValid, parseISO } from "date-fns";
import type { OutlookRequest } from "../outlook/buildOutlook.js";
import type { Workspace } from "../workspace/types.js";
import type { Command } from "commander";
import { UsageError } from "./errors.js";

export interface OutlookOptions {
  /** `--values NAME=V,…`; the option may be given more than once (commander collects them). */
  readonly values?: string | readonly string[];
  readonly issued?: string;
  readonly season?: string;
}

/** Collects a repeatable commander option into a list. */
export function collectOption(value: string, previous: readonly string[] | undefined): string[] {
  return [...(previous ?? []), value];
}

/**
 * Adds the options that choose the season and its index values (`--values`, `--issued`,
 * `--season`), shared by `outlook` and `brief` so both read them the same way.
 */
export function addOutlookOptions(command: Command): Command {
  return command
    .option("--values <list>", "current seasonal index values, e.g. ENSO=1.2,NAO=0.4 (override region.json; may be repeated)", collectOption)
    .option("--issued <date>", "issue date YYYY-MM-DD (default: region.json, then today)")
    .option("--season <year>", "fire season year (default: region.json, then the issue year; the next year for an issue date in Oct–Dec)");
}

const DECIMAL = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/**
 * The outlook request from region.json and the command line: current values from
 * `outlook.values`, each overridden by `--values NAME=V,…` (repeatable; every index named once);
 * the issue date from `--issued`, then region.json, then today; the season from `--season`, then
 * region.json, then the issue year — or the next year for an issue date in October–December,
 * when the coming fire season is next year's (our choice, stated in the README).
 *
 * Notes are returned for the outlook to print when region.json's values were written for another
 * season than the one asked for, and when the issue date falls after the season's year.
 *
 * @throws UsageError (exit 2) for an unknown index name (listing the known ones), an index named
 *   twice, a value that is not a decimal number, a date that is not YYYY-MM-DD, or a season that is
 *   not a whole year
 */
export function resolveOutlookRequest(workspace: Workspace, options: OutlookOptions, today: Date): OutlookRequest {
  const known = workspace.settings.indices.map((index) => index.name);
  const values: Record<string, number> = { ...workspace.settings.outlook.values };
  const sources: Record<string, "region.json" | "--values"> = {};
  for (const name of Object.keys(values)) sources[name] = "region.json";
  const lists = options.values === undefined ? [] : typeof options.values === "string" ? [options.values] : options.values;
  const given = new Set<string>();
  for (const list of lists) {
    for (const part of list.split(",")) {
      const trimmed = part.trim();
      if (trimmed === "") continue;
      const equals = trimmed.indexOf("=");
      if (equals <= 0) throw new UsageError(`--values: expected NAME=VALUE, found "${trimmed}"`);
      const name = trimmed.slice(0, equals).trim();
      const text = trimmed.slice(equals + 1).trim();
      if (!known.includes(name)) {
        throw new UsageError(`--values: unknown index "${name}"; this region's indices are ${known.join(", ")}`);
      }
      if (given.has(name)) throw new UsageError(`--values: ${name} is given more than once`);
      if (!DECIMAL.test(text) || !Number.isFinite(Number(text))) {
        throw new UsageError(`--values: ${name} must be a decimal number such as 1.2 or -0.5, found "${text}"`);
      }
      given.add(name);
      values[name] = Number(text);
      sources[name] = "--values";
    }
  }
  const issuedText = options.issued ?? workspace.settings.outlook.issued ?? format(today, "yyyy-MM-dd");
  const issuedDate = parseISO(issuedText);
  if (!/^\d{4}-\d{2}-\d{2}$/.test(issuedText) || !isValid(issuedDate)) {
    throw new UsageError(`--issued: expected a date as YYYY-MM-DD, found "${issuedText}"`);
  }
  let season: number;
  if (options.season !== undefined) {
    if (!/^\d{4}$/.test(options.season.trim())) throw new UsageError(`--season: expected a year such as 2027, found "${options.season}"`);
    season = Number(options.season.trim());
  } else {
    const issueYear = issuedDate.getFullYear();
    season = workspace.settings.outlook.season ?? (getMonth(issuedDate) >= 9 ? issueYear + 1 : issueYear);
  }
  const notes: { code: string; message: string }[] = [];
  const fileSeason = workspace.settings.outlook.season;
  const fromFile = Object.keys(sources).filter((name) => sources[name] === "region.json");
  if (fileSeason !== null && fileSeason !== season && fromFile.length > 0) {
    notes.push({
      code: "values-for-another-season",
      message: `the values of ${fromFile.join(", ")} come from region.json, written for the ${fileSeason} season, not ${season}: give this season's values with --values`,
    });
  }
  if (issuedDate.getFullYear() > season) {
    notes.push({ code: "issued-after-season", message: `issued ${format(issuedDate, "yyyy-MM-dd")}, after the ${season} season's year` });
  }
  return { values, issued: format(issuedDate, "yyyy-MM-dd"), season, sources, notes };
}
