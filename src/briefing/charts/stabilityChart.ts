import { scaleLinear } from "d3-scale";
import { area, line, symbol, symbolCircle, symbolDiamond, symbolSquare, symbolTriangle, type SymbolType } from "d3-shape";
import type { ChartInterval } from "./oddsByPhaseChart.js";
import { palette, phaseColour } from "./palette.js";
import {
  attrs,
  axisBottom,
  axisVertical,
  type ChartOptions,
  coord,
  formatPercent,
  isDrawable,
  legend,
  legendExtraHeight,
  type LegendEntry,
  makeFrame,
  notEnoughData,
  svgOpen,
} from "./svgParts.js";

/** One moving window in {@link stabilityChart}. */
export interface StabilityChartWindow {
  /** First calendar year of the window. */
  readonly first: number;
  /** Last calendar year of the window. */
  readonly last: number;
  /** Chance of a fire year per phase in this window (matched to `labels` by label). */
  readonly phases: readonly (ChartInterval & { readonly label: string })[];
}

/** Input of {@link stabilityChart}. */
export interface StabilityChartInput {
  /** Windows in any order. */
  readonly windows: readonly StabilityChartWindow[];
  /** Phase labels to draw, in legend order (escaped). */
  readonly labels: readonly string[];
  /** Chance of a fire year over the whole calibration period, in [0, 1] (null: not drawn). */
  readonly baseRate: number | null;
}

const MARGINS = { top: 12, right: 16, bottom: 64, left: 60 };
const MARKERS: readonly SymbolType[] = [symbolCircle, symbolTriangle, symbolSquare, symbolDiamond];

/**
 * Stability of the phase odds through time: for each phase, the chance of a fire year in moving
 * windows plotted at each window's middle year ((first + last) / 2), as a line with a marker
 * shape of its own and a light band across its interval, beside the dashed base-rate line
 * (legend "Average year (11%)").
 *
 * The y axis runs 0–100% (whole-percent ticks); x ticks are integer years. A window where a phase
 * has a null estimate breaks that phase's line; null limits break its band. With no drawable
 * estimate the plot shows "not enough data" over the axes. Phase colours follow their position
 * (first, middle, last: {@link phaseColour}, the same on every page); a second or later middle
 * phase is dotted. The average year is drawn in its own colour, dashed.
 *
 * @param input - windows, phase labels and base rate.
 * @param options - viewBox width (default 680) and height (default 260).
 * @returns a self-contained `<svg>` string.
 * @throws RangeError when a width or height option is out of range.
 * @example
 * stabilityChart({ labels: ["warm"], baseRate: 0.1, windows: [
 *   { first: 1700, last: 1799, phases: [{ label: "warm", estimate: 0.2, lower: 0.1, upper: 0.35 }] }] });
 * // => '<svg xmlns="http://www.w3.org/2000/svg" …</svg>'
 * @see Wilson E.B. (1927) "Probable inference, the law of succession, and statistical inference",
 * Journal of the American Statistical Association 22(158):209–212 (the interval drawn by default).
 */
