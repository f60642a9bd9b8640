import type { FireYearSettings, MethodSettings } from "./types.js";

/**
 * Method settings used when region.json leaves `methods` (or one of its keys) out. Each value is
 * described in {@link MethodSettings}; the README ("Commands") gives the reasoning.
 */
export const DEFAULT_METHODS: MethodSettings = Object.freeze({
  interval: "wilson",
  seaFirstLag: -4,
  seaLastLag: 2,
  seaDraws: 10_000,
  blockYears: 5,
  blockMaxLag: 2,
  stabilityWindow: 100,
  stabilityStep: 10,
  analogs: 10,
  jointMinYears: 10,
  jointMaxQ: 0.05,
  nearBoundarySd: 0.1,
  response: "phase",
  modernMeasure: "area",
  permutations: 999,
  bootstrapResamples: 999,
  independenceKm: 40,
  hindcastExclusion: 2,
  smallSampleYears: 20,
});

/** Fire-year settings used when region.json leaves `fireYears` (or one of its keys) out. */
export const DEFAULT_FIRE_YEARS: FireYearSettings = Object.freeze({
  top: 0.1,
  measure: "fraction",
  minSitesRecording: 3,
});

/** Phase labels of a tercile rule when region.json gives none. */
export const DEFAULT_TERCILE_LABELS: readonly string[] = Object.freeze(["low", "middle", "high"]);

/** Seed of every resampling when region.json gives none. */
export const DEFAULT_SEED = 1;
