/**
 * The overview of a batch of briefings: one row per region with its headline odds of a
 * high-fire year and their 95% interval, the average year (base rate), the hindcast's skill
 * verdict in a few words (read from the outlook's structured hindcast fields) and the basis of the
 * odds, sorted by the odds (highest first). Regions issued on different dates or for different
 * seasons are said to be so in plain notes. It is written as a CSV
 * (for a spreadsheet) and as a one-page HTML document printed to PDF beside the briefings, with
 * the cautions of SAFETY.md. The numbers are read from each region's outlook JSON, the same
 * object `firephase outlook --json` prints, so the overview cannot disagree with the briefings.
 */
import { formatPercent, formatPercentRange } from "../outlook/describeChance.js";
import { BAND_TEXT } from "./buildBriefingView.js";
import { paletteCss } from "./charts/palette.js";
import { escapeHtml } from "./escapeHtml.js";
import { clipText, formatLongDate, formatMoment } from "./formatValues.js";

/** An estimate with its 95% interval; null where it cannot be computed. */
export interface OverviewChance {
  readonly estimate: number | null;
  readonly lower: number | null;
  readonly upper: number | null;
}

/**
 * The hindcast's verdict in two or three words, for the overview's column:
 * - "Some skill": the hindcast beat the long-term average and the chance test says it is hard to
 *   reach by chance (`hindcast.hasSkill`);
 * - "No skill": the chance test was run and the method did not show skill;
 * - "Not tested": the scores exist but the chance test was not run (`skillPValueReason` says why);
 * - "Too little data": the scores or the chance test could not be computed;
 * - "Does not apply": no current index value was used, so the odds are the average year's and
 *   there is no index-based forecast to check.
 */
export type OverviewSkill = "Some skill" | "No skill" | "Not tested" | "Too little data" | "Does not apply";

/** One region of the overview. */
export interface OverviewRow {
  /** The region's name (region.json `name`), or its folder when it failed before loading. */
  readonly region: string;
  /** The region folder as given on the command line. */
  readonly folder: string;
  readonly status: "briefed" | "failed";
  readonly season: number | null;
  readonly issued: string | null;
  /** Chance of a high-fire year this season (`fireYear` of the outlook JSON). */
  readonly chance: OverviewChance;
  /** Chance in an average year (`baseRate`). */
  readonly baseRate: OverviewChance;
  /**
   * How this season compares with an average year, as the region's briefing says it (`fireYear.comparedWithBase`:
   * by the selection-aware interval when there is one, which allows for the rule's choice of index); null when unknown.
   */
  readonly compared: "higher" | "lower" | "not distinguishable" | null;
  /** The selection-aware 95% interval of this season's chance (`fireYear.selectionInterval`), null when none. */
  readonly selection: OverviewChance;
  /** Whether the hindcast shows skill (`hindcast.hasSkill`), null when unknown. */
  readonly hasSkill: boolean | null;
  /** The verdict in words ({@link OverviewSkill}), from the outlook's structured fields; null when unknown. */
  readonly skill: OverviewSkill | null;
  /** The hindcast's verdict sentence (`hindcast.verdict`). */
  readonly verdict: string;
  /** Which past years the odds are read from (`fireYear.basis`). */
  readonly basis: string;
  /** The indices whose value this season is provisional (`current[].provisional`: its window is not complete yet). */
  readonly provisional: readonly string[];
  /** The briefing PDF written, or null. */
  readonly pdf: string | null;
  /** For a failed region: how many problems it had, and the first of them. */
  readonly problem: string | null;
}

function asRecord(value: unknown): Record<string, unknown> {
  return typeof value === "object" && value !== null ? (value as Record<string, unknown>) : {};
}

function finiteOrNull(value: unknown): number | null {
  return typeof value === "number" && Number.isFinite(value) ? value : null;
}

function chanceOf(value: unknown): OverviewChance {
  const record = asRecord(value);
  return { estimate: finiteOrNull(record["estimate"]), lower: finiteOrNull(record["lower"]), upper: finiteOrNull(record["upper"]) };
}

