/** The stated rule by which the hindcast decides whether the method has skill. */
export const SKILL_RULE =
  "The method has skill only when its hindcast Brier skill score is above 0 (it beat the long-term average) " +
  "AND the lower end of the ROC area's 95% interval (area − 1.96 × standard error) is above 0.5 (it told high-fire years from other years better than chance).";

/**
 * The skill verdict in plain words, by {@link SKILL_RULE}. Scores that could not be computed give
 * "no skill shown".
 */
export function skillVerdict(
  brierSkillScore: number | null,
  rocArea: number | null,
  rocStandardError: number | null,
): { hasSkill: boolean; text: string } {
  if (brierSkillScore === null || rocArea === null || rocStandardError === null) {
    return {
      hasSkill: false,
      text: "No skill shown: the hindcast has too little data to show that this method forecasts high-fire years better than the long-term average. Treat the odds as no better than the average year.",
    };
  }
  const rocLower = rocArea - 1.959963984540054 * rocStandardError;
  if (brierSkillScore > 0 && rocLower > 0.5) {
    return {
      hasSkill: true,
      text: "Some skill: in the hindcast this method forecast high-fire years better than the long-term average, but a good hindcast is no guarantee for any single season.",
    };
  }
  return {
    hasSkill: false,
    text: "No skill: in the hindcast this method did not forecast high-fire years better than the long-term average. Treat these odds as no better than the average year.",
  };
}
