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
    // Loops, not Math.min(...array): a spread of a long array overflows the call stack.
    let indexFirst = Infinity;
    let indexLast = -Infinity;
    for (const series of indices) {
      for (let i = 0; i < series.years.length; i++) {
        if (series.values[i] === null || series.values[i] === undefined) continue;
        const year = series.years[i] as number;
        if (year < indexFirst) indexFirst = year;
        if (year > indexLast) indexLast = year;
      }
    }
    const fireFirst = usable[0] ?? Infinity;
    const fireLast = usable[usable.length - 1] ?? -Infinity;
    first = Math.max(fireFirst, indexFirst);
    last = Math.min(fireLast, indexLast);
  }
  const years = usable.filter((year) => year >= first && year <= last);
  return { first, last, years };
}
