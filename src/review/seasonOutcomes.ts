import { activityByYear } from "../calibrate/activityByYear.js";
import type { Calibration } from "../calibrate/types.js";
import { activityCategories, categoryOf } from "../record/activityCategories.js";
import { compositeFireRecord } from "../record/composite.js";
import type { Workspace } from "../workspace/types.js";
import type { ReviewCategory, SeasonOutcome } from "./types.js";

/** The records a season's outcome is read from (see {@link seasonOutcome}). */
export interface OutcomeRecords {
  /** The modern record: its measure per year, the modern high-fire threshold and tercile cuts; null without a modern era. */
  readonly modern: {
    readonly measure: "area" | "fires";
    readonly values: ReadonlyMap<number, number>;
    readonly threshold: number;
    readonly lowerCut: number;
    readonly upperCut: number;
  } | null;
  /** The fire-scar record: activity per usable year in the calibration's measure, the fire-year threshold and tercile cuts. */
  readonly fireScar: {
    readonly measure: "fraction" | "sites";
    readonly activity: ReadonlyMap<number, number>;
    readonly threshold: number | null;
    readonly lowerCut: number;
    readonly upperCut: number;
  };
}

const number = (value: number, digits: number): string => value.toLocaleString("en-US", { maximumFractionDigits: digits });

/**
 * The records that decide a season's outcome, from a loaded region and its calibration: the
 * modern record's measure (area burned, or number of fires, as the calibration's modern era
 * uses) for every year that has it, with the modern high-fire threshold of the calibration and the
 * terciles (type 7) of the modern years; and the fire-scar activity of every usable year (at least
 * `minSitesRecording` recording sites), with the calibration's fire-year threshold and terciles.
 *
 * @param workspace - the loaded region
 * @param calibration - its calibration (`modern` null when there is no modern era)
 * @returns the outcome records
 */
export function outcomeRecords(workspace: Workspace, calibration: Calibration): OutcomeRecords {
  const modernEra = calibration.modern ?? null;
  let modern: OutcomeRecords["modern"] = null;
  if (modernEra !== null && modernEra.threshold !== null && workspace.modern !== null) {
    const values = new Map<number, number>();
    for (const row of workspace.modern) {
      const value = modernEra.measure === "area" ? row.areaHa : row.fires;
      if (value !== null && Number.isFinite(value)) values.set(row.year, value);
    }
    const cuts = activityCategories(values, modernEra.years.filter((year) => values.has(year)));
    modern = { measure: modernEra.measure, values, threshold: modernEra.threshold, lowerCut: cuts.lowerCut, upperCut: cuts.upperCut };
  }
  const composite = compositeFireRecord(workspace.fireRecord, workspace.settings.fireYears.minSitesRecording);
  const all = activityByYear(composite, calibration.fireYears.measure);
  const activity = new Map<number, number>();
  for (const year of composite.usableYears) {
    const value = all.get(year);
    if (value !== undefined) activity.set(year, value);
  }
  return {
    modern,
    fireScar: {
      measure: calibration.fireYears.measure,
      activity,
      threshold: calibration.fireYears.threshold,
      lowerCut: calibration.categories.lowerCut,
      upperCut: calibration.categories.upperCut,
    },
  };
}

/**
 * What happened in one season: a high-fire year or not, and its activity category. The modern
 * record decides when it has the season (high-fire when its measure ≥ the modern threshold, the
 * calibration's own rule; category by the modern terciles); else the fire-scar record when the
 * season is one of its usable years (a fire year when activity ≥ the calibration's threshold and
 * > 0; category by the calibration's terciles); else the outcome is unknown (null).
 *
 * @param season - the season year
 * @param records - from {@link outcomeRecords}
 * @returns the outcome with the numbers behind it in words
 * @example
 * seasonOutcome(2024, records); // => { season: 2024, highFire: true, category: "above", source: "modern record", detail: "area burned 5,875 ha ≥ modern threshold 4,100 ha" }
 */
export function seasonOutcome(season: number, records: OutcomeRecords): SeasonOutcome {
  const modern = records.modern;
  const modernValue = modern?.values.get(season);
  if (modern !== null && modernValue !== undefined) {
    const highFire = modernValue >= modern.threshold && modernValue > 0;
    const what = modern.measure === "area" ? "area burned" : "fires";
    const unit = modern.measure === "area" ? " ha" : "";
    return {
      season,
      highFire,
      category: categoryOf(modernValue, modern.lowerCut, modern.upperCut) as ReviewCategory,
      source: "modern record",
      detail: `${what} ${number(modernValue, 1)}${unit} ${highFire ? "≥" : "<"} modern threshold ${number(modern.threshold, 1)}${unit}`,
    };
  }
  const fireScar = records.fireScar;
  const activity = fireScar.activity.get(season);
  if (activity !== undefined && fireScar.threshold !== null) {
    const highFire = activity >= fireScar.threshold && activity > 0;
    const what = fireScar.measure === "fraction" ? "share of recording sites burned" : "sites burned";
    return {
      season,
      highFire,
      category: categoryOf(activity, fireScar.lowerCut, fireScar.upperCut) as ReviewCategory,
      source: "fire-scar record",
      detail: `${what} ${number(activity, 3)} ${highFire ? "≥" : "<"} fire-year threshold ${number(fireScar.threshold, 3)}`,
    };
  }
  return {
    season,
    highFire: null,
    category: null,
    source: null,
    detail: modern === null ? "not in the fire-scar record, and the region has no modern record to tell" : "in neither the modern nor the fire-scar record yet",
  };
}
