import { describe, expect, it } from "vitest";
import { SKILL_P_MAX, SKILL_RULE, skillVerdict } from "../../src/hindcast/skillVerdict.js";

describe("skillVerdict(brierSkillScore, skillPValue)", () => {
  it("says skill only when BSS > 0 AND the permutation p is at most 0.05 (the boundary counts)", () => {
    expect(SKILL_P_MAX).toBe(0.05);
    expect(skillVerdict(0.04, 0.012).hasSkill).toBe(true);
    expect(skillVerdict(0.04, 0.05).hasSkill).toBe(true);
    expect(skillVerdict(0.04, 0.051).hasSkill).toBe(false);
    expect(skillVerdict(0, 0.001).hasSkill).toBe(false);
    expect(skillVerdict(-0.02, 0.001).hasSkill).toBe(false);
  });

  it("words: 'Some skill', 'No skill' (with 'chance' when BSS > 0 but p is large), 'No skill shown' when a number is missing", () => {
    expect(skillVerdict(0.04, 0.012).text).toMatch(/^Some skill/);
    expect(skillVerdict(0.04, 0.3).text).toMatch(/^No skill: .*chance/);
    expect(skillVerdict(-0.1, 0.9).text).toMatch(/^No skill: .*did not forecast/);
    expect(skillVerdict(null, 0.01).text).toMatch(/^No skill shown/);
    expect(skillVerdict(0.2, null).hasSkill).toBe(false);
  });

  it("skillVerdict(0.1, null, reason) says the chance test was not run, and why, instead of 'too little data'", () => {
    const verdict = skillVerdict(0.1, null, "the record is too long for the curve rule's shuffles");
    expect(verdict.hasSkill).toBe(false);
    expect(verdict.text).toMatch(/^Not tested against chance \(the record is too long for the curve rule's shuffles\)/);
    expect(skillVerdict(0.1, null).text).toMatch(/^No skill shown/);
  });

  it("SKILL_RULE states both conditions in words", () => {
    expect(SKILL_RULE).toMatch(/Brier skill score is above 0/);
    expect(SKILL_RULE).toMatch(/at most 0\.05/);
    expect(SKILL_RULE).toMatch(/shuffled/);
  });
});
