import { scaleLinear } from "d3-scale";
import { area, curveStepAfter, line } from "d3-shape";
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
  svgTextOnPanel,
} from "./svgParts.js";

/** Input of {@link corpReliabilityChart}: a CORP reliability diagram (src/stats/corpReliability.ts). */
export interface CorpReliabilityChartInput {
  /** Recalibration (PAV) curve: one point per distinct forecast value, ascending. */
  readonly points: readonly { readonly forecast: number; readonly calibrated: number; readonly count: number }[];
  /** Consistency band under calibration at each distinct forecast value. */
  readonly band: readonly { readonly forecast: number; readonly lower: number; readonly upper: number }[];
  /** Coverage of the band, e.g. 0.9. */
  readonly level: number;
  /** The chance of a high-fire year in an average year, drawn as a reference line; null: not drawn. */
  readonly baseRate: number | null;
}

const MARGINS = { top: 14, right: 14, bottom: 64, left: 58 };

/**
 * CORP reliability diagram: the recalibrated chance (isotonic, pool-adjacent-violators fit of the
 * outcomes on the forecasts) against the forecast chance, as a stepped ink line with a dot per
 * distinct forecast value (dot area ∝ number of years), over the consistency band (what a
 * calibrated forecast would give, shaded in the chance colour) and the dashed diagonal of
 * perfect reliability; the average year's chance is a khaki dotted line.
 *
 * Both axes share one range, 0 up to 10% beyond the largest forecast or recalibrated value (at
 * least 0–40%), in whole percent; band limits above it are cut at the edge. Non-finite points are left out; with none left
 * the plot shows "not enough data" over the axes.
 *
 * @param input - curve points, band, band level and base rate (probabilities in [0, 1]).
 * @param options - viewBox width (default 340) and height (default 300).
 * @returns a self-contained `<svg>` string.
 * @throws RangeError when a width or height option is out of range.
 * @example
 * corpReliabilityChart({ points: [{ forecast: 0.1, calibrated: 0.08, count: 40 }, { forecast: 0.3, calibrated: 0.33, count: 12 }],
 *   band: [{ forecast: 0.1, lower: 0.05, upper: 0.16 }, { forecast: 0.3, lower: 0.12, upper: 0.5 }], level: 0.95, baseRate: 0.1 });
 * // => '<svg xmlns="http://www.w3.org/2000/svg" …</svg>'
 * @see Dimitriadis T., Gneiting T., Jordan A.I. (2021) "Stable reliability diagrams for
 * probabilistic classifiers", Proceedings of the National Academy of Sciences 118(8):e2016191118.
 */
export function corpReliabilityChart(input: Readonly<CorpReliabilityChartInput>, options?: ChartOptions): string {
  // The level is read from the CORP result, never assumed: without one the legend names no level.
  const level = isDrawable(input.level) && input.level > 0 && input.level < 1 ? `${Math.round(input.level * 100)}% ` : "";
  const entries: LegendEntry[] = [
    { symbol: `<line${attrs({ x1: -8, x2: 8, y1: 0, y2: 0, stroke: palette.estimate, "stroke-width": 2 })}/>`, label: "Recalibrated (PAV)" },
    { symbol: `<rect${attrs({ x: -7, y: -5, width: 14, height: 10, fill: palette.chance })}/>`, label: `${level}band if calibrated` },
    { symbol: `<line${attrs({ x1: -8, x2: 8, y1: 0, y2: 0, stroke: palette.baseRate, "stroke-width": 1.6, "stroke-dasharray": "2 2" })}/>`, label: "Average year" },
  ];
  const frame = makeFrame(options, { width: 340, height: 300 }, (width) => ({ ...MARGINS, bottom: MARGINS.bottom + legendExtraHeight(entries, width) }));
  const points = input.points.filter((point) => isDrawable(point.forecast) && isDrawable(point.calibrated) && isDrawable(point.count)).slice().sort((a, b) => a.forecast - b.forecast);
  const band = input.band.filter((entry) => isDrawable(entry.forecast) && isDrawable(entry.lower) && isDrawable(entry.upper)).slice().sort((a, b) => a.forecast - b.forecast);
  // The axes cover the forecasts and their recalibrated values (at least 0–30%); a band limit
  // above that is cut at the top edge rather than shrinking the curve.
  let top = 0.3;
  for (const point of points) top = Math.max(top, point.forecast, point.calibrated);
  top = Math.min(1, Math.ceil(top * 10 + 1 - 1e-9) / 10);
  const x = scaleLinear().domain([0, top]).range([frame.left, frame.right]).clamp(true);
  const y = scaleLinear().domain([0, top]).range([frame.bottom, frame.top]).clamp(true);

  let body = axisBottom(x, frame, { title: "Forecast chance of a high-fire year", ticks: 5, format: ".0%", grid: true });
  body += axisVertical(y, frame, { title: "Recalibrated chance", ticks: 5, format: ".0%", grid: true });
  if (band.length > 0) {
    const shaded = area<{ forecast: number; lower: number; upper: number }>()
      .x((entry) => x(entry.forecast))
      .y0((entry) => y(entry.lower))
      .y1((entry) => y(entry.upper))
      .curve(curveStepAfter)(band.length === 1 ? [band[0]!, { ...band[0]!, forecast: Math.min(top, band[0]!.forecast + 0.01) }] : band);
    if (shaded) body += `<path${attrs({ class: "consistency-band", d: shaded, fill: palette.chance })}/>`;
  }
  body += `<line${attrs({ x1: x(0), y1: y(0), x2: x(top), y2: y(top), stroke: palette.inkMuted, "stroke-width": 1, "stroke-dasharray": "5 3" })}/>`;
  if (isDrawable(input.baseRate)) {
    body += `<line${attrs({ x1: frame.left, x2: frame.right, y1: y(input.baseRate), y2: y(input.baseRate), stroke: palette.baseRate, "stroke-width": 1.6, "stroke-dasharray": "2 2" })}/>`;
  }
  if (points.length > 0) {
    const curve = line<{ forecast: number; calibrated: number }>()
      .x((point) => x(point.forecast))
      .y((point) => y(point.calibrated))
      .curve(curveStepAfter)(points);
    if (curve) body += `<path${attrs({ class: "pav-curve", d: curve, fill: "none", stroke: palette.estimate, "stroke-width": 2 })}/>`;
    let most = 1;
    for (const point of points) most = Math.max(most, point.count);
    for (const point of points) {
      body += `<circle${attrs({ class: "pav-point", cx: x(point.forecast), cy: y(point.calibrated), r: 1.5 + 4.5 * Math.sqrt(Math.max(0, point.count) / most), fill: palette.estimate, stroke: palette.paper, "stroke-width": 0.8 })}/>`;
    }
    body += svgTextOnPanel(frame.right - 4, frame.bottom - 8, "on the dashed line: reliable", { "text-anchor": "end", fill: palette.inkMuted, "font-size": 10 });
  } else {
    body += notEnoughData(frame);
  }
  body += legend(entries, frame, frame.bottom + 52);
  return `${svgOpen(frame, "CORP reliability diagram of the hindcast")}${body}</svg>`;
}