/**
 * The short verdict of an outlook JSON's hindcast, read from its structured fields (never from the
 * verdict sentence): `current` (no current index value: "Does not apply"), `hindcast.hasSkill`,
 * `hindcast.brierSkillScore`, `hindcast.skillPValue` and `hindcast.skillPValueReason`, by the rule
 * of the hindcast's verdict (skill only when the Brier skill score is above 0 and its permutation
 * p-value at most 0.05).
 *
 * @param outlookJson - the object `firephase outlook --json` prints for the region.
 * @returns the verdict in words, or null when the JSON lacks the fields.
 * @throws never.
 * @example
 * overviewSkill({ current: [{ index: "ENSO" }], hindcast: { hasSkill: false, brierSkillScore: 0.02, skillPValue: 0.31 } }); // => "No skill"
 */
export function overviewSkill(outlookJson: unknown): OverviewSkill | null {
  const outlook = asRecord(outlookJson);
  const current = outlook["current"];
  if (Array.isArray(current) && current.length === 0) return "Does not apply";
  const hindcast = asRecord(outlook["hindcast"]);
  const hasSkill = hindcast["hasSkill"];
  if (typeof hasSkill !== "boolean") return null;
  if (hasSkill) return "Some skill";
  const score = finiteOrNull(hindcast["brierSkillScore"]);
  const p = finiteOrNull(hindcast["skillPValue"]);
  if (score !== null && p === null && typeof hindcast["skillPValueReason"] === "string") return "Not tested";
  if (score === null || p === null) return "Too little data";
  return "No skill";
}

/**
 * The overview row of a briefed region, read from its outlook JSON (schema firephase.outlook/1).
 *
 * @param outlookJson - the object `firephase outlook --json` prints for the region.
 * @param folder - the region folder as given.
 * @param pdf - the briefing PDF written for it.
 * @returns the row; a number the JSON lacks is null.
 * @throws never.
 * @example
 * overviewRowFromOutlook({ region: { name: "North unit" }, fireYear: { estimate: 0.3, lower: 0.2, upper: 0.4, basis: "…" }, … }, "north", "/out/briefing-north-2027-2027-03-10.pdf").chance.estimate; // => 0.3
 */
export function overviewRowFromOutlook(outlookJson: unknown, folder: string, pdf: string | null): OverviewRow {
  const outlook = asRecord(outlookJson);
  const fireYear = asRecord(outlook["fireYear"]);
  const hindcast = asRecord(outlook["hindcast"]);
  const name = asRecord(outlook["region"])["name"];
  return {
    region: typeof name === "string" ? name : folder,
    folder,
    status: "briefed",
    season: finiteOrNull(outlook["season"]),
    issued: typeof outlook["issued"] === "string" ? outlook["issued"] : null,
    chance: chanceOf(fireYear),
    baseRate: chanceOf(outlook["baseRate"]),
    compared: fireYear["comparedWithBase"] === "higher" || fireYear["comparedWithBase"] === "lower" || fireYear["comparedWithBase"] === "not distinguishable" ? fireYear["comparedWithBase"] : null,
    selection: fireYear["selectionInterval"] === null || fireYear["selectionInterval"] === undefined ? { estimate: null, lower: null, upper: null } : { ...chanceOf(fireYear["selectionInterval"]), estimate: null },
    hasSkill: typeof hindcast["hasSkill"] === "boolean" ? hindcast["hasSkill"] : null,
    skill: overviewSkill(outlookJson),
    verdict: typeof hindcast["verdict"] === "string" ? hindcast["verdict"] : "",
    basis: typeof fireYear["basis"] === "string" ? fireYear["basis"] : "",
    provisional: Array.isArray(outlook["current"])
      ? outlook["current"].map(asRecord).filter((entry) => entry["provisional"] === true && typeof entry["index"] === "string").map((entry) => entry["index"] as string)
      : [],
    pdf,
    problem: null,
  };
}

/**
 * The overview row of a region that could not be briefed.
 *
 * @param folder - the region folder as given.
 * @param problems - its problems as printed (`file:line: message` lines), at least one.
 * @returns a row with no numbers and the first problem.
 * @throws never.
 * @example
 * failedOverviewRow("south", ["south/region.json:3: name is missing"]).problem; // => "south/region.json:3: name is missing"
 */
