import { createHash } from "node:crypto";
import { closeSync, constants, fstatSync, openSync, readSync, statSync } from "node:fs";
import path from "node:path";
import { didYouMean } from "./didYouMean.js";
import { readActivityCsv, readEventsCsv, readModernCsv, readSitesCsv, type Located } from "./fireRecordCsv.js";
import { readIndexCsv } from "./indexCsv.js";
import { InputError, MAX_PROBLEMS_PER_FILE, ProblemList, type InputProblem } from "./InputError.js";
import { echoText, MAX_DATA_FILE_BYTES, MAX_REGION_JSON_BYTES } from "./limits.js";
import { parseRegionJson } from "./regionJson.js";
import type { FireEvent, FireRecordInput, IndexSeries, IndexSettings, InputFile, Site, Warning, Workspace } from "./types.js";

export { DEFAULT_FIRE_YEARS, DEFAULT_METHODS } from "./defaults.js";

/** The name of the settings file inside a region folder. */
export const REGION_FILE = "region.json";

interface LoadedFile {
  readonly bytes: Buffer;
  readonly sha256: string;
}

const MIB = 1024 * 1024;
const bytesText = (bytes: number): string => bytes.toLocaleString("en-US");
const limitText = (limit: number): string => `${limit / MIB} MiB (${bytesText(limit)} bytes)`;

/** What a file system entry that is not a regular file is, for a message. */
function kindOf(info: { isDirectory(): boolean; isFIFO(): boolean; isCharacterDevice(): boolean; isBlockDevice(): boolean; isSocket(): boolean }): string {
  if (info.isDirectory()) return "a folder";
  if (info.isFIFO()) return "a named pipe";
  if (info.isCharacterDevice() || info.isBlockDevice()) return "a device";
  if (info.isSocket()) return "a socket";
  return "not a regular file";
}

function readError(error: unknown, problems: ProblemList): null {
  const code = (error as NodeJS.ErrnoException).code;
  if (code === "ENOENT" || code === "ENOTDIR") problems.add(null, "the file does not exist");
  else if (code === "EISDIR") problems.add(null, "this is a folder, not a file");
  else if (code === "EACCES" || code === "EPERM") problems.add(null, "the file cannot be read (permission denied)");
  else if (code === "ELOOP") problems.add(null, "the file cannot be read (too many levels of symbolic links)");
  else problems.add(null, `the file cannot be read (${echoText(code ?? String(error))})`);
  return null;
}

/**
 * Reads one input file, which must be a regular file of at most `limit` bytes. The entry is
 * checked before it is opened (a folder, device, named pipe or socket is refused, so `/dev/zero`
 * or a FIFO never hangs the reader), opened without blocking, checked again on the open handle,
 * and read with a bound of `limit + 1` bytes (a file that grows past the limit while being read is
 * refused too). The calls are synchronous: a region's few files are read one after the other
 * anyway, and each asynchronous call would wait for a round trip through libuv's thread pool.
 */
function readInputFile(absolute: string, problems: ProblemList, limit: number): LoadedFile | null {
  let info;
  try {
    info = statSync(absolute);
  } catch (error) {
    return readError(error, problems);
  }
  const refuse = (entry: typeof info): boolean => {
    if (entry.isDirectory()) {
      problems.add(null, "this is a folder, not a file");
      return true;
    }
    if (!entry.isFile()) {
      problems.add(null, `this is ${kindOf(entry)}, not a regular file (data files must be regular files)`);
      return true;
    }
    if (entry.size > limit) {
      problems.add(null, `the file is too large: ${bytesText(entry.size)} bytes; at most ${limitText(limit)} is read`);
      return true;
    }
    return false;
  };
  if (refuse(info)) return null;
  let descriptor;
  try {
    descriptor = openSync(absolute, constants.O_RDONLY | constants.O_NONBLOCK);
  } catch (error) {
    return readError(error, problems);
  }
  try {
    const opened = fstatSync(descriptor);
    if (refuse(opened)) return null;
    const buffer = Buffer.alloc(Math.min(opened.size, limit) + 1);
    let filled = 0;
    for (;;) {
      const bytesRead = readSync(descriptor, buffer, filled, buffer.length - filled, filled);
      if (bytesRead === 0) break;
      filled += bytesRead;
      if (filled === buffer.length) {
        if (filled > limit) {
          problems.add(null, `the file is too large: it grew past the limit while being read; at most ${limitText(limit)} is read`);
          return null;
        }
        break;
      }
    }
    const bytes = buffer.subarray(0, filled);
    return { bytes, sha256: createHash("sha256").update(bytes).digest("hex") };
  } catch (error) {
    return readError(error, problems);
  } finally {
    closeSync(descriptor);
  }
}

