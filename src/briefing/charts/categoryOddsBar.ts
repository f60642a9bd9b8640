import { scaleBand, scaleLinear } from "d3-scale";
import type { ChartInterval } from "./oddsByPhaseChart.js";
import { palette } from "./palette.js";
import {
  attrs,
  axisBottomBand,
  axisVertical,
  type ChartOptions,
  formatPercent,
  isDrawable,
  makeFrame,
  notEnoughData,
  svgOpen,
  svgText,
} from "./svgParts.js";

/** Input of {@link categoryOddsBar}: the chance of each activity category. */
export interface CategoryOddsBarInput {
  /** Chance of a below-normal fire year, with its interval. */
  readonly below: ChartInterval;
  /** Chance of a near-normal fire year, with its interval. */
  readonly near: ChartInterval;
  /** Chance of an above-normal fire year, with its interval. */
  readonly above: ChartInterval;
}

const MARGINS = { top: 16, right: 76, bottom: 58, left: 60 };
const CATEGORIES = [
  { key: "below", label: "Below normal" },
  { key: "near", label: "Near normal" },
  { key: "above", label: "Above normal" },
] as const;

/**
 * Category odds bars: the chance of a below-, near- and above-normal fire year as three bars
 * (blue, grey, amber) with interval whiskers, a dashed reference line at one third (labelled
 * "Equal odds (33%)") and, under each category name, the estimate in bold and its interval
 * below it, in whole percent ("53%", "(40–66%)").
 *
 * The y axis runs 0–100% in 20% steps. A category with a null estimate shows "not enough data"
 * in its place; when all three are null the plot shows "not enough data" over the axes.
 *
 * @param input - the three categories, each estimate and limits in [0, 1] or null.
 * @param options - viewBox width (default 680) and height (default 240).
 * @returns a self-contained `<svg>` string.
 * @throws RangeError when a width or height option is out of range.
 * @example
 * categoryOddsBar({ below: { estimate: 0.2, lower: 0.1, upper: 0.35 },
 *   near: { estimate: 0.3, lower: 0.18, upper: 0.45 }, above: { estimate: 0.5, lower: 0.35, upper: 0.65 } });
 * // => '<svg xmlns="http://www.w3.org/2000/svg" …</svg>'
 * @see Epstein E.S. (1969) "A scoring system for probability forecasts of ranked categories",
 * Journal of Applied Meteorology 8:985–987 (three ordered categories with equal climatological
 * odds of one third).
 */
export function categoryOddsBar(input: Readonly<CategoryOddsBarInput>, options?: ChartOptions): string {
  const frame = makeFrame(options, { width: 680, height: 240 }, MARGINS);
  const x = scaleBand<string>()
    .domain(CATEGORIES.map((category) => category.key))
    .range([frame.left, frame.right])
    .paddingInner(0.45)
    .paddingOuter(0.3);
  const y = scaleLinear().domain([0, 1]).range([frame.bottom, frame.top]).clamp(true);
  const labelOf = (key: string): string => CATEGORIES.find((category) => category.key === key)?.label ?? key;

  let body = axisVertical(y, frame, { title: "Chance", ticks: 5, format: ".0%", grid: true });
  body += axisBottomBand(x, frame, "", labelOf);
  let drawn = 0;
  for (const category of CATEGORIES) {
    const value = input[category.key];
    const start = x(category.key);
    if (start === undefined) continue;
    const middle = start + x.bandwidth() / 2;
    if (!isDrawable(value.estimate)) {
      body += svgText(middle, frame.bottom - 10, "not enough data", { "text-anchor": "middle", fill: palette.inkMuted, "font-style": "italic" });
      continue;
    }
    drawn += 1;
    const top = y(value.estimate);
    body += `<rect${attrs({ x: start, y: top, width: x.bandwidth(), height: Math.max(frame.bottom - top, 0.5), fill: palette[category.key], stroke: palette.inkMuted, "stroke-width": 0.6 })}/>`;
    if (isDrawable(value.lower) && isDrawable(value.upper)) {
      const yl = y(value.lower);
      const yu = y(value.upper);
      body += `<line${attrs({ x1: middle, x2: middle, y1: yl, y2: yu, stroke: palette.ink, "stroke-width": 1.5 })}/>`;
      for (const end of [yl, yu]) {
        body += `<line${attrs({ x1: middle - 7, x2: middle + 7, y1: end, y2: end, stroke: palette.ink, "stroke-width": 1.5 })}/>`;
      }
    }
    body += svgText(middle, frame.bottom + 33, formatPercent(value.estimate), {
      "text-anchor": "middle",
      "font-size": 13,
      "font-weight": 700,
      fill: palette.ink,
    });
    if (isDrawable(value.lower) && isDrawable(value.upper)) {
      const interval = `(${formatPercent(value.lower).replace("%", "")}\u2013${formatPercent(value.upper)})`;
      body += svgText(middle, frame.bottom + 48, interval, { "text-anchor": "middle", fill: palette.inkMuted });
    }
  }
  const third = y(1 / 3);
  body += `<line${attrs({ x1: frame.left, x2: frame.right, y1: third, y2: third, stroke: palette.ink, "stroke-width": 1.2, "stroke-dasharray": "6 4" })}/>`;
  body += svgText(frame.right + 6, third - 3, "Equal odds", { fill: palette.ink });
  body += svgText(frame.right + 6, third + 11, "(33%)", { fill: palette.ink });
  if (drawn === 0) body += notEnoughData(frame);
  return `${svgOpen(frame, "Chance of a below-, near- or above-normal fire year")}${body}</svg>`;
}
