import { scaleLinear } from "d3-scale";
import { area, line } from "d3-shape";
import { palette } from "./palette.js";
import {
  attrs,
  axisVertical,
  AXIS_TITLE_SIZE,
  type ChartOptions,
  formatSigned,
  isDrawable,
  legend,
  legendExtraHeight,
  type LegendEntry,
  makeFrame,
  notEnoughData,
  paddedExtent,
  svgOpen,
  estimateTextWidth,
  LABEL_SIZE,
  svgText,
  svgTextOnPanel,
} from "./svgParts.js";

/** A pair of confidence limits [lower, upper], or null where not computed. */
export type ChartLimits = readonly [number, number] | null;

/** Input of {@link seaChart}: one superposed epoch analysis of one index. */
export interface SeaChartInput {
  /** Name of the climate index (escaped). */
  readonly indexName: string;
  /** Lags in years, ascending integers; 0 is the high-fire year, negative lags are years before. */
  readonly lags: readonly number[];
  /** Mean index departure at each lag (same length as `lags`); null where not computed. */
  readonly mean: readonly (number | null)[];
  /** 95% limits of the random-draw composites at each lag (what chance alone gives 95% of the time). */
  readonly ci95: readonly ChartLimits[];
  /** 99% limits of the random-draw composites at each lag. */
  readonly ci99: readonly ChartLimits[];
}

const MARGINS = { top: 22, right: 20, bottom: 64, left: 64 };

interface LagRow {
  readonly lag: number;
  readonly mean: number | null;
  readonly ci95: readonly [number, number] | null;
  readonly ci99: readonly [number, number] | null;
}

function limitsOf(limits: ChartLimits | undefined): readonly [number, number] | null {
  if (limits === null || limits === undefined || !isDrawable(limits[0]) || !isDrawable(limits[1])) return null;
  return [Math.min(limits[0], limits[1]), Math.max(limits[0], limits[1])];
}

/**
 * Superposed epoch analysis chart, drawn as a path through the years around the high-fire years:
 * the mean index departure at each lag is a dot on a thin connecting line, set against a shaded
 * envelope of what chance alone gives (the 95% range of the random-draw composites darker, the
 * 99% range paler). A dot beyond the 95% envelope is filled and labelled with its value; a dot
 * inside it is hollow. The column of the high-fire year (lag 0) is tinted in the high-fire-year
 * colour and labelled; a zero line marks "no departure".
 *
 * Lag labels are signed integers with a true minus sign ("−4" … "0" … "+2"); the y axis uses
 * d3's tick format. Null means are left out (the line breaks there); null limits leave a gap in
 * the envelope; non-finite lags are left out with their values; with no drawable mean the plot
 * shows "not enough data" over the axes.
 *
 * @param input - index name, lags and the per-lag mean and limits (arrays of equal length;
 *   missing entries count as null).
 * @param options - viewBox width (default 680) and height (default 250).
 * @returns a self-contained `<svg>` string.
 * @throws RangeError when a width or height option is out of range.
 * @example
 * seaChart({ indexName: "ENSO", lags: [-1, 0, 1], mean: [0.1, 0.6, -0.2],
 *   ci95: [[-0.3, 0.3], [-0.3, 0.3], [-0.3, 0.3]], ci99: [[-0.4, 0.4], [-0.4, 0.4], [-0.4, 0.4]] });
 * // => '<svg xmlns="http://www.w3.org/2000/svg" …</svg>'
 * @see Prager M.H., Hoenig J.M. (1989) "Superposed epoch analysis: a randomization test of
 * environmental effects on recruitment with application to chub mackerel", Transactions of the
 * American Fisheries Society 118:608–618.
 */
