/**
 * Agreement of two records on high-fire years (Cohen's kappa for a 2×2 table): how often the
 * fire-scar record and the modern record both call a year a high-fire year, or both call it another
 * year, beyond what their own shares of high-fire years would give by chance.
 *
 * With a = both high-fire, b = fire-scar only, c = modern only, d = neither and n = a + b + c + d: the
 * observed agreement is pₒ = (a + d) / n; the agreement expected by chance from the margins is
 * pₑ = ((a + b)(a + c) + (c + d)(b + d)) / n²; kappa = (pₒ − pₑ) / (1 − pₑ).
 *
 * @param counts - the four counts, non-negative integers
 * @returns the share of years on which the records agree and Cohen's kappa; with no shared years both are
 *   null with a reason; kappa is null with a reason when pₑ = 1 (both records put every year in the same class)
 * @throws RangeError when a count is negative or not an integer (a programming error)
 * @example
 * agreementOfRecords({ both: 20, fireScarOnly: 5, modernOnly: 10, neither: 15 });
 * // => { agreementShare: 0.7, kappa: 0.4 }   (pₒ = 0.7, pₑ = 0.5)
 * @see Cohen J. (1960) "A coefficient of agreement for nominal scales", Educational and Psychological
 *   Measurement 20(1):37–46.
 */
export function agreementOfRecords(counts: {
  readonly both: number;
  readonly fireScarOnly: number;
  readonly modernOnly: number;
  readonly neither: number;
}): { readonly agreementShare: number | null; readonly kappa: number | null; readonly reason?: string } {
  const { both: a, fireScarOnly: b, modernOnly: c, neither: d } = counts;
  for (const count of [a, b, c, d]) {
    if (!Number.isInteger(count) || count < 0) throw new RangeError(`agreementOfRecords: counts must be non-negative integers (got ${count})`);
  }
  const n = a + b + c + d;
  if (n === 0) return { agreementShare: null, kappa: null, reason: "no year is in both records" };
  const observed = (a + d) / n;
  const expected = ((a + b) * (a + c) + (c + d) * (b + d)) / (n * n);
  if (expected === 1) {
    return { agreementShare: observed, kappa: null, reason: "both records put every shared year in the same class, so kappa is not defined" };
  }
  return { agreementShare: observed, kappa: (observed - expected) / (1 - expected) };
}
