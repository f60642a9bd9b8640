import { phaseCounts, type TrainingSet } from "./buildTrainingSet.js";
import { proportionEstimate } from "./proportionEstimate.js";
import type { StabilityWindow } from "./types.js";

/**
 * Stability through time: the conditional probability of a fire year in each phase within moving
 * windows of `width` years, moved by `step` years, from the start of the calibration period. Fire
 * years and phase cuts stay those of the whole calibration, so only the link is allowed to change
 * from window to window. The last window ends at or before `last`.
 */
export function stabilityWindows(input: {
  readonly training: TrainingSet;
  readonly index: string;
  readonly first: number;
  readonly last: number;
  readonly width: number;
  readonly step: number;
  readonly interval: "wilson" | "jeffreys";
}): StabilityWindow[] {
  const { training, index, width, step } = input;
  const labels = training.definitions.get(index)?.labels ?? [];
  const counts = phaseCounts(training, index);
  const windows: StabilityWindow[] = [];
  for (let start = input.first; start + width - 1 <= input.last; start += step) {
    const end = start + width - 1;
    let yearsInWindow = 0;
    for (const year of training.years) if (year >= start && year <= end) yearsInWindow += 1;
    const phases = counts.map((cell, phase) => {
      const inside = cell.years.filter((year) => year >= start && year <= end);
      const fire = inside.filter((year) => training.isFireYear.has(year)).length;
      return {
        label: labels[phase] ?? String(phase),
        years: inside.length,
        fireYears: fire,
        probability: proportionEstimate(fire, inside.length, input.interval),
      };
    });
    windows.push({ first: start, last: end, years: yearsInWindow, phases });
  }
  return windows;
}
