import type { Outlook } from "./types.js";

/** Schema name of `firephase outlook --json` (promised interface, README "JSON output"). */
export const OUTLOOK_SCHEMA = "firephase.outlook/1";

/**
 * The promised JSON form of an Outlook. Fixed key order: the same inputs and seed give
 * byte-identical output. Per-year hindcast forecasts are included under `hindcast.forecasts`.
 */
export function toOutlookJson(outlook: Outlook): Record<string, unknown> {
  const phases: Record<string, string> = {};
  for (const phase of outlook.current) phases[phase.index] = phase.label;
  const skill = outlook.hindcast;
  return {
    schema: OUTLOOK_SCHEMA,
    issued: outlook.issued,
    season: outlook.season,
    region: { name: outlook.region },
    baseRate: outlook.baseRate,
    phases,
    current: outlook.current,
    missing: outlook.missing,
    fireYear: outlook.fireYear,
    perIndex: outlook.perIndex,
    categories: outlook.categories,
    analogs: outlook.analogs,
    analogFireShare: outlook.analogFireShare,
    hindcast: {
      years: skill.years,
      exclusion: skill.exclusion,
      brierScore: skill.brierScore,
      brierScoreClimatology: skill.brierScoreClimatology,
      brierSkillScore: skill.brierSkillScore,
      rps: skill.rps,
      rpsClimatology: skill.rpsClimatology,
      rpss: skill.rpss,
      rpsForm: skill.rpsForm,
      rocArea: skill.rocArea,
      rocStandardError: skill.rocStandardError,
      hasSkill: skill.hasSkill,
      verdict: skill.verdict,
      rule: skill.rule,
      reliability: skill.reliability,
      rocCurve: skill.rocCurve,
      ...(skill.reason === undefined ? {} : { reason: skill.reason }),
      forecasts: skill.forecasts,
    },
    warnings: outlook.warnings,
  };
}
