import type { Skill } from "../hindcast/types.js";
import type { Outlook } from "./types.js";

/** Schema name of `firephase outlook --json` (promised interface, README "JSON output"). */
export const OUTLOOK_SCHEMA = "firephase.outlook/1";

/**
 * The promised JSON form of an Outlook. Fixed key order: the same inputs and seed give
 * byte-identical output. Per-year hindcast forecasts are included under `hindcast.forecasts`.
 * Optional statistics that cannot be computed are null with a reason beside them; notes that do
 * not apply this season (`fireYear.selectionNote`, `fireYear.strengthNote`) are left out.
 */
export function toOutlookJson(outlook: Outlook): Record<string, unknown> {
  // Object.fromEntries defines own properties, so an index named like a built-in property stays a plain key.
  const phases = Object.fromEntries(outlook.current.map((phase) => [phase.index, phase.label]));
  const { selectionNote, strengthNote, ...fireYear } = outlook.fireYear;
  return {
    schema: OUTLOOK_SCHEMA,
    issued: outlook.issued,
    season: outlook.season,
    region: { name: outlook.region },
    baseRate: outlook.baseRate,
    phases,
    current: outlook.current,
    missing: outlook.missing,
    fireYear: {
      ...fireYear,
      ...(selectionNote === undefined || selectionNote === null ? {} : { selectionNote }),
      ...(strengthNote === undefined || strengthNote === null ? {} : { strengthNote }),
    },
    perIndex: outlook.perIndex,
    categories: outlook.categories,
    analogs: outlook.analogs,
    analogFireShare: outlook.analogFireShare,
    hindcast: skillJson(outlook.hindcast),
    warnings: outlook.warnings,
  };
}

/** JSON form of a hindcast Skill (the C8 additions only when the hindcast filled them). */
function skillJson(skill: Skill): Record<string, unknown> {
  return {
    years: skill.years,
    exclusion: skill.exclusion,
    brierScore: skill.brierScore,
    brierScoreClimatology: skill.brierScoreClimatology,
    brierSkillScore: skill.brierSkillScore,
    rps: skill.rps,
    rpsClimatology: skill.rpsClimatology,
    rpss: skill.rpss,
    ...(skill.rpssReason === undefined ? {} : { rpssReason: skill.rpssReason }),
    rpsForm: skill.rpsForm,
    rocArea: skill.rocArea,
    rocStandardError: skill.rocStandardError,
    ...(skill.skillPValue === undefined ? {} : { skillPValue: skill.skillPValue }),
    ...(skill.skillPValueReason === undefined ? {} : { skillPValueReason: skill.skillPValueReason }),
    ...(skill.permutations === undefined ? {} : { permutations: skill.permutations }),
    ...(skill.permutationBlockYears === undefined ? {} : { permutationBlockYears: skill.permutationBlockYears }),
    ...(skill.intervals === undefined ? {} : { intervals: skill.intervals }),
    ...(skill.intervalsReason === undefined ? {} : { intervalsReason: skill.intervalsReason }),
    ...(skill.reference === undefined ? {} : { reference: skill.reference }),
    hasSkill: skill.hasSkill,
    verdict: skill.verdict,
    rule: skill.rule,
    reliability: skill.reliability,
    ...(skill.corp === undefined ? {} : { corp: skill.corp }),
    ...(skill.corpReason === undefined ? {} : { corpReason: skill.corpReason }),
    rocCurve: skill.rocCurve,
    ...(skill.reason === undefined ? {} : { reason: skill.reason }),
    ...(skill.curveRule === undefined ? {} : { curveRule: skill.curveRule === null ? null : skillJson(skill.curveRule) }),
    ...(skill.curveRuleReason === undefined ? {} : { curveRuleReason: skill.curveRuleReason }),
    ...(skill.issuedRule === undefined ? {} : { issuedRule: skill.issuedRule }),
    ...(skill.phaseRule === undefined ? {} : { phaseRule: skill.phaseRule === null ? null : skillJson(skill.phaseRule) }),
    forecasts: skill.forecasts,
  };
}