export function seaChart(input: Readonly<SeaChartInput>, options?: ChartOptions): string {
  const entries: LegendEntry[] = [
    {
      symbol: `<circle${attrs({ r: 4.5, fill: palette.estimate })}/>`,
      label: "Mean departure beyond what chance gives",
    },
    { symbol: `<circle${attrs({ r: 4, fill: palette.paper, stroke: palette.estimate, "stroke-width": 1.6 })}/>`, label: "within it" },
    { symbol: `<rect${attrs({ x: -8, y: -6, width: 16, height: 12, fill: palette.chance })}/>`, label: "Chance alone, 95% of random years" },
    { symbol: `<rect${attrs({ x: -8, y: -6, width: 16, height: 12, fill: palette.chanceOuter, stroke: palette.chance, "stroke-width": 0.8 })}/>`, label: "99%" },
  ];
  const frame = makeFrame(options, { width: 680, height: 250 }, (width) => ({
    ...MARGINS,
    bottom: MARGINS.bottom + legendExtraHeight(entries, width),
  }));

  const rows: LagRow[] = [];
  input.lags.forEach((lag, index) => {
    if (!isDrawable(lag)) return;
    const mean = input.mean[index];
    rows.push({ lag, mean: isDrawable(mean) ? mean : null, ci95: limitsOf(input.ci95[index]), ci99: limitsOf(input.ci99[index]) });
  });
  rows.sort((a, b) => a.lag - b.lag);
  let lowLag = 0;
  let highLag = 0;
  for (const row of rows) {
    lowLag = Math.min(lowLag, row.lag);
    highLag = Math.max(highLag, row.lag);
  }
  const x = scaleLinear()
    .domain([lowLag - 0.5, highLag + 0.5])
    .range([frame.left, frame.right]);

  const values: number[] = [0];
  for (const row of rows) {
    if (row.mean !== null) values.push(row.mean);
    for (const limits of [row.ci95, row.ci99]) if (limits !== null) values.push(limits[0], limits[1]);
  }
  const y = scaleLinear().domain(paddedExtent(values, 0.08)).range([frame.bottom, frame.top]).nice(6);

  let body = "";
  // The high-fire year's own column, tinted and named.
  const zeroLeft = x(-0.5);
  const zeroRight = x(0.5);
  body += svgText((zeroLeft + zeroRight) / 2, frame.top - 8, "High-fire year", {
    "text-anchor": "middle",
    "font-weight": 600,
    fill: palette.fireYear,
  });

  body += axisVertical(y, frame, { title: "Index departure from its mean", ticks: 6, grid: true });

  // Chance envelopes: 99% (paler) under 95%.
  for (const [key, fill, name] of [
    ["ci99", palette.chanceOuter, "chance-99"],
    ["ci95", palette.chance, "chance-95"],
  ] as const) {
    const band = area<LagRow>()
      .defined((row) => row[key] !== null)
      .x((row) => x(row.lag))
      .y0((row) => y(row[key]?.[0] ?? 0))
      .y1((row) => y(row[key]?.[1] ?? 0))(rows);
    if (band) body += `<path${attrs({ class: name, d: band, fill })}/>`;
  }
  // The high-fire year's column over the envelopes, translucent so both stay visible.
  body += `<rect${attrs({ class: "fire-year-column", x: zeroLeft, y: frame.top, width: zeroRight - zeroLeft, height: frame.bottom - frame.top, fill: palette.fireYearTint, "fill-opacity": 0.6 })}/>`;
  body += `<line${attrs({ x1: frame.left, x2: frame.right, y1: y(0), y2: y(0), stroke: palette.inkMuted, "stroke-width": 1 })}/>`;

  // Lag axis: signed integer labels, no ticks between lags.
  body += `<g class="axis axis-x">`;
  for (const row of rows) {
    const cx = x(row.lag);
    body += `<line${attrs({ x1: cx, x2: cx, y1: frame.bottom, y2: frame.bottom + 4, stroke: palette.inkMuted })}/>`;
    body += svgText(cx, frame.bottom + 16, formatSigned(row.lag, 0, true), { "text-anchor": "middle", fill: palette.inkMuted });
  }
  body += `<line${attrs({ x1: frame.left, x2: frame.right, y1: frame.bottom, y2: frame.bottom, stroke: palette.inkMuted })}/>`;
  body += svgText((frame.left + frame.right) / 2, frame.bottom + 33, "Years before (−) and after (+) a high-fire year", {
    "text-anchor": "middle",
    "font-size": AXIS_TITLE_SIZE,
    fill: palette.ink,
  });
  body += `</g>`;

  const path = line<LagRow>()
    .defined((row) => row.mean !== null)
    .x((row) => x(row.lag))
    .y((row) => y(row.mean ?? 0))(rows);
  if (path) body += `<path${attrs({ d: path, fill: "none", stroke: palette.inkMuted, "stroke-width": 1.2 })}/>`;

  let drawn = 0;
  for (const row of rows) {
    if (row.mean === null) continue;
    drawn += 1;
    const beyond = row.ci95 !== null && (row.mean < row.ci95[0] || row.mean > row.ci95[1]);
    const cx = x(row.lag);
    const cy = y(row.mean);
    body += `<circle${attrs({
      class: beyond ? "sea-mean beyond" : "sea-mean within",
      cx,
      cy,
      r: beyond ? 5.5 : 4.5,
      fill: beyond ? palette.estimate : palette.paper,
      stroke: palette.estimate,
      "stroke-width": beyond ? 1 : 1.6,
    })}><title>${formatSigned(row.mean, 2)}</title></circle>`;
    if (beyond) {
      // Above a positive dot, below a negative one; beside the dot when that would leave the plot
      // (never on the lag axis), and to the left when the right edge is too close.
      const above = row.mean >= 0;
      const text = formatSigned(row.mean, 2, true);
      const width = estimateTextWidth(text, LABEL_SIZE) * 1.1 + 4;
      let labelY = cy + (above ? -6 : 14);
      if (labelY > frame.bottom - 4 || labelY - LABEL_SIZE < frame.top) labelY = Math.min(cy + 4, frame.bottom - 3);
      const right = cx + 8 + width <= frame.right;
      body += svgTextOnPanel(right ? cx + 8 : cx - 8, labelY, text, { "font-weight": 600, fill: palette.ink, "text-anchor": right ? "start" : "end" });
    }
  }
  if (drawn === 0) body += notEnoughData(frame);

  body += legend(entries, frame, frame.bottom + 52);
  return `${svgOpen(frame, `Superposed epoch analysis of ${input.indexName} around high-fire years`)}${body}</svg>`;
}
