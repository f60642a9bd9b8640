import { chiSquareUpperTail } from "./chiSquareIndependence.js";
import { StatsInputError } from "./StatsInputError.js";

/** Result of {@link breslowDayTest}. */
export interface BreslowDayResult {
  /** Breslow–Day chi-square (with Tarone's correction when `tarone` is true); NaN when not computable. */
  readonly statistic: number;
  /** Number of usable strata − 1 (0 when fewer than 2 strata are usable). */
  readonly df: number;
  /** Chi-square upper tail of `statistic` with `df` degrees of freedom; NaN when not computable. */
  readonly pValue: number;
  /** Mantel–Haenszel common odds ratio Σ(aᵢdᵢ/nᵢ) / Σ(bᵢcᵢ/nᵢ) over the usable strata; NaN when undefined. */
  readonly commonOddsRatio: number;
  /** Whether Tarone's correction was subtracted. */
  readonly tarone: boolean;
  /** Indices (0-based, into the input) of strata dropped because a row or column total is zero. */
  readonly droppedStrata: readonly number[];
  /** Present only when the statistic is NaN: why it cannot be computed. */
  readonly reason?: string;
}

/** Options of {@link breslowDayTest}. */
export interface BreslowDayOptions {
  /** Subtract Tarone's (1985) correction term (default false). */
  readonly tarone?: boolean;
}

/**
 * Breslow–Day test of homogeneity of the odds ratios of K 2 × 2 tables (a 2 × 2 × K table), with the
 * Mantel–Haenszel common odds ratio and optionally Tarone's correction.
 *
 * For stratum i with cells [[aᵢ, bᵢ], [cᵢ, dᵢ]] and total nᵢ, the Mantel–Haenszel common odds ratio is
 * ψ = Σ(aᵢdᵢ/nᵢ) / Σ(bᵢcᵢ/nᵢ). With the stratum's margins held fixed, Aᵢ is the expected top-left count whose
 * odds ratio equals ψ — the root of Aᵢ(n₀ᵢ − m₁ᵢ + Aᵢ) = ψ(n₁ᵢ − Aᵢ)(m₁ᵢ − Aᵢ) between max(0, m₁ᵢ − n₀ᵢ) and
 * min(n₁ᵢ, m₁ᵢ) (n₁, n₀ the row totals, m₁ the first column total) — and its variance is
 * Vᵢ = 1/(1/Aᵢ + 1/Bᵢ + 1/Cᵢ + 1/Dᵢ) over the four expected cells. The statistic is Σ(aᵢ − Aᵢ)²/Vᵢ, referred
 * to chi-square with K − 1 degrees of freedom (upper tail). Tarone's correction subtracts
 * (Σaᵢ − ΣAᵢ)² / ΣVᵢ, which makes the statistic asymptotically chi-square when ψ is the Mantel–Haenszel
 * estimate. A stratum with a zero row or column total carries no information on its odds ratio: it is dropped
 * (listed in `droppedStrata`) and not counted in K. Zero cells inside a stratum with all margins positive are
 * fine (its expected cells are all positive).
 *
 * @param tables - one 2 × 2 table per stratum, [[a, b], [c, d]] (rows: exposure yes / no; columns: outcome
 *   yes / no, as for the odds ratio), finite non-negative counts (non-integers accepted); at least one stratum.
 * @param options - `tarone`: subtract Tarone's correction (default false).
 * @returns statistic, df, pValue, commonOddsRatio, tarone, droppedStrata. Degenerate cases: fewer than 2
 *   usable strata, or a common odds ratio of 0 or infinity (no discordant products in the numerator or the
 *   denominator), give NaN statistic and pValue with a `reason` (commonOddsRatio is NaN when undefined, or
 *   0 / Infinity as computed). Identical strata give statistic 0 and pValue 1.
 * @throws {StatsInputError} if there are no strata, a table is not 2 × 2, or a count is negative or not finite.
 * @example
 * ```ts
 * // Smoking and cervical cancer, stratified by number of partners (0–1, ≥ 2); printed R DescTools output
 * breslowDayTest([[[12, 21], [25, 118]], [[96, 148], [92, 150]]]);
 * // => { statistic: 4.2069, df: 1, pValue: 0.04026, commonOddsRatio: 1.2153, tarone: false, droppedStrata: [] }
 * ```
 * @see SAS Institute, SAS/STAT User's Guide, The FREQ Procedure, example "Cochran-Mantel-Haenszel Statistics"
 *   (migraine trial by gender; Breslow–Day 1.4929, p 0.2218).
 * @see Breslow N.E., Day N.E. (1980) Statistical Methods in Cancer Research, Vol. 1: The Analysis of
 *   Case-Control Studies, IARC Scientific Publications No. 32, Lyon, §4.4 (eq. 4.30, test of homogeneity).
 * @see Mantel N., Haenszel W. (1959) "Statistical aspects of the analysis of data from retrospective studies
 *   of disease", Journal of the National Cancer Institute 22(4):719–748.
 * @see Tarone R.E. (1985) "On heterogeneity tests based on efficient scores", Biometrika 72(1):91–95,
 *   doi:10.1093/biomet/72.1.91.
 */
