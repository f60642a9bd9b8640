/**
 * Analog years: the k calibration years nearest the current index values in standardized index
 * space — each index as a z-score over the calibration period, Euclidean distance over the indices
 * with a current value — sorted by distance, ties by year. Years missing any of those indices are
 * not candidates. (Nearest-neighbour analogs are common practice in seasonal outlooks.)
 *
 * @param current - current value per index name
 * @param moments - mean and standard deviation of each index over the calibration period
 * @param candidates - candidate years with their index values
 * @param k - how many analogs (fewer when fewer candidates)
 */
export function analogYears(
  current: ReadonlyMap<string, number>,
  moments: ReadonlyMap<string, { mean: number; sd: number }>,
  candidates: readonly { year: number; values: ReadonlyMap<string, number> }[],
  k: number,
): { year: number; distance: number }[] {
  const names = [...current.keys()].filter((name) => {
    const m = moments.get(name);
    return m !== undefined && Number.isFinite(m.sd) && m.sd > 0;
  });
  if (names.length === 0) return [];
  const scored: { year: number; distance: number }[] = [];
  for (const candidate of candidates) {
    let sum = 0;
    let complete = true;
    for (const name of names) {
      const value = candidate.values.get(name);
      if (value === undefined) {
        complete = false;
        break;
      }
      const { sd } = moments.get(name) as { mean: number; sd: number };
      const difference = (value - (current.get(name) as number)) / sd;
      sum += difference * difference;
    }
    if (complete) scored.push({ year: candidate.year, distance: Math.sqrt(sum) });
  }
  scored.sort((a, b) => a.distance - b.distance || a.year - b.year);
  return scored.slice(0, Math.max(0, k));
}
