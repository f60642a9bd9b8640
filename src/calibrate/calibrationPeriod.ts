import type { FireActivity } from "../record/types.js";
import type { IndexSeries, RegionSettings } from "../workspace/types.js";

/**
 * The calibration period and its years. With `calibration` set in region.json that period is used;
 * otherwise the default is the full overlap of the fire record and the indices: from the later of
 * the first usable fire-record year and the first year any index has a value, to the earlier of the
 * last usable fire-record year and the last year any index has a value. Calibration years are the
 * years of the period whose fire record meets `minSitesRecording`.
 */
export function calibrationPeriod(
  settings: RegionSettings,
  activity: FireActivity,
  indices: readonly IndexSeries[],
): { first: number; last: number; years: number[] } {
  const usable = activity.usableYears;
  let first: number;
  let last: number;
  if (settings.calibration !== null) {
    first = settings.calibration.first;
    last = settings.calibration.last;
  } else {
    const indexYears = indices.flatMap((series) => series.years.filter((_, i) => series.values[i] !== null));
    const fireFirst = usable[0] ?? Infinity;
    const fireLast = usable[usable.length - 1] ?? -Infinity;
    first = Math.max(fireFirst, Math.min(...indexYears));
    last = Math.min(fireLast, Math.max(...indexYears));
  }
  const years = usable.filter((year) => year >= first && year <= last);
  return { first, last, years };
}
