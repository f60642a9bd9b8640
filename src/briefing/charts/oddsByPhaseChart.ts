import { scaleBand, scaleLinear } from "d3-scale";
import { palette, phaseColour } from "./palette.js";
import {
  attrs,
  axisBottom,
  type ChartOptions,
  formatPercent,
  isDrawable,
  legend,
  legendExtraHeight,
  type LegendEntry,
  LEGEND_INSET,
  makeFrame,
  notEnoughData,
  svgOpen,
  svgText,
  svgTextOnPanel,
} from "./svgParts.js";

/** A probability with its interval; any part may be null where it could not be computed. */
export interface ChartInterval {
  /** Probability in [0, 1], or null. */
  readonly estimate: number | null;
  /** Lower interval limit in [0, 1], or null. */
  readonly lower: number | null;
  /** Upper interval limit in [0, 1], or null. */
  readonly upper: number | null;
}

/** One index phase in {@link oddsByPhaseChart}. */
export interface OddsByPhaseRow extends ChartInterval {
  /** Phase label, e.g. "warm" (any text; escaped). */
  readonly label: string;
  /** Number of calibration years in the phase. */
  readonly years: number;
  /** True when the phase has few years: drawn hollow, with a legend note. */
  readonly smallSample: boolean;
  /** True for this season's phase: ringed in the this-season colour and labelled "this season". */
  readonly isCurrent?: boolean;
}

/** Input of {@link oddsByPhaseChart}. */
export interface OddsByPhaseChartInput {
  /** Name of the climate index, e.g. "ENSO" (escaped). */
  readonly indexName: string;
  /** Phases in display order (top to bottom). */
  readonly phases: readonly OddsByPhaseRow[];
  /** Chance of a fire year in all calibration years, with its interval. */
  readonly baseRate: ChartInterval;
}

const MARGINS = { top: 14, right: 150, bottom: 64, left: 112 };

/**
 * Conditional odds by phase chart: the chance of a fire year in each phase of one climate index,
 * a dot at the estimate and a line across its 95% interval, against the base rate (all years; legend "Average year (10%)")
 * drawn as a vertical line inside its shaded interval. Each dot takes the colour of its phase's
 * position (first, middle, last: {@link phaseColour}, the same on every page); this season's
 * phase is ringed in the this-season colour.
 *
 * Layout: one row per phase; x axis "Chance of a high-fire year" from 0% to 100% (ticks every 10%);
 * the right column reads "42% (28–57%) · 23 yr" — whole percent, fixed format. A phase flagged
 * `smallSample` has a hollow dot and a legend note "Hollow: few years". A phase with a null
 * estimate shows "not enough data" in its row; when no phase has an estimate the whole plot shows
 * "not enough data" over the axis.
 *
 * @param input - index name, phases and base rate (probabilities in [0, 1]; values outside are
 *   clamped to the axis, nulls and non-finite values are left out).
 * @param options - viewBox width (default 680) and height (default 40 + 34 per phase + 64, at least 180).
 * @returns a self-contained `<svg>` string.
 * @throws RangeError when a width or height option is out of range.
 * @example
 * oddsByPhaseChart({
 *   indexName: "ENSO",
 *   phases: [{ label: "warm", estimate: 0.3, lower: 0.2, upper: 0.42, years: 60, smallSample: false }],
 *   baseRate: { estimate: 0.1, lower: 0.07, upper: 0.14 },
 * }); // => '<svg xmlns="http://www.w3.org/2000/svg" …</svg>'
 * @see Wilson E.B. (1927) "Probable inference, the law of succession, and statistical inference",
 * Journal of the American Statistical Association 22(158):209–212 (the default interval drawn).
 */
