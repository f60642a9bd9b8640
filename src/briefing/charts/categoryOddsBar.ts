import { scaleBand, scaleLinear } from "d3-scale";
import { symbol, symbolDiamond } from "d3-shape";
import type { ChartInterval } from "./oddsByPhaseChart.js";
import { palette } from "./palette.js";
import {
  attrs,
  axisBottomBand,
  axisVertical,
  type ChartOptions,
  coord,
  formatPercent,
  isDrawable,
  legend,
  type LegendEntry,
  makeFrame,
  notEnoughData,
  svgOpen,
  svgText,
  svgTextOnPanel,
} from "./svgParts.js";

/** Input of {@link categoryOddsBar}: the chance of each activity category this season and in an average year. */
export interface CategoryOddsBarInput {
  /** Chance of a below-normal fire year, with its interval. */
  readonly below: ChartInterval;
  /** Chance of a near-normal fire year, with its interval. */
  readonly near: ChartInterval;
  /** Chance of an above-normal fire year, with its interval. */
  readonly above: ChartInterval;
  /**
   * The average-year share of each category (the realised shares of the calibration years, in
   * [0, 1]; null where unknown), marked on its bar. Ties among quiet years can make these differ
   * from one third.
   */
  readonly averageYear: { readonly below: number | null; readonly near: number | null; readonly above: number | null };
}

/** Margins of the default chart, sized for half a page column (about 88 mm wide on A4). */
const MARGINS = { top: 34, right: 8, bottom: 54, left: 46 };
/** Size of the estimate under each bar and of the average-year labels, in user units. */
const VALUE_SIZE = 14;
const SMALL_SIZE = 12;
const CATEGORIES = [
  { key: "below", label: "Below normal" },
  { key: "near", label: "Near normal" },
  { key: "above", label: "Above normal" },
] as const;
const averageMarker = symbol(symbolDiamond, 70);

/**
 * Category odds bars: the chance of a below-, near- and above-normal fire year this season as
 * three bars (pale aqua, mid teal, deep teal: one hue, darker for more fire) with interval whiskers
 * and, on each bar, an average-year (khaki) diamond at the
 * category's average-year share labelled with that share ("avg 49%"); a legend over the plot names
 * the two ("This season, 95% interval", "Average year"). Under each category name the estimate
 * is printed in bold and its interval below it, in whole percent ("53%", "(40–66%)").
 *
 * The chart is drawn for half a page column: at its default 340 × 236 viewBox printed about
 * 88 mm wide, its smallest text (11 units) prints at about 8 pt. The y axis runs 0–100% in 20%
 * steps. A category with a null estimate shows "not enough data" in its place (its average-year
 * marker is still drawn); when all three are null the plot shows "not enough data" over the axes.
 *
 * @param input - the three categories, each estimate and limits in [0, 1] or null, and the
 *   average-year shares in [0, 1] or null.
 * @param options - viewBox width (default 340) and height (default 236).
 * @returns a self-contained `<svg>` string.
 * @throws RangeError when a width or height option is out of range.
 * @example
 * categoryOddsBar({ below: { estimate: 0.2, lower: 0.1, upper: 0.35 },
 *   near: { estimate: 0.3, lower: 0.18, upper: 0.45 }, above: { estimate: 0.5, lower: 0.35, upper: 0.65 },
 *   averageYear: { below: 0.49, near: 0.19, above: 0.32 } });
 * // => '<svg xmlns="http://www.w3.org/2000/svg" …</svg>'
 * @see Epstein E.S. (1969) "A scoring system for probability forecasts of ranked categories",
 * Journal of Applied Meteorology 8:985–987 (three ordered categories scored against their
 * climatological odds).
 */