/**
 * Region-folder reader: reads region.json and every data file it names, validates them all, and
 * returns the typed workspace that every later stage trusts. Defaults are filled in (see
 * `DEFAULT_METHODS`, `DEFAULT_FIRE_YEARS`); monthly index files are averaged over their month
 * window; the SHA-256 and size of every input file are recorded.
 *
 * Every problem of every file is collected before anything is thrown, each as
 * `file:line: what is wrong (what was found)`, with `file` = the region folder as given joined
 * with the file's name (so relative to the current folder when the region was given relatively).
 *
 * @param root - the region folder, absolute or relative to the current working folder
 * @returns the workspace; `warnings` lists what was accepted but is worth a look (repeated fire
 *   events counted once, seasons left missing because a month is missing)
 * @throws InputError listing all problems (at most 20 per file, then "and N more problems"):
 *   missing or unreadable files, entries that are not regular files (folders, devices, named
 *   pipes, sockets), files over the size limit (32 MiB; region.json 1 MiB), files that are empty
 *   or not UTF-8 text, `#` comment lines in CSV files, CSV quoting errors, missing columns, values
 *   that are not numbers or out of range, undeclared missing-value codes in index files, repeated
 *   site ids or years, fire events at unknown sites or outside a site's recording span, text over
 *   its length limit, and every region.json problem (unknown keys with a did-you-mean suggestion)
 * @example
 * const workspace = await loadWorkspace("demo-region");
 * workspace.settings.methods.independenceKm; // => 40 unless region.json sets it
 */
