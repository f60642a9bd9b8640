import type { KeptOutlook, SinceChange, SinceLastBriefing } from "./types.js";

/** A value counts as changed when it moved by more than this, in index units (kept values are printed to 2 decimals). */
export const VALUE_CHANGE = 0.005;

const percent = (p: number): string => `${Math.round(p * 100)}%`;
const signed = (value: number): string => (value < 0 ? `\u2212${Math.abs(value).toFixed(2)}` : value.toFixed(2));

/**
 * What changed since the last briefing: compares the outlook being issued with the most recent
 * kept outlook of the same season issued before it, or — when there is none — with the most
 * recent kept outlook of the previous season. Lists the indices whose value moved by more than
 * {@link VALUE_CHANGE} (or that appeared or went), the indices whose phase changed, and the
 * chance of a high-fire year and the category odds then and now, with one plain sentence.
 *
 * @param current - the outlook being issued (read as a kept outlook)
 * @param kept - the outlooks kept before it (the current one may be among them; it is skipped)
 * @returns the changes, or null when no earlier outlook of this or the previous season is kept
 * @example
 * sinceLastBriefing(marchOutlook, [februaryOutlook]);
 * // => { previous: { season: 2027, issued: "2027-02-01", … }, phases: [{ index: "ENSO", before: "neutral", now: "warm" }], sentence: "…" }
 */
export function sinceLastBriefing(current: KeptOutlook, kept: readonly KeptOutlook[]): SinceLastBriefing | null {
  const earlier = kept.filter((outlook) => outlook.issued < current.issued || (outlook.issued === current.issued && outlook.season < current.season));
  const latest = (season: number): KeptOutlook | null => {
    let best: KeptOutlook | null = null;
    for (const outlook of earlier) {
      if (outlook.season !== season) continue;
      if (best === null || outlook.issued > best.issued || (outlook.issued === best.issued && outlook.file > best.file)) best = outlook;
    }
    return best;
  };
  const sameSeason = latest(current.season);
  const previous = sameSeason ?? latest(current.season - 1);
  if (previous === null) return null;
  const relation = sameSeason !== null ? "same season" : "previous season";

  const valueBefore = new Map(previous.values.map((entry) => [entry.index, entry.value]));
  const valueNow = new Map(current.values.map((entry) => [entry.index, entry.value]));
  const names = (a: Iterable<string>, b: Iterable<string>): string[] => {
    const out: string[] = [];
    for (const name of [...a, ...b]) if (!out.includes(name)) out.push(name);
    return out;
  };
  const values: SinceChange<number>[] = [];
  for (const index of names(valueNow.keys(), valueBefore.keys())) {
    const before = valueBefore.get(index) ?? null;
    const now = valueNow.get(index) ?? null;
    if (before === null || now === null ? before !== now : Math.abs(now - before) > VALUE_CHANGE) values.push({ index, before, now });
  }
  const phaseBefore = new Map(previous.phases.map((entry) => [entry.index, entry.label]));
  const phaseNow = new Map(current.phases.map((entry) => [entry.index, entry.label]));
  const phases: SinceChange<string>[] = [];
  for (const index of names(phaseNow.keys(), phaseBefore.keys())) {
    const before = phaseBefore.get(index) ?? null;
    const now = phaseNow.get(index) ?? null;
    if (before !== now) phases.push({ index, before, now });
  }

  const parts: string[] = [];
  for (const change of phases) {
    parts.push(
      change.before === null
        ? `${change.index} now ${change.now} (no phase then)`
        : change.now === null
          ? `${change.index} was ${change.before} (no value now)`
          : `${change.index} moved from ${change.before} to ${change.now}`,
    );
  }
  const phaseNames = new Set(phases.map((change) => change.index));
  const quiet = values.filter((change) => !phaseNames.has(change.index) && change.before !== null && change.now !== null);
  if (quiet.length > 0) {
    parts.push(`${quiet.map((change) => `${change.index} ${signed(change.before as number)} → ${signed(change.now as number)}`).join(", ")} within the same phase`);
  }
  const before = previous.probability;
  const now = current.probability;
  const oddsWords =
    percent(before) === percent(now)
      ? `the chance of a high-fire year is unchanged at ${percent(now)}`
      : `the chance of a high-fire year ${now > before ? "rose" : "fell"} from ${percent(before)} to ${percent(now)}`;
  const opening = `Since the outlook of ${previous.issued}${relation === "previous season" ? ` for the ${previous.season} season` : ""}: `;
  const sentence = `${opening}${parts.length === 0 ? "no index changed phase; " : `${parts.join("; ")}; `}${oddsWords}.`;
  return {
    previous: { season: previous.season, issued: previous.issued, file: previous.file },
    relation,
    values,
    phases,
    fireYear: { before, now },
    categories: previous.categories !== null && current.categories !== null ? { before: previous.categories, now: current.categories } : null,
    sentence,
  };
}