export function categoryOddsBar(input: Readonly<CategoryOddsBarInput>, options?: ChartOptions): string {
  const frame = makeFrame(options, { width: 340, height: 236 }, MARGINS);
  const x = scaleBand<string>()
    .domain(CATEGORIES.map((category) => category.key))
    .range([frame.left, frame.right])
    .paddingInner(0.42)
    .paddingOuter(0.22);
  const y = scaleLinear().domain([0, 1]).range([frame.bottom, frame.top]).clamp(true);
  const labelOf = (key: string): string => CATEGORIES.find((category) => category.key === key)?.label ?? key;
  const diamond = averageMarker() ?? "";

  let body = axisVertical(y, frame, { title: "Chance", ticks: 5, format: ".0%", grid: true });
  body += axisBottomBand(x, frame, "", labelOf);
  let drawn = 0;
  for (const category of CATEGORIES) {
    const value = input[category.key];
    const start = x(category.key);
    if (start === undefined) continue;
    const middle = start + x.bandwidth() / 2;
    if (!isDrawable(value.estimate)) {
      body += svgText(middle, frame.bottom + 33, "not enough data", { "text-anchor": "middle", fill: palette.inkMuted, "font-style": "italic" });
    } else {
      drawn += 1;
      const top = y(value.estimate);
      body += `<rect${attrs({ x: start, y: top, width: x.bandwidth(), height: Math.max(frame.bottom - top, 0.5), fill: palette[category.key], stroke: palette.inkMuted, "stroke-width": 0.6 })}/>`;
      if (isDrawable(value.lower) && isDrawable(value.upper)) {
        const yl = y(value.lower);
        const yu = y(value.upper);
        // A white casing under the ink whisker keeps it legible on the darkest bar.
        for (const [stroke, width] of [[palette.paper, 3.5], [palette.ink, 1.5]] as const) {
          body += `<line${attrs({ x1: middle, x2: middle, y1: yl, y2: yu, stroke, "stroke-width": width })}/>`;
          for (const end of [yl, yu]) {
            body += `<line${attrs({ x1: middle - 6, x2: middle + 6, y1: end, y2: end, stroke, "stroke-width": width })}/>`;
          }
        }
      }
      body += svgText(middle, frame.bottom + 33, formatPercent(value.estimate), {
        "text-anchor": "middle",
        "font-size": VALUE_SIZE,
        "font-weight": 700,
        fill: palette.ink,
      });
      if (isDrawable(value.lower) && isDrawable(value.upper)) {
        const interval = `(${formatPercent(value.lower).replace("%", "")}\u2013${formatPercent(value.upper)})`;
        body += svgText(middle, frame.bottom + 48, interval, { "text-anchor": "middle", "font-size": SMALL_SIZE, fill: palette.inkMuted });
      }
    }
    const average = input.averageYear[category.key];
    if (isDrawable(average)) {
      const ay = y(Math.min(1, Math.max(0, average)));
      body += `<path${attrs({ class: "average-year", d: diamond, transform: `translate(${coord(middle)} ${coord(ay)})`, fill: palette.baseRate, stroke: palette.paper, "stroke-width": 1.4 })}/>`;
      // "avg 49%": the average year's share, not the bar's (the bar's own value is under it).
      body += svgTextOnPanel(start + x.bandwidth() + 4, ay + 4, `avg ${formatPercent(average)}`, {
        "font-size": SMALL_SIZE,
        fill: palette.ink,
      });
    }
  }
  if (drawn === 0) body += notEnoughData(frame);
  const entries: LegendEntry[] = [
    {
      symbol:
        `<rect${attrs({ x: -6, y: -5, width: 12, height: 10, fill: palette.paper, stroke: palette.inkMuted, "stroke-width": 0.8 })}/>` +
        `<line${attrs({ x1: 0, x2: 0, y1: -7, y2: 7, stroke: palette.ink, "stroke-width": 1.5 })}/>`,
      label: "This season, 95% interval",
    },
    { symbol: `<path${attrs({ d: diamond, fill: palette.baseRate, stroke: palette.paper, "stroke-width": 1.4 })}/>`, label: "Average year" },
  ];
  body += legend(entries, frame, 12);
  return `${svgOpen(frame, "Chance of a below-, near- or above-normal fire year, this season and in an average year")}${body}</svg>`;
}