export function oddsByPhaseChart(input: Readonly<OddsByPhaseChartInput>, options?: ChartOptions): string {
  const rows = input.phases;
  const base = input.baseRate;
  const entries: LegendEntry[] = [
    {
      symbol: `<line${attrs({ x1: -7, x2: 7, y1: 0, y2: 0, stroke: palette.ink, "stroke-width": 1.5 })}/><circle${attrs({ r: 4.5, fill: phaseColour(1, 3), stroke: palette.ink, "stroke-width": 1 })}/>`,
      label: "Chance in phase, 95% interval (dot colour: phase position)",
    },
    {
      symbol: `<rect${attrs({ x: -7, y: -6, width: 14, height: 12, fill: palette.baseRateTint })}/><line${attrs({ x1: 0, x2: 0, y1: -6, y2: 6, stroke: palette.baseRate, "stroke-width": 2, "stroke-dasharray": "3 2" })}/>`,
      label: isDrawable(base.estimate) ? `Average year (${formatPercent(base.estimate)})` : "Average year: not enough data",
    },
  ];
  if (input.phases.some((row) => row.smallSample && isDrawable(row.estimate))) {
    entries.push({
      symbol: `<circle${attrs({ r: 4.5, fill: palette.paper, stroke: palette.ink, "stroke-width": 1.5 })}/>`,
      label: "Hollow: few years",
    });
  }
  if (input.phases.some((row) => row.isCurrent === true && isDrawable(row.estimate))) {
    entries.push({
      symbol: `<circle${attrs({ r: 6.5, fill: "none", stroke: palette.current, "stroke-width": 2.5 })}/>`,
      label: "This season's phase",
    });
  }
  const defaultHeight = Math.max(180, MARGINS.top + 26 + 34 * Math.max(rows.length, 2) + MARGINS.bottom) +
    legendExtraHeight(entries, options?.width ?? 680);
  const frame = makeFrame(options, { width: 680, height: defaultHeight }, (width) => ({
    ...MARGINS,
    bottom: MARGINS.bottom + legendExtraHeight(entries, width),
  }));
  const plotTop = frame.top + 22;
  const x = scaleLinear().domain([0, 1]).range([frame.left, frame.right]).clamp(true);
  const y = scaleBand<string>()
    .domain(rows.map((_, index) => String(index)))
    .range([plotTop, frame.bottom])
    .paddingInner(0.25)
    .paddingOuter(0.2);

  let body = axisBottom(x, frame, { title: "Chance of a high-fire year", ticks: 10, format: ".0%", grid: true });
  body += svgTextOnPanel(LEGEND_INSET, frame.top + 8, `${input.indexName} phase`, {
    "font-size": 12,
    "font-weight": 600,
  });
  body += svgText(frame.right + 10, frame.top + 8, "Chance (95% interval) · years", {
    "font-size": 11,
    fill: palette.inkMuted,
  });

  if (isDrawable(base.lower) && isDrawable(base.upper)) {
    const x0 = x(Math.min(base.lower, base.upper));
    const x1 = x(Math.max(base.lower, base.upper));
    body += `<rect${attrs({ x: x0, y: plotTop, width: Math.max(x1 - x0, 0.5), height: frame.bottom - plotTop, fill: palette.baseRateTint })}/>`;
  }
  if (isDrawable(base.estimate)) {
    const xb = x(base.estimate);
    body += `<line${attrs({ x1: xb, x2: xb, y1: plotTop, y2: frame.bottom, stroke: palette.baseRate, "stroke-width": 2, "stroke-dasharray": "6 3" })}/>`;
  }

  const drawable = rows.filter((row) => isDrawable(row.estimate));
  rows.forEach((row, index) => {
    const colour = phaseColour(index, rows.length);
    const top = y(String(index));
    if (top === undefined) return;
    const cy = top + y.bandwidth() / 2;
    body += svgText(frame.left - 10, cy + 4, row.label, { "text-anchor": "end", "font-size": 12 });
    if (!isDrawable(row.estimate)) {
      body += svgText(frame.left + 8, cy + 4, "not enough data", { fill: palette.inkMuted, "font-style": "italic" });
      body += svgText(frame.right + 10, cy + 4, `\u2013 · ${Math.round(row.years)} yr`, { fill: palette.inkMuted });
      return;
    }
    if (isDrawable(row.lower) && isDrawable(row.upper)) {
      body += `<line${attrs({ x1: x(row.lower), x2: x(row.upper), y1: cy, y2: cy, stroke: palette.ink, "stroke-width": 1.5, "stroke-linecap": "round" })}/>`;
      for (const end of [row.lower, row.upper]) {
        body += `<line${attrs({ x1: x(end), x2: x(end), y1: cy - 5, y2: cy + 5, stroke: palette.ink, "stroke-width": 1.5 })}/>`;
      }
    }
    if (row.isCurrent === true) {
      body += `<circle${attrs({ class: "this-season", cx: x(row.estimate), cy, r: 9, fill: "none", stroke: palette.current, "stroke-width": 2.5 })}/>`;
    }
    body += `<circle${attrs({
      class: "phase-estimate",
      cx: x(row.estimate),
      cy,
      r: 5.5,
      fill: row.smallSample ? palette.paper : colour,
      stroke: row.smallSample ? colour : palette.ink,
      "stroke-width": row.smallSample ? 2.5 : 1,
    })}/>`;
    const interval =
      isDrawable(row.lower) && isDrawable(row.upper)
        ? ` (${formatPercent(row.lower).replace("%", "")}\u2013${formatPercent(row.upper)})`
        : "";
    body += svgText(frame.right + 10, cy + 4, `${formatPercent(row.estimate)}${interval} · ${Math.round(row.years)} yr`, {
      fill: palette.ink,
    });
  });
  if (drawable.length === 0) body += notEnoughData(frame);

  body += legend(entries, frame, frame.bottom + 52);
  return `${svgOpen(frame, `Chance of a high-fire year by ${input.indexName} phase`)}${body}</svg>`;
}
