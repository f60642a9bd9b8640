import { quantileSorted } from "../stats/quantileSorted.js";
import type { IndexSettings } from "../workspace/types.js";
import type { PhaseAssignment, PhaseDefinition } from "./types.js";

/**
 * The phase definition of one index: its fixed cuts, or the terciles of its calibration values.
 *
 * Terciles use Hyndman & Fan (1996) type-7 sample quantiles at 1/3 and 2/3 of `calibrationValues`
 * (Hyndman R.J., Fan Y. 1996, "Sample quantiles in statistical packages", The American Statistician 50:361–365).
 *
 * @param settings - the index's phase rule from region.json
 * @param calibrationValues - the index values of the calibration (or training) years, missing ones left out
 */
export function phaseDefinition(settings: IndexSettings, calibrationValues: readonly number[]): PhaseDefinition {
  if (settings.phases.kind === "cuts") {
    return { index: settings.name, labels: settings.phases.labels, cuts: settings.phases.cuts, rule: "cuts" };
  }
  const sorted = Array.from(Float64Array.from(calibrationValues).sort());
  return {
    index: settings.name,
    labels: settings.phases.labels,
    cuts: [quantileSorted(sorted, 1 / 3), quantileSorted(sorted, 2 / 3)],
    rule: "terciles",
  };
}

/**
 * The phase of one index value. Cuts are inclusive at the outer phases: a value ≤ the first cut is
 * the first phase and a value ≥ the last cut the last phase (the usual convention for ENSO-type
 * indices, e.g. warm when ≥ +0.5 and cold when ≤ −0.5). Between them a value belongs to the phase
 * whose lower cut it exceeds strictly.
 *
 * @returns the 0-based phase number
 * @example classifyPhase(0.5, [-0.5, 0.5]) // => 2
 * @example classifyPhase(-0.49, [-0.5, 0.5]) // => 1
 */
export function classifyPhase(value: number, cuts: readonly number[]): number {
  const first = cuts[0];
  const last = cuts[cuts.length - 1];
  if (first === undefined || last === undefined) return 0;
  if (value <= first) return 0;
  if (value >= last) return cuts.length;
  let phase = 0;
  for (const cut of cuts) if (value > cut) phase += 1;
  return phase;
}

/** True when the value lies within `margin` of any cut (a phase call that a small revision could flip). */
export function isNearBoundary(value: number, cuts: readonly number[], margin: number): boolean {
  return cuts.some((cut) => Math.abs(value - cut) <= margin);
}

/** Phase of every (year, value) pair under one definition. */
export function assignPhases(
  definition: PhaseDefinition,
  values: ReadonlyMap<number, number>,
  margin: number,
): PhaseAssignment[] {
  const out: PhaseAssignment[] = [];
  for (const [year, value] of [...values].sort((a, b) => a[0] - b[0])) {
    out.push({ year, value, phase: classifyPhase(value, definition.cuts), nearBoundary: isNearBoundary(value, definition.cuts, margin) });
  }
  return out;
}
