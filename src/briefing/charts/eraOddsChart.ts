import { scaleLinear } from "d3-scale";
import { symbol, symbolTriangle } from "d3-shape";
import type { ChartInterval } from "./oddsByPhaseChart.js";
import { palette, phaseColour } from "./palette.js";
import {
  attrs,
  axisBottom,
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
  svgText,
} from "./svgParts.js";

/** One index in {@link eraOddsChart}: its phases' odds in the fire-scar era and in the modern record. */
export interface EraOddsIndex {
  /** Index name (escaped). */
  readonly name: string;
  readonly phases: readonly {
    readonly label: string;
    readonly fireScar: ChartInterval;
    readonly modern: ChartInterval;
  }[];
}

/** Input of {@link eraOddsChart}. */
export interface EraOddsChartInput {
  readonly indices: readonly EraOddsIndex[];
  /** Base rates (average year) of the two eras, in [0, 1]; null: not drawn. */
  readonly fireScarBase: number | null;
  readonly modernBase: number | null;
  /** Labels of the two eras, e.g. "Fire-scar record 1700–1990" and "Modern record 1950–2024" (escaped). */
  readonly fireScarLabel: string;
  readonly modernLabel: string;
}

const MARGINS = { top: 10, right: 20, bottom: 60, left: 150 };
const ROW = 32;
const HEADING = 20;

/**
 * "Then and now" chart: for each index and phase, the chance of a high-fire year in the fire-scar
 * era (filled dot) and in the modern record (filled triangle, a little below), each across its 95%
 * interval, coloured by the phase's position (first, middle, last) as on every page; the two eras'
 * average years are khaki lines, solid for the fire-scar era and dashed for the modern record.
 *
 * x runs from 0 to the next 10% above the largest estimate or upper limit (at least 50%). Missing estimates are left out; with none at all the chart
 * shows "not enough data".
 *
 * @param input - indices with their phases' two-era odds, the two base rates and era labels.
 * @param options - viewBox width (default 680) and height (default from the number of rows).
 * @returns a self-contained `<svg>` string.
 * @throws RangeError when a width or height option is out of range.
 * @example
 * eraOddsChart({ indices: [{ name: "ENSO", phases: [{ label: "warm", fireScar: { estimate: 0.28, lower: 0.2, upper: 0.38 }, modern: { estimate: 0.3, lower: 0.15, upper: 0.5 } }] }],
 *   fireScarBase: 0.1, modernBase: 0.1, fireScarLabel: "Fire-scar record", modernLabel: "Modern record" });
 * // => '<svg xmlns="http://www.w3.org/2000/svg" …</svg>'
 * @see Wilson E.B. (1927) "Probable inference, the law of succession, and statistical inference",
 * Journal of the American Statistical Association 22(158):209–212 (the intervals drawn).
 */
export function eraOddsChart(input: Readonly<EraOddsChartInput>, options?: ChartOptions): string {
  // The modern record is a filled triangle: hollow marks mean "small sample" elsewhere in the briefing.
  const triangle = symbol(symbolTriangle, 64)() ?? "";
  const entries: LegendEntry[] = [
    { symbol: `<circle${attrs({ r: 4.5, fill: palette.phaseMiddle, stroke: palette.ink, "stroke-width": 1 })}/>`, label: input.fireScarLabel },
    { symbol: `<path${attrs({ d: triangle, fill: palette.phaseMiddle, stroke: palette.ink, "stroke-width": 1 })}/>`, label: input.modernLabel },
    { symbol: `<line${attrs({ x1: 0, x2: 0, y1: -6, y2: 6, stroke: palette.baseRate, "stroke-width": 2 })}/>`, label: "Average year, then" },
    { symbol: `<line${attrs({ x1: 0, x2: 0, y1: -6, y2: 6, stroke: palette.baseRate, "stroke-width": 2, "stroke-dasharray": "3 2" })}/>`, label: "and now" },
  ];
  const rows = input.indices.reduce((sum, index) => sum + index.phases.length, 0);
  const height = Math.max(160, MARGINS.top + HEADING * input.indices.length + ROW * rows + MARGINS.bottom + legendExtraHeight(entries, options?.width ?? 680));
  const frame = makeFrame(options, { width: 680, height }, (width) => ({ ...MARGINS, bottom: MARGINS.bottom + legendExtraHeight(entries, width) }));
  let top = 0.5;
  for (const index of input.indices) {
    for (const phase of index.phases) {
      for (const interval of [phase.fireScar, phase.modern]) {
        for (const value of [interval.estimate, interval.upper]) if (isDrawable(value)) top = Math.max(top, value);
      }
    }
  }
  top = Math.min(1, Math.ceil(top * 10 - 1e-9) / 10);
  const x = scaleLinear().domain([0, top]).range([frame.left, frame.right]).clamp(true);
  let body = axisBottom(x, frame, { title: "Chance of a high-fire year", ticks: 5, format: ".0%", grid: true });
  for (const [base, dash] of [[input.fireScarBase, undefined], [input.modernBase, "3 2"]] as const) {
    if (isDrawable(base)) body += `<line${attrs({ x1: x(base), x2: x(base), y1: frame.top, y2: frame.bottom, stroke: palette.baseRate, "stroke-width": 1.8, "stroke-dasharray": dash })}/>`;
  }
  let cursor = frame.top;
  let drawn = 0;
  const whisker = (interval: ChartInterval, cy: number, colour: string): string =>
    isDrawable(interval.lower) && isDrawable(interval.upper)
      ? `<line${attrs({ x1: x(Math.min(interval.lower, interval.upper)), x2: x(Math.max(interval.lower, interval.upper)), y1: cy, y2: cy, stroke: colour, "stroke-width": 1.4 })}/>`
      : "";
  for (const index of input.indices) {
    body += svgText(8, cursor + 14, index.name, { "font-weight": 600, "font-size": 12 });
    cursor += HEADING;
    index.phases.forEach((phase, position) => {
      const colour = phaseColour(position, index.phases.length);
      const cy = cursor + ROW / 2 - 6;
      body += svgText(frame.left - 10, cy + 3, phase.label, { "text-anchor": "end" });
      if (isDrawable(phase.fireScar.estimate)) {
        drawn += 1;
        body += whisker(phase.fireScar, cy, palette.ink);
        body += `<circle${attrs({ class: "era-fire-scar", cx: x(phase.fireScar.estimate), cy, r: 5, fill: colour, stroke: palette.ink, "stroke-width": 1 })}/>`;
      }
      if (isDrawable(phase.modern.estimate)) {
        drawn += 1;
        body += whisker(phase.modern, cy + 9, palette.inkMuted);
        body += `<path${attrs({ class: "era-modern", d: triangle, transform: `translate(${coord(x(phase.modern.estimate))} ${coord(cy + 9)})`, fill: colour, stroke: palette.ink, "stroke-width": 1 })}/>`;
      }
      const label = `${isDrawable(phase.fireScar.estimate) ? formatPercent(phase.fireScar.estimate) : "\u2013"} / ${isDrawable(phase.modern.estimate) ? formatPercent(phase.modern.estimate) : "\u2013"}`;
      body += svgText(frame.left - 10, cy + 16, `then / now: ${label}`, { "text-anchor": "end", fill: palette.inkMuted, "font-size": 10 });
      cursor += ROW;
    });
  }
  if (drawn === 0) body += notEnoughData(frame);
  body += legend(entries, frame, frame.bottom + 50);
  return `${svgOpen(frame, "Chance of a high-fire year by phase, fire-scar era and modern record")}${body}</svg>`;
}
