import { scaleLinear, scaleSqrt } from "d3-scale";
import { line } from "d3-shape";
import { palette } from "./palette.js";
import {
  attrs,
  axisBottom,
  axisVertical,
  type ChartOptions,
  estimateTextWidth,
  isDrawable,
  legend,
  legendExtraHeight,
  type LegendEntry,
  makeFrame,
  notEnoughData,
  svgOpen,
  svgText,
} from "./svgParts.js";

/** One forecast-probability bin in {@link reliabilityDiagram}. */
export interface ReliabilityChartBin {
  /** Lower edge of the bin, probability in [0, 1]. */
  readonly lower: number;
  /** Upper edge of the bin, probability in [0, 1]. */
  readonly upper: number;
  /** Number of hindcasts in the bin (≥ 0). */
  readonly count: number;
  /** Mean forecast probability of the bin, or null when empty. */
  readonly meanForecast: number | null;
  /** Observed relative frequency of fire years in the bin, or null when empty. */
  readonly observedFrequency: number | null;
}

/** Input of {@link reliabilityDiagram}. */
export interface ReliabilityDiagramInput {
  /** Bins in ascending order of probability. */
  readonly bins: readonly ReliabilityChartBin[];
  /** Climatological frequency of fire years, in [0, 1]. */
  readonly climatology: number | null;
}

const MARGINS = { top: 40, right: 16, bottom: 80, left: 60 };
/** Largest dot radius, px. */
const MAX_RADIUS = 11;
/** Gap between the plot's edges and the 0% and 100% positions, so no dot covers a tick label. */
const INSET = MAX_RADIUS + 2;
/** Font size of the row of counts and its label. */
const COUNT_SIZE = 10;

/**
 * Reliability diagram: observed frequency of fire years against mean forecast probability per
 * bin, with the diagonal of perfect reliability (dashed), the climatological frequency as a
 * horizontal and a vertical teal line, and one dot per non-empty bin whose area is proportional to
 * its number of hindcasts; the counts (integers) are written in a row above the plot, each above
 * its dot (nudged right only where two counts would overlap), under the words "Years per bin".
 *
 * Both axes run 0–100% with ticks every 20% (whole-percent format); 0% and 100% sit a dot's
 * radius inside the plot's edges, so the largest dot never covers a tick label. Bins with a null mean
 * forecast or observed frequency, or a zero count, are left out; with none left the plot shows
 * "not enough data" over the axes.
 *
 * @param input - bins and the climatological frequency.
 * @param options - viewBox width (default 340, half a page column) and height (default 330).
 * @returns a self-contained `<svg>` string.
 * @throws RangeError when a width or height option is out of range.
 * @example
 * reliabilityDiagram({ bins: [{ lower: 0, upper: 0.2, count: 40, meanForecast: 0.08, observedFrequency: 0.1 }],
 *   climatology: 0.1 }); // => '<svg xmlns="http://www.w3.org/2000/svg" …</svg>'
 * @see Murphy A.H., Winkler R.L. (1977) "Reliability of subjective probability forecasts of
 * precipitation and temperature", Journal of the Royal Statistical Society Series C (Applied
 * Statistics) 26(1):41–47 (the reliability diagram).
 */
export function reliabilityDiagram(input: Readonly<ReliabilityDiagramInput>, options?: ChartOptions): string {
  const entries: LegendEntry[] = [
      { symbol: `<circle${attrs({ r: 5, fill: palette.estimate })}/>`, label: "Hindcast bins (larger dot: more years)" },
      { symbol: `<line${attrs({ x1: -8, x2: 8, y1: 5, y2: -5, stroke: palette.inkMuted, "stroke-dasharray": "5 4" })}/>`, label: "Perfect reliability" },
      { symbol: `<line${attrs({ x1: -8, x2: 8, y1: 0, y2: 0, stroke: palette.baseRate, "stroke-width": 1.5, "stroke-dasharray": "2 3" })}/>`, label: "Average year (climatology)" },
    ];
  const frame = makeFrame(options, { width: 340, height: 330 }, (width) => ({
    ...MARGINS,
    bottom: MARGINS.bottom + legendExtraHeight(entries, width),
  }));
  const x = scaleLinear().domain([0, 1]).range([frame.left + INSET, frame.right - INSET]).clamp(true);
  const y = scaleLinear().domain([0, 1]).range([frame.bottom - INSET, frame.top + INSET]).clamp(true);
  const bins = input.bins.filter(
    (bin): bin is ReliabilityChartBin & { meanForecast: number; observedFrequency: number } =>
      isDrawable(bin.meanForecast) && isDrawable(bin.observedFrequency) && isDrawable(bin.count) && bin.count > 0,
  );
  const maxCount = Math.max(1, ...bins.map((bin) => bin.count));
  const radius = scaleSqrt().domain([0, maxCount]).range([0, MAX_RADIUS]);

  let body = axisBottom(x, frame, { title: "Forecast chance of a high-fire year", ticks: 5, format: ".0%", grid: true });
  body += axisVertical(y, frame, { title: "Observed frequency", ticks: 5, format: ".0%", grid: true });
  body += `<line${attrs({ x1: x(0), y1: y(0), x2: x(1), y2: y(1), stroke: palette.inkMuted, "stroke-dasharray": "5 4" })}/>`;
  if (isDrawable(input.climatology)) {
    body += `<line${attrs({ x1: frame.left, x2: frame.right, y1: y(input.climatology), y2: y(input.climatology), stroke: palette.baseRate, "stroke-width": 1.5, "stroke-dasharray": "2 3" })}/>`;
    body += `<line${attrs({ x1: x(input.climatology), x2: x(input.climatology), y1: frame.top, y2: frame.bottom, stroke: palette.baseRate, "stroke-width": 1.5, "stroke-dasharray": "2 3" })}/>`;
  }
  const path = line<{ meanForecast: number; observedFrequency: number }>()
    .x((bin) => x(bin.meanForecast))
    .y((bin) => y(bin.observedFrequency))(bins);
  if (path && bins.length > 1) body += `<path${attrs({ d: path, fill: "none", stroke: palette.estimate, "stroke-width": 1.5 })}/>`;
  for (const bin of bins) {
    const cx = x(bin.meanForecast);
    const cy = y(bin.observedFrequency);
    const r = Math.max(2.5, radius(bin.count));
    body += `<circle${attrs({ cx, cy, r, fill: palette.estimate, "fill-opacity": 0.85, stroke: palette.paper, "stroke-width": 1 })}/>`;
  }
  if (bins.length > 0) {
    body += svgText(frame.left, frame.top - 24, "Years per bin", { "font-size": COUNT_SIZE, fill: palette.inkMuted });
  }
  let previousRight = Number.NEGATIVE_INFINITY;
  for (const bin of bins) {
    const label = String(Math.round(bin.count));
    const half = estimateTextWidth(label, COUNT_SIZE) / 2;
    const centre = Math.max(x(bin.meanForecast), previousRight + 4 + half);
    previousRight = centre + half;
    body += svgText(centre, frame.top - 8, label, {
      "text-anchor": "middle",
      "font-size": COUNT_SIZE,
      fill: palette.inkMuted,
    });
  }
  if (bins.length === 0) body += notEnoughData(frame);

  body += legend(entries, frame, frame.bottom + 52);
  return `${svgOpen(frame, "Reliability of the hindcast high-fire-year probabilities")}${body}</svg>`;
}
