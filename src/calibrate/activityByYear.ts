import type { FireActivity } from "../record/types.js";

/** Activity per year in the chosen measure: fraction of recording sites burned, or sites burned. */
export function activityByYear(activity: FireActivity, measure: "fraction" | "sites"): Map<number, number> {
  const out = new Map<number, number>();
  for (const row of activity.years) out.set(row.year, measure === "sites" ? row.sitesBurned : row.fraction);
  return out;
}

/** Index values by year (missing values left out). */
export function valuesByYear(series: { readonly years: readonly number[]; readonly values: readonly (number | null)[] }): Map<number, number> {
  const out = new Map<number, number>();
  series.years.forEach((year, i) => {
    const value = series.values[i];
    if (value !== null && value !== undefined) out.set(year, value);
  });
  return out;
}
