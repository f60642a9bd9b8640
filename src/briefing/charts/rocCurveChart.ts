import { scaleLinear } from "d3-scale";
import { area as areaShape, line } from "d3-shape";
import { palette } from "./palette.js";
import {
  attrs,
  axisBottom,
  axisVertical,
  type ChartOptions,
  isDrawable,
  legend,
  legendExtraHeight,
  type LegendEntry,
  makeFrame,
  notEnoughData,
  svgOpen,
  svgText,
} from "./svgParts.js";

/** One point of a ROC curve: rates in [0, 1]. */
export interface RocChartPoint {
  /** False alarm rate (probability of false detection), in [0, 1]. */
  readonly falseAlarmRate: number;
  /** Hit rate (probability of detection), in [0, 1]. */
  readonly hitRate: number;
}

/** Input of {@link rocCurveChart}. */
export interface RocCurveChartInput {
  /** Points of the curve in any order. */
  readonly points: readonly RocChartPoint[];
  /** Area under the curve in [0, 1], or null when not computed. */
  readonly area: number | null;
}

const MARGINS = { top: 12, right: 16, bottom: 80, left: 60 };

/**
 * Relative operating characteristic (ROC) chart: hit rate against false alarm rate of the
 * hindcast fire-year probabilities at each probability threshold, the no-skill diagonal (dashed),
 * the curve with its points and a lightly shaded area beneath, and the label "Area 0.72" (two
 * decimals; "Area: not enough data" when the area is null).
 *
 * The curve is drawn through the points sorted by false alarm rate then hit rate, anchored at
 * (0, 0) and (1, 1) when those corners are missing. Points with a non-finite rate are left out;
 * with none left the plot shows "not enough data" over the axes.
 *
 * @param input - curve points and area.
 * @param options - viewBox width (default 340, half a page column) and height (default 330).
 * @returns a self-contained `<svg>` string.
 * @throws RangeError when a width or height option is out of range.
 * @example
 * rocCurveChart({ points: [{ falseAlarmRate: 0.2, hitRate: 0.6 }], area: 0.7 });
 * // => '<svg xmlns="http://www.w3.org/2000/svg" …</svg>'
 * @see Mason S.J., Graham N.E. (2002) "Areas beneath the relative operating characteristics (ROC)
 * and relative operating levels (ROL) curves: statistical significance and interpretation",
 * Quarterly Journal of the Royal Meteorological Society 128:2145–2166.
 */
export function rocCurveChart(input: Readonly<RocCurveChartInput>, options?: ChartOptions): string {
  const entries: LegendEntry[] = [
      { symbol: `<line${attrs({ x1: -8, x2: 8, y1: 0, y2: 0, stroke: palette.estimate, "stroke-width": 2 })}/><circle${attrs({ r: 3, fill: palette.estimate })}/>`, label: "Hindcast ROC curve" },
      { symbol: `<line${attrs({ x1: -8, x2: 8, y1: 5, y2: -5, stroke: palette.inkMuted, "stroke-dasharray": "5 4" })}/>`, label: "No skill (area 0.50)" },
    ];
  const frame = makeFrame(options, { width: 340, height: 330 }, (width) => ({
    ...MARGINS,
    bottom: MARGINS.bottom + legendExtraHeight(entries, width),
  }));
  const x = scaleLinear().domain([0, 1]).range([frame.left, frame.right]).clamp(true);
  const y = scaleLinear().domain([0, 1]).range([frame.bottom, frame.top]).clamp(true);
  const given = input.points
    .filter((point) => isDrawable(point.falseAlarmRate) && isDrawable(point.hitRate))
    .slice()
    .sort((a, b) => a.falseAlarmRate - b.falseAlarmRate || a.hitRate - b.hitRate);

  let body = axisBottom(x, frame, { title: "False alarm rate", ticks: 5, format: ".1f", grid: true });
  body += axisVertical(y, frame, { title: "Hit rate", ticks: 5, format: ".1f", grid: true });
  body += `<line${attrs({ x1: x(0), y1: y(0), x2: x(1), y2: y(1), stroke: palette.inkMuted, "stroke-dasharray": "5 4" })}/>`;
  if (given.length === 0) {
    body += notEnoughData(frame);
  } else {
    const curve = given.slice();
    const first = curve[0];
    const last = curve[curve.length - 1];
    if (first && (first.falseAlarmRate !== 0 || first.hitRate !== 0)) curve.unshift({ falseAlarmRate: 0, hitRate: 0 });
    if (last && (last.falseAlarmRate !== 1 || last.hitRate !== 1)) curve.push({ falseAlarmRate: 1, hitRate: 1 });
    const fill = areaShape<RocChartPoint>()
      .x((point) => x(point.falseAlarmRate))
      .y0(y(0))
      .y1((point) => y(point.hitRate))(curve);
    if (fill) body += `<path${attrs({ d: fill, fill: palette.estimate, "fill-opacity": 0.1 })}/>`;
    const path = line<RocChartPoint>()
      .x((point) => x(point.falseAlarmRate))
      .y((point) => y(point.hitRate))(curve);
    if (path) body += `<path${attrs({ d: path, fill: "none", stroke: palette.estimate, "stroke-width": 2 })}/>`;
    for (const point of given) {
      body += `<circle${attrs({ cx: x(point.falseAlarmRate), cy: y(point.hitRate), r: 3, fill: palette.estimate, stroke: palette.paper, "stroke-width": 1 })}/>`;
    }
  }
  const areaText = isDrawable(input.area) ? `Area ${input.area.toFixed(2)}` : "Area: not enough data";
  body += svgText(frame.right - 8, frame.bottom - 10, areaText, {
    "text-anchor": "end",
    "font-size": 13,
    "font-weight": 700,
    fill: palette.estimate,
  });
  body += legend(entries, frame, frame.bottom + 52);
  return `${svgOpen(frame, "ROC curve of the hindcast high-fire-year probabilities")}${body}</svg>`;
}
