/** Cross-validated verification of the outlook method. */

export interface ReliabilityBin {
  readonly lower: number;
  readonly upper: number;
  readonly count: number;
  readonly meanForecast: number | null;
  readonly observedFrequency: number | null;
}

export interface HindcastYear {
  readonly year: number;
  readonly probability: number;
  readonly climatology: number;
  readonly fireYear: boolean;
  readonly categoryProbabilities: readonly [number, number, number];
  /** The left-in category shares, the climatological forecast for the RPSS. */
  readonly climatologyCategories: readonly [number, number, number];
  readonly observedCategory: 0 | 1 | 2;
  /** Which past years the forecast was read from: a joint phase, a single index phase, or climatology. */
  readonly basis: "joint" | "single" | "climatology";
}

export interface Skill {
  readonly years: number;
  readonly exclusion: number;
  readonly brierScore: number | null;
  readonly brierScoreClimatology: number | null;
  readonly brierSkillScore: number | null;
  readonly rps: number | null;
  readonly rpsClimatology: number | null;
  readonly rpss: number | null;
  readonly rpsForm: string;
  readonly rocArea: number | null;
  readonly rocStandardError: number | null;
  readonly rocCurve: readonly { readonly falseAlarmRate: number; readonly hitRate: number }[];
  readonly reliability: readonly ReliabilityBin[];
  readonly hasSkill: boolean;
  readonly verdict: string;
  readonly rule: string;
  readonly forecasts: readonly HindcastYear[];
  readonly reason?: string;
}