export function failedOverviewRow(folder: string, problems: readonly string[]): OverviewRow {
  const none: OverviewChance = { estimate: null, lower: null, upper: null };
  const first = problems[0] ?? "failed";
  return {
    region: folder,
    folder,
    status: "failed",
    season: null,
    issued: null,
    chance: none,
    baseRate: none,
    compared: null,
    selection: { estimate: null, lower: null, upper: null },
    hasSkill: null,
    skill: null,
    verdict: "",
    basis: "",
    provisional: [],
    pdf: null,
    problem: problems.length > 1 ? `${first} (and ${problems.length - 1} more)` : first,
  };
}

/**
 * Rows in overview order: briefed regions by their odds of a high-fire year, highest first
 * (ties and missing odds: by the upper end of the interval, then by name; a region without odds
 * after those with odds), then the failed regions in the order given.
 *
 * @param rows - the rows in any order.
 * @returns a new sorted array.
 * @throws never.
 * @example
 * sortOverviewRows([a20, b35, failed]).map((row) => row.region); // => ["b", "a", "failed"]
 */
export function sortOverviewRows(rows: readonly OverviewRow[]): OverviewRow[] {
  const briefed = rows.filter((row) => row.status === "briefed");
  const failed = rows.filter((row) => row.status === "failed");
  const key = (value: number | null): number => (value === null ? -1 : value);
  briefed.sort(
    (a, b) =>
      key(b.chance.estimate) - key(a.chance.estimate) ||
      key(b.chance.upper) - key(a.chance.upper) ||
      (a.region < b.region ? -1 : a.region > b.region ? 1 : 0),
  );
  return [...briefed, ...failed];
}

/**
 * The rank of each row of {@link sortOverviewRows}' order: 1 for the highest odds, the same rank for rows with
 * the same odds and interval (ranked 1, 1, 3), null for failed regions.
 *
 * @param sorted - rows in sortOverviewRows order.
 * @returns one rank per row.
 * @throws never.
 * @example
 * overviewRanks(sortOverviewRows([north35, south35, east20])); // => [1, 1, 3]
 */
export function overviewRanks(sorted: readonly OverviewRow[]): (number | null)[] {
  const same = (a: OverviewChance, b: OverviewChance): boolean => a.estimate === b.estimate && a.lower === b.lower && a.upper === b.upper;
  const ranks: (number | null)[] = [];
  sorted.forEach((row, position) => {
    if (row.status !== "briefed") {
      ranks.push(null);
      return;
    }
    const previous = sorted[position - 1];
    ranks.push(position > 0 && previous !== undefined && previous.status === "briefed" && same(previous.chance, row.chance) ? (ranks[position - 1] as number) : position + 1);
  });
  return ranks;
}

/** CSV columns of the overview, in order. */
export const OVERVIEW_CSV_COLUMNS: readonly string[] = Object.freeze([
  "rank",
  "region",
  "folder",
  "status",
  "season",
  "issued",
  "chance",
  "chance_lower",
  "chance_upper",
  "base_rate",
  "base_rate_lower",
  "base_rate_upper",
  "compared_with_average",
  "selection_lower",
  "selection_upper",
  "has_skill",
  "skill",
  "skill_verdict",
  "basis",
  "pdf",
  "problem",
]);

/**
 * One CSV cell (RFC 4180): quoted when it holds a comma, quote or line break; text that a
 * spreadsheet would run as a formula (starting with =, +, -, @, tab or carriage return) is
 * prefixed with an apostrophe.
 */
