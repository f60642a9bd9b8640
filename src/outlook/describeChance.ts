/**
 * A probability in plain words for a planning meeting: "about 3 in 10". Probabilities are rounded
 * to the nearest tenth; below 0.05 it says "less than 1 in 20" and above 0.95 "more than 19 in 20",
 * where "about 0 in 10" or "about 10 in 10" would mislead.
 *
 * @example describeChance(0.287) // => "about 3 in 10"
 * @example describeChance(0.1) // => "about 1 in 10"
 */
export function describeChance(probability: number | null): string {
  if (probability === null || !Number.isFinite(probability)) return "not known (not enough data)";
  if (probability < 0.05) return "less than 1 in 20";
  if (probability > 0.95) return "more than 19 in 20";
  const tenths = Math.round(probability * 10);
  if (tenths === 5) return "about an even (1 in 2)";
  return `about ${tenths} in 10`;
}

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

/** The headline sentence of an outlook. */
export function headline(fireYear: number | null, baseRate: number | null): string {
  const chance = describeChance(fireYear);
  const base = describeChance(baseRate);
  if (chance === "about an even (1 in 2)") return `An even chance (about 1 in 2) of a high-fire year; in an average year ${base}.`;
  return `${capitalize(chance)} chance of a high-fire year; in an average year ${base}.`;
}

function capitalize(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
