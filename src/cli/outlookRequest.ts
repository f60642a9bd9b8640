import { format, isValid, parseISO } from "date-fns";
import type { OutlookRequest } from "../outlook/buildOutlook.js";
import type { Workspace } from "../workspace/types.js";
import { UsageError } from "./errors.js";

export interface OutlookOptions {
  readonly values?: string;
  readonly issued?: string;
  readonly season?: string;
}

/**
 * The outlook request from region.json and the command line: current values from
 * `outlook.values`, each overridden by `--values NAME=V,…`; the issue date from `--issued`, then
 * region.json, then today; the season from `--season`, then region.json, then the issue year.
 *
 * @throws UsageError (exit 2) for an unknown index name (listing the known ones), a value that is
 *   not a number, a date that is not YYYY-MM-DD, or a season that is not a whole year
 */
export function resolveOutlookRequest(workspace: Workspace, options: OutlookOptions, today: Date): OutlookRequest {
  const known = workspace.settings.indices.map((index) => index.name);
  const values: Record<string, number> = { ...workspace.settings.outlook.values };
  if (options.values !== undefined) {
    for (const part of options.values.split(",")) {
      const trimmed = part.trim();
      if (trimmed === "") continue;
      const equals = trimmed.indexOf("=");
      if (equals <= 0) throw new UsageError(`--values: expected NAME=VALUE, found "${trimmed}"`);
      const name = trimmed.slice(0, equals).trim();
      const text = trimmed.slice(equals + 1).trim();
      if (!known.includes(name)) {
        throw new UsageError(`--values: unknown index "${name}"; this region's indices are ${known.join(", ")}`);
      }
      const value = Number(text);
      if (text === "" || !Number.isFinite(value)) throw new UsageError(`--values: ${name} must be a number, found "${text}"`);
      values[name] = value;
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
    season = workspace.settings.outlook.season ?? issuedDate.getFullYear();
  }
  return { values, issued: format(issuedDate, "yyyy-MM-dd"), season };
}
