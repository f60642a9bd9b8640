/** Largest permutation p-value of the Brier skill score that counts as skill. */
export const SKILL_P_MAX = 0.05;

/** The stated rule by which the hindcast decides whether the method has skill. */
export const SKILL_RULE =
  "The method has skill only when its hindcast Brier skill score is above 0 (it beat the long-term average) " +
  "AND that score is hard to reach by chance: when the fire record is shuffled across years in blocks (keeping its year-to-year " +
  "persistence but breaking any link with the indices) and the whole hindcast is rerun, at most 5% of the shuffles " +
  "score as well (permutation p-value, counting the observed record, at most 0.05).";

/**
 * The skill verdict in plain words, by {@link SKILL_RULE}: "Some skill" only when the Brier skill score is
 * above 0 and its permutation p-value is at most {@link SKILL_P_MAX}. Scores or p-values that could not be
 * computed give "No skill shown".
 *
 * @param brierSkillScore - the hindcast Brier skill score, or null when it could not be computed.
 * @param skillPValue - the permutation p-value of that score, (b + 1)/(m + 1), or null when not computed.
 * @param notTestedReason - why the chance test was not run although the scores exist (then the verdict says so).
 * @returns whether the method has skill, and the verdict sentence.
 * @example
 * skillVerdict(0.04, 0.012).hasSkill; // => true
 * skillVerdict(0.04, 0.2).hasSkill; // => false (chance reaches this score too often)
 */
export function skillVerdict(
  brierSkillScore: number | null,
  skillPValue: number | null,
  notTestedReason?: string,
): { hasSkill: boolean; text: string } {
  if (brierSkillScore !== null && skillPValue === null && notTestedReason !== undefined) {
    // The scores exist but the chance test was not run: say so, rather than "too little data".
    return {
      hasSkill: false,
      text: `Not tested against chance (${notTestedReason}): the hindcast scores are shown, but without the chance test they cannot show skill. Treat the odds as no better than the average year.`,
    };
  }
  if (brierSkillScore === null || skillPValue === null) {
    return {
      hasSkill: false,
      text: "No skill shown: the hindcast has too little data to show that this method forecasts high-fire years better than the long-term average. Treat the odds as no better than the average year.",
    };
  }
  if (brierSkillScore > 0 && skillPValue <= SKILL_P_MAX) {
    return {
      hasSkill: true,
      text: "Some skill: in the hindcast this method forecast high-fire years better than the long-term average, more often than shuffled fire records did, but a good hindcast is no guarantee for any single season.",
    };
  }
  return {
    hasSkill: false,
    text:
      brierSkillScore > 0
        ? "No skill: in the hindcast this method beat the long-term average only by a margin that shuffled fire records also reached, so it may be chance. Treat these odds as no better than the average year."
        : "No skill: in the hindcast this method did not forecast high-fire years better than the long-term average. Treat these odds as no better than the average year.",
  };
}