export function breslowDayTest(
  tables: readonly (readonly (readonly number[])[])[],
  options: BreslowDayOptions = {},
): BreslowDayResult {
  const tarone = options.tarone ?? false;
  if (tables.length === 0) {
    throw new StatsInputError("the Breslow–Day test needs at least one stratum (got none)");
  }
  const strata = tables.map((table, index) => {
    if (table.length !== 2 || table.some((row) => row.length !== 2)) {
      throw new StatsInputError(`the Breslow–Day test needs a 2 × 2 table per stratum (stratum ${index} is not 2 × 2)`);
    }
    const cells = [table[0]?.[0], table[0]?.[1], table[1]?.[0], table[1]?.[1]] as number[];
    cells.forEach((count) => {
      if (!Number.isFinite(count) || count < 0) {
        throw new StatsInputError(`2 × 2 table counts must be finite and non-negative (stratum ${index} has ${count})`);
      }
    });
    const [a, b, c, d] = cells as [number, number, number, number];
    return { a, b, c, d, index };
  });

  const droppedStrata: number[] = [];
  const usable = strata.filter(({ a, b, c, d, index }) => {
    const positiveMargins = a + b > 0 && c + d > 0 && a + c > 0 && b + d > 0;
    if (!positiveMargins) droppedStrata.push(index);
    return positiveMargins;
  });

  let numerator = 0;
  let denominator = 0;
  usable.forEach(({ a, b, c, d }) => {
    const total = a + b + c + d;
    numerator += (a * d) / total;
    denominator += (b * c) / total;
  });
  const commonOddsRatio = usable.length === 0 ? Number.NaN : numerator / denominator;
  const df = Math.max(0, usable.length - 1);
  const notComputable = (reason: string): BreslowDayResult => ({
    statistic: Number.NaN,
    df,
    pValue: Number.NaN,
    commonOddsRatio,
    tarone,
    droppedStrata,
    reason,
  });
  if (usable.length < 2) {
    return notComputable(
      `not enough data: ${usable.length} stratum${usable.length === 1 ? "" : "s"} with all row and column totals positive (2 needed)`,
    );
  }
  if (!(commonOddsRatio > 0 && Number.isFinite(commonOddsRatio))) {
    return notComputable(
      "the Mantel–Haenszel common odds ratio is 0 or infinite (a zero cell on the same diagonal in every stratum), so no expected table exists",
    );
  }

  let statistic = 0;
  let observedSum = 0;
  let expectedSum = 0;
  let varianceSum = 0;
  usable.forEach(({ a, b, c, d }) => {
    const rowOne = a + b;
    const rowTwo = c + d;
    const columnOne = a + c;
    const expected = expectedTopLeft(commonOddsRatio, rowOne, rowTwo, columnOne);
    const variance =
      1 / (1 / expected + 1 / (rowOne - expected) + 1 / (columnOne - expected) + 1 / (rowTwo - columnOne + expected));
    statistic += ((a - expected) * (a - expected)) / variance;
    observedSum += a;
    expectedSum += expected;
    varianceSum += variance;
  });
  if (tarone) statistic -= ((observedSum - expectedSum) * (observedSum - expectedSum)) / varianceSum;
  // Tarone's term never exceeds the sum (Cauchy–Schwarz); a tiny negative value is rounding.
  statistic = Math.max(0, statistic);
  return { statistic, df, pValue: chiSquareUpperTail(statistic, df), commonOddsRatio, tarone, droppedStrata };
}

/**
 * The expected top-left count A with fixed margins whose odds ratio A(n₀ − m₁ + A)/((n₁ − A)(m₁ − A)) is ψ:
 * the root of (1 − ψ)A² + (n₀ − m₁ + ψ(n₁ + m₁))A − ψn₁m₁ = 0 inside (max(0, m₁ − n₀), min(n₁, m₁)).
 */
function expectedTopLeft(oddsRatio: number, rowOne: number, rowTwo: number, columnOne: number): number {
  const lowest = Math.max(0, columnOne - rowTwo);
  const highest = Math.min(rowOne, columnOne);
  const quadratic = 1 - oddsRatio;
  const linear = rowTwo - columnOne + oddsRatio * (rowOne + columnOne);
  const constant = -oddsRatio * rowOne * columnOne;
  let root: number;
  if (Math.abs(quadratic) < 1e-12) {
    root = -constant / linear;
  } else {
    // Numerically stable roots: q = −(B + sign(B)√(B² − 4AC))/2, roots q/A and C/q; keep the one in range.
    const discriminant = Math.sqrt(Math.max(0, linear * linear - 4 * quadratic * constant));
    const q = -0.5 * (linear + (linear >= 0 ? discriminant : -discriminant));
    const first = q / quadratic;
    const second = constant / q;
    root = first > lowest && first < highest ? first : second;
  }
  return Math.min(highest, Math.max(lowest, root));
}
