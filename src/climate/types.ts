/** Index phases for the calibration period. */

export interface PhaseDefinition {
  readonly index: string;
  readonly labels: readonly string[];
  /** Ascending cut points; phase i covers values between cuts[i-1] and cuts[i] (see classifyPhase). */
  readonly cuts: readonly number[];
  readonly rule: "cuts" | "terciles";
}

export interface PhaseAssignment {
  readonly year: number;
  readonly value: number;
  readonly phase: number;
  /** True when |value − nearest cut| ≤ margin. */
  readonly nearBoundary: boolean;
}
