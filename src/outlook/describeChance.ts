/**
 * Plain words for a probability, for a planning meeting. Each probability is matched to the
 * nearest of a short list of simple odds (1 in 20, 1 in 10, 1 in 7, 1 in 5, 1 in 4, 3 in 10,
 * 1 in 3, 2 in 5, 1 in 2, 3 in 5, 2 in 3, 3 in 4, 4 in 5, 9 in 10, 19 in 20), so that "about
 * 1 in 3" stands beside 35% rather than a rounded-down "3 in 10". Below 0.04 it says "less than
 * 1 in 20" and above 0.96 "more than 19 in 20". (Expressing probabilities as natural frequencies
 * is common practice in risk communication.)
 *
 * @example describeChance(0.35) // => "about 1 in 3"
 * @example describeChance(0.287) // => "about 3 in 10"
 * @example describeChance(0.1) // => "about 1 in 10"
 */
export function describeChance(probability: number | null): string {
  if (probability === null || !Number.isFinite(probability)) return "not known (not enough data)";
  if (probability < 0.04) return "less than 1 in 20";
  if (probability > 0.96) return "more than 19 in 20";
  let best = SIMPLE_ODDS[0] as (typeof SIMPLE_ODDS)[number];
  for (const odds of SIMPLE_ODDS) {
    if (Math.abs(odds.value - probability) < Math.abs(best.value - probability)) best = odds;
  }
  return `about ${best.words}`;
}

const SIMPLE_ODDS = [
  [1, 20],
  [1, 10],
  [1, 7],
  [1, 5],
  [1, 4],
  [3, 10],
  [1, 3],
  [2, 5],
  [1, 2],
  [3, 5],
  [2, 3],
  [3, 4],
  [4, 5],
  [9, 10],
  [19, 20],
].map(([k, n]) => ({ value: (k as number) / (n as number), words: `${k} in ${n}` }));

/** A probability as a whole percentage, e.g. 0.287 → "29%"; null → "not enough data". */
export function formatPercent(probability: number | null): string {
  if (probability === null || !Number.isFinite(probability)) return "not enough data";
  return `${Math.round(probability * 100)}%`;
}

/** An interval as "19–41%"; either end null → "not enough data". */
export function formatPercentRange(lower: number | null, upper: number | null): string {
  if (lower === null || upper === null || !Number.isFinite(lower) || !Number.isFinite(upper)) return "not enough data";
  return `${Math.round(lower * 100)}–${Math.round(upper * 100)}%`;
}

interface Chance {
  readonly estimate: number | null;
  readonly lower: number | null;
  readonly upper: number | null;
}

/**
 * The headline sentence of an outlook, with the estimate, its interval and the average year:
 * "About 1 in 3 chance of a high-fire year (35%, 95% interval 19–54%); in an average year about
 * 1 in 10 (10%)."
 */
export function headline(fireYear: Chance & { readonly years?: number; readonly fireYears?: number }, baseRate: Pick<Chance, "estimate">): string {
  if (fireYear.estimate === null) return "Chance of a high-fire year: not enough data.";
  if (fireYear.fireYears === 0 && fireYear.years !== undefined && fireYear.years > 0 && fireYear.upper !== null) {
    // "0%" reads as "impossible"; say what was counted and how high the chance may still be.
    return (
      `None of the ${fireYear.years} past years like this season was a high-fire year (95% interval up to ${formatPercent(fireYear.upper)}); ` +
      `in an average year ${describeChance(baseRate.estimate)} (${formatPercent(baseRate.estimate)}).`
    );
  }
  if (fireYear.fireYears !== undefined && fireYear.years !== undefined && fireYear.years > 0 && fireYear.fireYears === fireYear.years && fireYear.lower !== null) {
    return (
      `Every one of the ${fireYear.years} past years like this season was a high-fire year (95% interval down to ${formatPercent(fireYear.lower)}); ` +
      `in an average year ${describeChance(baseRate.estimate)} (${formatPercent(baseRate.estimate)}).`
    );
  }
  const chance = describeChance(fireYear.estimate);
  const interval =
    fireYear.lower !== null && fireYear.upper !== null ? `, 95% interval ${formatPercentRange(fireYear.lower, fireYear.upper)}` : "";
  return (
    `${capitalize(chance)} chance of a high-fire year (${formatPercent(fireYear.estimate)}${interval}); ` +
    `in an average year ${describeChance(baseRate.estimate)} (${formatPercent(baseRate.estimate)}).`
  );
}

/**
 * Whether this season's chance differs from the average year beyond the uncertainty of both:
 * "higher" or "lower" only when the two 95% intervals do not overlap (a cautious reading that
 * agrees with what a reader sees printed side by side), otherwise "not distinguishable".
 */
export function comparedWithBase(fireYear: Chance, baseRate: Chance): "higher" | "lower" | "not distinguishable" {
  if (fireYear.lower === null || fireYear.upper === null || baseRate.lower === null || baseRate.upper === null) return "not distinguishable";
  if (fireYear.lower > baseRate.upper) return "higher";
  if (fireYear.upper < baseRate.lower) return "lower";
  return "not distinguishable";
}

/** One plain sentence on how this season compares with an average year, given {@link comparedWithBase}. */
export function comparisonSentence(
  fireYear: Chance & {
    readonly basisIndices?: readonly string[];
    readonly comparedWithBase?: "higher" | "lower" | "not distinguishable";
    readonly comparedUsing?: "interval" | "selection-aware interval";
  },
  baseRate: Chance,
): string {
  if (fireYear.basisIndices !== undefined && fireYear.basisIndices.length === 0) {
    return "These are the average-year odds: no index phase of this season could be read from past years.";
  }
  const selection = fireYear.comparedUsing === "selection-aware interval";
  switch (fireYear.comparedWithBase ?? comparedWithBase(fireYear, baseRate)) {
    case "higher":
      return `The odds are higher than in an average year, beyond the uncertainty of both${selection ? " (also allowing for the rule's choice of index)" : ""}.`;
    case "lower":
      return `The odds are lower than in an average year, beyond the uncertainty of both${selection ? " (also allowing for the rule's choice of index)" : ""}.`;
    default:
      return selection && comparedWithBase(fireYear, baseRate) !== "not distinguishable"
        ? "Allowing for the rule's choice of index, the interval reaches the average year: this season may not differ from an average year."
        : "The two intervals overlap: this season may not differ from an average year.";
  }
}

function capitalize(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