export function stabilityChart(input: Readonly<StabilityChartInput>, options?: ChartOptions): string {
  const styles = input.labels.map((label, index) => ({
    label,
    colour: phaseColour(index, input.labels.length),
    marker: symbol(MARKERS[index % MARKERS.length] ?? symbolCircle, 36)() ?? "",
    // Every phase between the first and the last shares the middle-phase colour; the second and
    // later middle phases are dotted so they stay apart.
    dash: index >= 2 && index < input.labels.length - 1 ? "2 2" : undefined,
  }));
  const entries: LegendEntry[] = styles.map((style) => ({
    symbol: `<line${attrs({ x1: -8, x2: 8, y1: 0, y2: 0, stroke: style.colour, "stroke-width": 2, "stroke-dasharray": style.dash })}/><path${attrs({ d: style.marker, fill: style.colour })}/>`,
    label: style.label,
  }));
  entries.push({
    symbol: `<line${attrs({ x1: -8, x2: 8, y1: 0, y2: 0, stroke: palette.baseRate, "stroke-width": 1.8, "stroke-dasharray": "6 4" })}/>`,
    label: isDrawable(input.baseRate) ? `Average year (${formatPercent(input.baseRate)})` : "Average year: not enough data",
  });
  entries.push({
    symbol: `<rect${attrs({ x: -7, y: -5, width: 14, height: 10, fill: palette.interval, "fill-opacity": 0.5 })}/>`,
    label: "95% interval (each phase, its own colour, pale)",
  });
  const frame = makeFrame(options, { width: 680, height: 260 }, (width) => ({
    ...MARGINS,
    bottom: MARGINS.bottom + legendExtraHeight(entries, width),
  }));
  const windows = input.windows
    .filter((window) => isDrawable(window.first) && isDrawable(window.last))
    .map((window) => ({ middle: (window.first + window.last) / 2, window }))
    .sort((a, b) => a.middle - b.middle);
  const middles = windows.map((entry) => entry.middle);
  const low = middles.length > 0 ? middles.reduce((least, middle) => Math.min(least, middle), Infinity) : 0;
  const high = middles.length > 0 ? middles.reduce((most, middle) => Math.max(most, middle), -Infinity) : 100;
  const x = scaleLinear()
    .domain(high - low < 1 ? [low - 10, high + 10] : [low, high])
    .range([frame.left + 8, frame.right - 8]);
  const y = scaleLinear().domain([0, 1]).range([frame.bottom, frame.top]).clamp(true);

  let body = axisBottom(x, frame, { title: "Middle year of window", ticks: windows.length > 0 ? 8 : 0, format: "d", integer: true });
  body += axisVertical(y, frame, { title: "Chance of a high-fire year", ticks: 5, format: ".0%", grid: true });
  if (isDrawable(input.baseRate)) {
    body += `<line${attrs({ x1: frame.left, x2: frame.right, y1: y(input.baseRate), y2: y(input.baseRate), stroke: palette.baseRate, "stroke-width": 1.8, "stroke-dasharray": "6 4" })}/>`;
  }

  type Point = { middle: number; estimate: number | null; lower: number | null; upper: number | null };
  let drawn = 0;
  const series = styles.map((style) => ({
    ...style,
    points: windows.map(({ middle, window }): Point => {
      const phase = window.phases.find((candidate) => candidate.label === style.label);
      return {
        middle,
        estimate: phase && isDrawable(phase.estimate) ? phase.estimate : null,
        lower: phase && isDrawable(phase.lower) ? phase.lower : null,
        upper: phase && isDrawable(phase.upper) ? phase.upper : null,
      };
    }),
  }));
  for (const { colour, points } of series) {
    const band = area<Point>()
      .defined((point) => point.lower !== null && point.upper !== null)
      .x((point) => x(point.middle))
      .y0((point) => y(point.lower ?? 0))
      .y1((point) => y(point.upper ?? 0))(points);
    if (band) body += `<path${attrs({ d: band, fill: colour, "fill-opacity": 0.14 })}/>`;
  }
  for (const { colour, marker, dash, points } of series) {
    const path = line<Point>()
      .defined((point) => point.estimate !== null)
      .x((point) => x(point.middle))
      .y((point) => y(point.estimate ?? 0))(points);
    if (path) body += `<path${attrs({ d: path, fill: "none", stroke: colour, "stroke-width": 2, "stroke-dasharray": dash })}/>`;
    for (const point of points) {
      if (point.estimate === null) continue;
      drawn += 1;
      body += `<path${attrs({ d: marker, transform: `translate(${coord(x(point.middle))} ${coord(y(point.estimate))})`, fill: colour, stroke: palette.paper, "stroke-width": 0.8 })}/>`;
    }
  }
  if (drawn === 0) body += notEnoughData(frame);
  body += legend(entries, frame, frame.bottom + 52);
  return `${svgOpen(frame, "Chance of a high-fire year by phase in moving windows")}${body}</svg>`;
}
