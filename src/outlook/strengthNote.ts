import type { IndexValues, TrainingSet } from "../calibrate/buildTrainingSet.js";
import type { Calibration } from "../calibrate/types.js";
import { formatPercent, formatPercentRange } from "./describeChance.js";
import type { CurveOdds } from "./types.js";

/** Share of the phase's calibration years a value must be more extreme than to count as strong within its phase. */
export const STRONG_WITHIN_PHASE = 0.75;

/**
 * A plain sentence for page 1 when this season's value of the curve's index is strong within its
 * phase, and what the response curve gives beside the phase's own odds.
 *
 * Only the outer phases have a direction: in the highest phase a value is "strong" when it is higher
 * than at least {@link STRONG_WITHIN_PHASE} of the phase's calibration values; in the lowest phase when
 * it is lower than that share. A middle phase, or a value that is not strong, gives no sentence (null).
 *
 * @param curve - the curve's reading at this season's value
 * @param calibration - the calibration (phase odds of the index)
 * @param training - the calibration's training set (phase of each calibration year)
 * @param indexValues - index values by index name and year
 * @param currentPhase - this season's phase number per index
 * @param maxQ - largest Benjamini–Hochberg q of the curve (across indices) for which a strength note is written (methods.jointMaxQ, default 0.05)
 * @returns the sentence, or null when the value is not strong within an outer phase
 * @example
 * strengthNote({ index: "ENSO", value: 1.6, estimate: 0.45, … }, calibration, training, new Map([["ENSO", 2]]));
 * // => "This season's ENSO value (1.6) is strong within its warm phase (higher than 82% of the 73 warm years of the calibration); the curve gives 45% (95% interval 31–60%), against 30% for the warm phase as a whole."
 */
export function strengthNote(
  curve: CurveOdds,
  calibration: Calibration,
  training: TrainingSet,
  indexValues: IndexValues,
  currentPhase: ReadonlyMap<string, number>,
  maxQ = 0.05,
): string | null {
  const index = calibration.indices.find((candidate) => candidate.name === curve.index);
  const phase = currentPhase.get(curve.index);
  if (index === undefined || phase === undefined) return null;
  // A strength reading is a link claim: only for a curve with a clear link across the indices
  // (Benjamini–Hochberg q of its likelihood-ratio p at most maxQ), never for a flat, chance curve.
  const q = index.curve?.qValue;
  if (q === null || q === undefined || !Number.isFinite(q) || q > maxQ) return null;
  const last = index.definition.labels.length - 1;
  if (last < 1 || (phase !== 0 && phase !== last)) return null;
  const values = phaseValues(training, indexValues, curve.index, phase);
  if (values.length === 0) return null;
  const beyond = values.filter((value) => (phase === last ? curve.value > value : curve.value < value)).length / values.length;
  const label = index.definition.labels[phase] ?? String(phase);
  const side = phase === last ? "higher" : "lower";
  if (beyond < STRONG_WITHIN_PHASE) return null;
  const phaseOdds = index.phases[phase]?.probability;
  const phaseWords =
    phaseOdds === undefined || phaseOdds.estimate === null ? "" : `, against ${formatPercent(phaseOdds.estimate)} for the ${label} phase as a whole`;
  const beyondWords = curve.beyondRange === null ? "" : `, read at the ${curve.beyondRange === "above" ? "largest" : "smallest"} calibration value ${formatValue(curve.readAt)}`;
  return (
    `This season's ${curve.index} value (${formatValue(curve.value)}) is strong within its ${label} phase (${side} than ${Math.round(beyond * 100)}% of the ${values.length} ${label} years of the calibration); ` +
    `the curve gives ${formatPercent(curve.estimate)} (95% interval ${formatPercentRange(curve.lower, curve.upper)}${beyondWords})${phaseWords}.`
  );
}

/** The calibration values of one index in one phase. */
function phaseValues(training: TrainingSet, indexValues: IndexValues, index: string, phase: number): number[] {
  const phases = training.phaseOf.get(index);
  const values = indexValues.get(index);
  const out: number[] = [];
  if (phases === undefined || values === undefined) return out;
  for (const [year, yearPhase] of phases) {
    const value = values.get(year);
    if (yearPhase === phase && value !== undefined) out.push(value);
  }
  return out;
}

/** An index value to four significant digits, for sentences (−1.6500000000000001 reads −1.65). */
export function formatValue(value: number): string {
  return Number(value.toPrecision(4)).toString();
}