export async function loadWorkspace(given: string): Promise<Workspace> {
  // A path to region.json itself is taken as its folder (an easy slip on the command line).
  const root = path.basename(given) === REGION_FILE ? path.dirname(given) : given;
  const absoluteRoot = path.resolve(root);
  const shown = (relative: string): string => path.join(root, relative);
  const regionProblems = new ProblemList(shown(REGION_FILE));
  const regionFile = readInputFile(path.join(absoluteRoot, REGION_FILE), regionProblems, MAX_REGION_JSON_BYTES);
  if (regionFile === null) {
    throw new InputError(
      regionProblems.toArray().map((problem) =>
        problem.message === "the file does not exist" ? { ...problem, message: `the file does not exist (is ${root} a region folder?)` } : problem,
      ),
    );
  }
  const regionText = decodeText(regionFile.bytes, regionProblems);
  if (regionText === null) throw new InputError(regionProblems.toArray());
  const { settings, files: names } = parseRegionJson(regionText, shown(REGION_FILE));

  const problems: InputProblem[] = [];
  const warnings: Warning[] = [];
  const files: InputFile[] = [{ role: "region", path: REGION_FILE, sha256: regionFile.sha256, bytes: regionFile.bytes.length }];
  const cache = new Map<string, LoadedFile | null>();
  const lists = new Map<string, ProblemList>();
  const listFor = (relative: string): ProblemList => {
    const key = path.normalize(relative);
    let list = lists.get(key);
    if (list === undefined) {
      list = new ProblemList(shown(relative));
      lists.set(key, list);
    }
    return list;
  };
  const load = (role: string, relative: string): Buffer | null => {
    const key = path.normalize(relative);
    if (!cache.has(key)) cache.set(key, readInputFile(path.resolve(absoluteRoot, relative), listFor(relative), MAX_DATA_FILE_BYTES));
    const loaded = cache.get(key) ?? null;
    if (loaded !== null) files.push({ role, path: relative, sha256: loaded.sha256, bytes: loaded.bytes.length });
    return loaded?.bytes ?? null;
  };

  let fireRecord: FireRecordInput;
  if (names.fireRecord.kind === "sites") {
    const sitesName = names.fireRecord.sites;
    const eventsName = names.fireRecord.events;
    const sitesBytes = load("sites", sitesName);
    const eventsBytes = load("events", eventsName);
    const siteProblems = listFor(sitesName);
    const eventProblems = listFor(eventsName);
    const sites = sitesBytes === null ? [] : readSitesCsv(sitesBytes, siteProblems);
    const read = eventsBytes === null ? { events: [], warnings: [] } : readEventsCsv(eventsBytes, eventProblems, shown(eventsName));
    warnings.push(...read.warnings);
    if (sitesBytes !== null && siteProblems.size === 0) checkEventsAgainstSites(read.events, sites, eventProblems, sitesName);
    fireRecord = { kind: "sites", sites: sites.map((s) => s.value), events: read.events.map((e) => e.value) };
  } else {
    const activityName = names.fireRecord.activity;
    const bytes = load("activity", activityName);
    const rows = bytes === null ? [] : readActivityCsv(bytes, listFor(activityName));
    fireRecord = { kind: "activity", rows: rows.map((r) => r.value).sort((a, b) => a.year - b.year) };
  }

  let modern = null;
  if (names.modern !== null) {
    const bytes = load("modern", names.modern);
    modern = bytes === null ? [] : readModernCsv(bytes, listFor(names.modern)).map((r) => r.value).sort((a, b) => a.year - b.year);
  }

  const byFile = new Map<string, IndexSettings[]>();
  for (const index of settings.indices) {
    const key = path.normalize(index.file);
    byFile.set(key, [...(byFile.get(key) ?? []), index]);
  }
  const seriesByName = new Map<string, IndexSeries>();
  for (const index of settings.indices) load(`index:${index.name}`, index.file);
  for (const group of byFile.values()) {
    const first = group[0] as IndexSettings;
    const bytes = cache.get(path.normalize(first.file)) ?? null;
    if (bytes === null) continue;
    const read = readIndexCsv(bytes.bytes, group, listFor(first.file), shown(first.file));
    warnings.push(...read.warnings);
    for (const series of read.series) seriesByName.set(series.name, series);
  }

  for (const list of lists.values()) problems.push(...list.toArray());
  if (problems.length > 0) throw new InputError(problems);
  return {
    root: absoluteRoot,
    shownRoot: root,
    settings,
    fireRecord,
    modern,
    indices: settings.indices.map((index) => seriesByName.get(index.name) as IndexSeries),
    files,
    warnings,
  };
}

/** region.json must be UTF-8 text without NUL bytes. */
function decodeText(bytes: Buffer, problems: ProblemList): string | null {
  if (bytes.includes(0)) {
    problems.add(null, "the file is not text (found a NUL byte)");
    return null;
  }
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    problems.add(null, "the file is not UTF-8 text (found an invalid byte sequence)");
    return null;
  }
}

/** Every event must name a known site and fall inside that site's recording span. */
function checkEventsAgainstSites(
  events: readonly Located<FireEvent>[],
  sites: readonly Located<Site>[],
  problems: ProblemList,
  sitesName: string,
): void {
  const byId = new Map(sites.map((site) => [site.value.id, site.value]));
  const ids = [...byId.keys()];
  // A suggestion compares the id with every site id: compute it once per unknown id, and only for
  // the problems that can be shown (events are in line order, so the first ones).
  const suggestions = new Map<string, string | null>();
  let unknown = 0;
  for (const event of events) {
    const site = byId.get(event.value.site);
    if (site === undefined) {
      unknown++;
      let suggestion = suggestions.get(event.value.site) ?? null;
      if (!suggestions.has(event.value.site) && unknown <= MAX_PROBLEMS_PER_FILE) {
        suggestion = didYouMean(event.value.site, ids);
        suggestions.set(event.value.site, suggestion);
      }
      problems.add(
        event.line,
        `unknown site "${echoText(event.value.site)}" (not in ${echoText(sitesName, 200)}${suggestion === null ? "" : `; did you mean "${echoText(suggestion)}"?`})`,
      );
    } else if (event.value.year < site.firstYear || event.value.year > site.lastYear) {
      problems.add(
        event.line,
        `fire year ${event.value.year} is outside the recording span of site "${echoText(site.id)}" (found ${site.firstYear}–${site.lastYear} in ${echoText(sitesName, 200)})`,
      );
    }
  }
}
