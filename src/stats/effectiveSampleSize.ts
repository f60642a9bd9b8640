import { StatsInputError } from "./StatsInputError.js";

/**
 * Effective sample size for the correlation of two autocorrelated (first-order autoregressive) series.
 *
 * N_eff = N·(1 − r₁r₂)/(1 + r₁r₂), where r₁ and r₂ are the lag-1 autocorrelations of the two series
 * (Bretherton et al. 1999, §5; the same factor as Bartlett's 1935 large-sample variance of a cross-correlation
 * between independent AR(1) series). Persistence in both series (r₁r₂ > 0) shrinks N_eff below N.
 * Choices made here, both common practice:
 * - Upper cap at N. When r₁r₂ ≤ 0 the formula would give N_eff ≥ N; we return N, never crediting the data with
 *   more independent pairs than it has (anti-persistence of one series is usually sampling noise in short
 *   records, and N_eff > N would make tests anti-conservative).
 * - No lower clamp. A result of 2 or less is returned as is (it is ≥ 0); {@link correlationTest} then gives NaN,
 *   which callers report as "not enough data". Raising it to 2 would claim information the data lack.
 *
 * @param n - number of paired observations, finite and ≥ 0.
 * @param r1 - lag-1 autocorrelation of the first series, in [−1, 1], or NaN when undefined.
 * @param r2 - lag-1 autocorrelation of the second series, in [−1, 1], or NaN when undefined.
 * @returns N_eff in [0, n]. Degenerate case: NaN when r1 or r2 is NaN (e.g. a constant series); 0 when
 *   r₁r₂ = 1.
 * @throws {StatsInputError} if n is negative or not finite, or r1 / r2 lies outside [−1, 1].
 * @example
 * ```ts
 * effectiveSampleSize(100, 0.5, 0.5); // => 60 (derived: 100 · 0.75/1.25)
 * effectiveSampleSize(300, 0.3, 0.6); // => 208.4746
 * ```
 * @see Bretherton C.S., Widmann M., Dymnikov V.P., Wallace J.M., Bladé I. (1999) "The effective number of
 *   spatial degrees of freedom of a time-varying field", Journal of Climate 12(7):1990–2009, §5,
 *   doi:10.1175/1520-0442(1999)012<1990:TENOSD>2.0.CO;2.
 * @see Bartlett M.S. (1935) "Some aspects of the time-correlation problem in regard to tests of significance",
 *   Journal of the Royal Statistical Society 98(3):536–543, doi:10.2307/2342284.
 */
export function effectiveSampleSize(n: number, r1: number, r2: number): number {
  if (!Number.isFinite(n) || n < 0) {
    throw new StatsInputError(`n must be finite and non-negative (got ${n})`);
  }
  [r1, r2].forEach((autocorrelation, index) => {
    if (!Number.isNaN(autocorrelation) && !(autocorrelation >= -1 && autocorrelation <= 1)) {
      throw new StatsInputError(`r${index + 1} must lie in [−1, 1] or be NaN (got ${autocorrelation})`);
    }
  });
  if (Number.isNaN(r1) || Number.isNaN(r2)) return Number.NaN;
  const product = r1 * r2;
  if (product <= 0) return n;
  return (n * (1 - product)) / (1 + product);
}