function csvCell(value: string | number | boolean | null): string {
  if (value === null) return "";
  if (typeof value === "number") return Number.isFinite(value) ? String(value) : "";
  if (typeof value === "boolean") return value ? "yes" : "no";
  const safe = /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/**
 * The overview as CSV text: a header of {@link OVERVIEW_CSV_COLUMNS}, then one line per region in
 * {@link sortOverviewRows} order. Probabilities are written as the outlook JSON holds them
 * (shares 0–1, full precision); an empty cell is a value that cannot be computed or a failed region.
 *
 * @param rows - the rows (sorted here).
 * @returns CSV text with LF line ends, ending in a line end.
 * @throws never.
 * @example
 * overviewCsv([]).split("\n")[0]; // => "rank,region,folder,status,season,issued,chance,…"
 * @see Shafranovich Y. (2005), RFC 4180: Common Format and MIME Type for Comma-Separated Values (CSV) Files.
 */
export function overviewCsv(rows: readonly OverviewRow[]): string {
  const lines = [OVERVIEW_CSV_COLUMNS.join(",")];
  const sorted = sortOverviewRows(rows);
  const ranks = overviewRanks(sorted);
  sorted.forEach((row, position) => {
    lines.push(
      [
        ranks[position] ?? null,
        row.region,
        row.folder,
        row.status,
        row.season,
        row.issued,
        row.chance.estimate,
        row.chance.lower,
        row.chance.upper,
        row.baseRate.estimate,
        row.baseRate.lower,
        row.baseRate.upper,
        row.compared,
        row.selection.lower,
        row.selection.upper,
        row.hasSkill,
        row.skill,
        row.verdict,
        row.basis,
        row.pdf,
        row.problem,
      ]
        .map(csvCell)
        .join(","),
    );
  });
  return `${lines.join("\n")}\n`;
}

/** Bullets of one `## heading` section of a Markdown text (continuation lines joined). */
function sectionBullets(markdown: string, heading: string): string[] {
  const lines = markdown.replace(/\r\n?/g, "\n").split("\n");
  const start = lines.findIndex((line) => line.trim().toLowerCase() === `## ${heading}`.toLowerCase());
  if (start < 0) return [];
  const bullets: string[] = [];
  for (const line of lines.slice(start + 1)) {
    if (/^#{1,2}\s/.test(line)) break;
    if (/^\s*[-*]\s+/.test(line)) bullets.push(line.replace(/^\s*[-*]\s+/, "").trim());
    else if (line.trim() !== "" && bullets.length > 0) bullets[bullets.length - 1] = `${bullets[bullets.length - 1]} ${line.trim()}`;
  }
  return bullets;
}

/**
 * The core cautions of SAFETY.md for the overview page: the first point of "What this outlook
 * is" (a statistical, long-range outlook) and every point of "What it is not" (official outlooks
 * come first; never for tactical or evacuation decisions), as plain sentences.
 *
 * @param safetyMarkdown - the text of SAFETY.md.
 * @returns the sentences, in the file's order.
 * @throws Error when SAFETY.md lacks either section: the overview is never made without them.
 * @example
 * coreCautions(safetyText)[1]; // => "Not a substitute for official agency seasonal outlooks, …"
 */
export function coreCautions(safetyMarkdown: string): string[] {
  const is = sectionBullets(safetyMarkdown, "What this outlook is");
  const isNot = sectionBullets(safetyMarkdown, "What it is not");
  if (is.length === 0 || isNot.length === 0) {
    throw new Error('SAFETY.md has no "What this outlook is" or "What it is not" points: the overview is never made without its cautions');
  }
  const plain = (text: string): string => text.replace(/\*\*|__|`/g, "");
  return [plain(is[0] ?? ""), ...isNot.map(plain)];
}

/** What the overview page shows besides the rows. */
export interface OverviewPageOptions {
  /** Sentences from {@link coreCautions}. */
  readonly cautions: readonly string[];
  /** The moment the overview was made (ISO 8601), shown in its heading. */
  readonly madeAt: string;
  readonly toolVersion: string;
  /** `@font-face` CSS (embedded fonts), or "" for the system sans-serif. */
  readonly fontCss: string;
}

/** A briefed region's name as the overview's notes list it (at most 60 characters), with its folder when another region has the same name. */
function shownName(row: OverviewRow, rows: readonly OverviewRow[]): string {
  const shared = rows.some((other) => other !== row && other.status === "briefed" && other.region === row.region);
  return shared ? `${clipText(row.region, 60)} in ${clipText(row.folder, 60)}` : clipText(row.region, 60);
}

/** Names in a sentence: at most five, then "and N more". */
function nameList(names: readonly string[]): string {
  const shown = names.slice(0, 5).join(", ");
  return names.length > 5 ? `${shown} and ${names.length - 5} more` : shown;
}

/** Distinct values of the briefed rows, ascending, each with the regions that have it (in overview order). */
function groupsOf<K extends string | number>(rows: readonly OverviewRow[], key: (row: OverviewRow) => K | null): { readonly key: K; readonly names: string[] }[] {
  const groups = new Map<K, string[]>();
  for (const row of sortOverviewRows(rows)) {
    if (row.status !== "briefed") continue;
    const value = key(row);
    if (value === null) continue;
    const names = groups.get(value) ?? [];
    names.push(shownName(row, rows));
    groups.set(value, names);
  }
  return [...groups.entries()].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)).map(([value, names]) => ({ key: value, names }));
}

/** Words joined as "a", "a and b", "a, b and c". */
function andList(words: readonly string[]): string {
  return words.length <= 1 ? (words[0] ?? "") : `${words.slice(0, -1).join(", ")} and ${words[words.length - 1]}`;
}

/**
 * The plain notes of an overview whose regions were not all issued on the same date or for the
 * same fire season (regions take their dates from their own region.json unless `--issued` and
 * `--season` are given): each date or season (ascending) with the regions that have it, in
 * {@link sortOverviewRows} order.
 *
 * @param rows - the rows in any order (failed regions are not counted).
 * @returns no note when the briefed regions share their issue date and season; else one note for
 *   the dates and one for the seasons, whichever differ.
 * @throws never.
 * @example
 * overviewDateNotes([north10March, ridge15March])[0]; // => "Regions were issued on different dates: 10 March 2027 (North); 15 March 2027 (Ridge). Each region's odds use what was known on its own date."
 */
export function overviewDateNotes(rows: readonly OverviewRow[]): string[] {
  const notes: string[] = [];
  const dates = groupsOf(rows, (row) => row.issued);
  if (dates.length > 1) {
    notes.push(
      `Regions were issued on different dates: ${dates.map((group) => `${formatLongDate(group.key)} (${nameList(group.names)})`).join("; ")}. ` +
        "Each region's odds use what was known on its own date.",
    );
  }
  const seasons = groupsOf(rows, (row) => row.season);
  if (seasons.length > 1) {
    notes.push(
      `The regions' fire seasons differ: ${seasons.map((group) => `${group.key} (${nameList(group.names)})`).join("; ")}. ` +
        "Odds for different seasons are not the same question: compare those rows with care.",
    );
  }
  return notes;
}

/**
 * The overview's note on provisional values: the regions whose odds use an index value computed from a window
 * that is not complete yet (`current[].provisional` of their outlooks), as each briefing says on its page 1.
 *
 * @param rows - the rows in any order (failed regions are not counted).
 * @returns the note, or null when no briefed region has a provisional value.
 * @throws never.
 * @example
 * overviewProvisionalNote(rows); // => "Provisional index values: North (PMI); South (PMI). Their windows are not complete yet, …"
 */
export function overviewProvisionalNote(rows: readonly OverviewRow[]): string | null {
  const provisional = sortOverviewRows(rows).filter((row) => row.status === "briefed" && row.provisional.length > 0);
  if (provisional.length === 0) return null;
  return (
    `Provisional index values: ${provisional.map((row) => `${row.region} (${row.provisional.join(", ")})`).join("; ")}. ` +
    "Their windows are not complete yet, so those odds may change when the remaining months are in; each briefing says which months it used."
  );
}

/**
 * The heading line of the overview, in the words of the single briefings' header
 * ("Issued 10 March 2027" "for the 2027 fire season"), for several dates or seasons too.
 *
 * @param rows - the rows in any order.
 * @returns the issue text and the season text ("" when no briefed region has one).
 * @throws never.
 * @example
 * overviewDateline(rows); // => { issuedText: "Issued 10 March 2027", seasonText: "for the 2027 fire season" }
 */
export function overviewDateline(rows: readonly OverviewRow[]): { readonly issuedText: string; readonly seasonText: string } {
  const dates = groupsOf(rows, (row) => row.issued).map((group) => group.key);
  const seasons = groupsOf(rows, (row) => row.season).map((group) => String(group.key));
  const issuedText =
    dates.length === 0
      ? ""
      : dates.length === 1
        ? `Issued ${formatLongDate(dates[0] as string)}`
        : `Issued on ${dates.length} different dates, ${formatLongDate(dates[0] as string)} to ${formatLongDate(dates[dates.length - 1] as string)}`;
  const seasonText = seasons.length === 0 ? "" : seasons.length === 1 ? `for the ${seasons[0]} fire season` : `for the ${andList(seasons)} fire seasons`;
  return { issuedText, seasonText };
}

/**
 * The footer of every overview page (beside "page x of y"), like the single briefings' footer
 * ("… · fire-season outlook 2027 · Issued 10 March 2027").
 *
 * @param rows - the rows in any order.
 * @returns the footer text.
 * @throws never.
 * @example
 * overviewFooterText(rows); // => "Overview of 3 regions · fire-season outlook 2027 · Issued 10 March 2027"
 */
export function overviewFooterText(rows: readonly OverviewRow[]): string {
  const seasons = groupsOf(rows, (row) => row.season).map((group) => String(group.key));
  const dates = groupsOf(rows, (row) => row.issued).map((group) => group.key);
  const parts = [`Overview of ${rows.length} region${rows.length === 1 ? "" : "s"}`];
  if (seasons.length > 0) parts.push(`fire-season outlook${seasons.length === 1 ? "" : "s"} ${andList(seasons)}`);
  if (dates.length === 1) parts.push(`Issued ${formatLongDate(dates[0] as string)}`);
  else if (dates.length > 1) parts.push(`Issued ${formatLongDate(dates[0] as string)} to ${formatLongDate(dates[dates.length - 1] as string)}`);
  return parts.join(" · ");
}

function chanceCell(chance: OverviewChance): string {
  if (chance.estimate === null) return `<td class="num">${escapeHtml(formatPercent(null))}</td><td></td>`;
  return `<td class="num strong">${escapeHtml(formatPercent(chance.estimate))}</td><td class="num muted">${escapeHtml(formatPercentRange(chance.lower, chance.upper))}</td>`;
}

/**
 * The overview as one self-contained HTML page (no script, no external resource): a header band
 * saying it is not an official forecast, the issue date and season and the moment it was made
 * (written as the single briefings write them), the notes of {@link overviewDateNotes} and
 * {@link overviewProvisionalNote}, a table of
 * every region in {@link sortOverviewRows} order, the regions that could not be briefed, and the
 * cautions. Every text is escaped.
 *
 * @param rows - the rows (sorted here).
 * @param options - cautions, date, version, fonts.
 * @returns a complete HTML document for {@link PdfPrinter.print}.
 * @throws never.
 * @example
 * overviewHtml(rows, { cautions, madeAt: "2027-03-10T08:00:00Z", toolVersion: "0.1.0", fontCss: "" }).startsWith("<!DOCTYPE html>"); // => true
 */
/**
 * The comparison with the average year in a few words, as the region's briefing makes it: "higher" or "lower"
 * only when the intervals do not overlap — the interval that allows for the rule's choice of index when the
 * outlook has one — else "not clearly different", with that interval when it is the reason.
 */
export function comparedWords(row: OverviewRow): string {
  const selection =
    row.selection.lower !== null && row.selection.upper !== null
      ? ` (allowing for the choice of index: ${formatPercentRange(row.selection.lower, row.selection.upper)})`
      : "";
  switch (row.compared) {
    case "higher":
      return "Higher";
    case "lower":
      return "Lower";
    case "not distinguishable":
      return `Not clearly different${selection}`;
    default:
      return "Not known";
  }
}

export function overviewHtml(rows: readonly OverviewRow[], options: OverviewPageOptions): string {
  const sorted = sortOverviewRows(rows);
  const briefed = sorted.filter((row) => row.status === "briefed");
  const failed = sorted.filter((row) => row.status === "failed");
  const dateline = overviewDateline(sorted);
  const provisionalNote = overviewProvisionalNote(sorted);
  const dateNotes = [...overviewDateNotes(sorted), ...(provisionalNote === null ? [] : [provisionalNote])];
  const counts = `${briefed.length} region${briefed.length === 1 ? "" : "s"} briefed` + (failed.length > 0 ? `, ${failed.length} not briefed` : "");
  // With several dates or seasons, each row says its own (only what differs).
  const datesDiffer = groupsOf(sorted, (row) => row.issued).length > 1;
  const seasonsDiffer = groupsOf(sorted, (row) => row.season).length > 1;
  const rowDates = (row: OverviewRow): string =>
    (datesDiffer && row.issued !== null ? `<div class="muted small">Issued ${escapeHtml(formatLongDate(row.issued))}</div>` : "") +
    (seasonsDiffer && row.season !== null ? `<div class="muted small">${escapeHtml(String(row.season))} season</div>` : "");
  const ranks = overviewRanks(briefed);
  const body = briefed
    .map(
      (row, position) =>
        `<tr><td class="num">${ranks[position] ?? ""}</td><td><div class="strong">${escapeHtml(row.region)}</div><div class="muted small">${escapeHtml(row.folder)}</div>${rowDates(row)}</td>` +
        `${chanceCell(row.chance)}${chanceCell(row.baseRate)}` +
        `<td class="small">${escapeHtml(comparedWords(row))}</td>` +
        `<td class="skill">${escapeHtml(row.skill ?? "Not known")}</td>` +
        `<td class="small">${escapeHtml(row.basis)}</td></tr>`,
    )
    .join("\n");
  const failedList =
    failed.length === 0
      ? ""
      : `<h2>Not briefed</h2><ul class="small">${failed.map((row) => `<li><span class="strong">${escapeHtml(row.folder)}</span>: ${escapeHtml(row.problem ?? "failed")}</li>`).join("")}</ul>`;
  const notesBox = dateNotes.length === 0 ? "" : `<div class="dates-differ">${dateNotes.map((note) => `<p>${escapeHtml(note)}</p>`).join("")}</div>`;
  return `<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; font-src data:; img-src data:">
<title>Overview of the briefings</title>
<style>
${options.fontCss}
${paletteCss()}
@page { size: auto; }
body { font-family: 'Source Sans 3', sans-serif; color: var(--fp-ink); font-size: 8.5pt; margin: 0; }
.band { background: var(--fp-band); color: var(--fp-paper); padding: 4pt 8pt; font-size: 8.5pt; font-weight: 600; }
h1 { color: var(--fp-heading); font-size: 16pt; margin: 10pt 0 2pt; }
h2 { color: var(--fp-heading); font-size: 11pt; margin: 10pt 0 4pt; }
.dateline { font-size: 11pt; margin: 0 0 2pt; }
.sub { color: var(--fp-inkMuted); margin: 0 0 8pt; }
.dates-differ { border: 1pt solid var(--fp-ink); border-left-width: 3pt; background: var(--fp-panel); padding: 3pt 8pt; margin: 0 0 8pt; }
.dates-differ p { margin: 2pt 0; }
td.skill { white-space: nowrap; font-weight: 600; }
table { border-collapse: collapse; width: 100%; }
th { text-align: left; font-weight: 600; border-bottom: 1.2pt solid var(--fp-rule); padding: 3pt 4pt; font-size: 8.5pt; color: var(--fp-heading); }
td { border-bottom: 0.5pt solid var(--fp-grid); padding: 2pt 4pt; vertical-align: top; }
tr { break-inside: avoid; }
.num { text-align: right; white-space: nowrap; }
.strong { font-weight: 600; }
.muted { color: var(--fp-inkMuted); }
.small { font-size: 7.5pt; }
.cautions { background: var(--fp-panel); border-left: 3pt solid var(--fp-band); padding: 4pt 8pt; margin-top: 10pt; }
.cautions li { margin: 2pt 0; }
</style></head>
<body>
<div class="band">${escapeHtml(BAND_TEXT)}</div>
<h1>Overview of the briefings: odds of a high-fire year</h1>
<p class="dateline"><strong>${escapeHtml(dateline.issuedText)}</strong> ${escapeHtml(dateline.seasonText)}</p>
<p class="sub">${escapeHtml(counts)} · Made ${escapeHtml(formatMoment(options.madeAt))} with firephase ${escapeHtml(options.toolVersion)}. Sorted by this season's odds, highest first; each region's briefing explains its odds and its hindcast.</p>
${notesBox}
<table>
<thead><tr><th class="num">#</th><th>Region</th><th class="num">This season</th><th class="num">95% interval</th><th class="num">Average year</th><th class="num">95% interval</th><th>Against the average year</th><th>Hindcast skill</th><th>Odds read from</th></tr></thead>
<tbody>
${body}
</tbody></table>
${failedList}
<div class="cautions"><h2>Cautions</h2><ul>${options.cautions.map((text) => `<li>${escapeHtml(text)}</li>`).join("")}</ul></div>
</body></html>
`;
}
