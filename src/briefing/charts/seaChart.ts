import { scaleBand, scaleLinear } from "d3-scale";
import { curveStepAfter, line } from "d3-shape";
import { palette } from "./palette.js";
import {
  attrs,
  axisBottomBand,
  axisVertical,
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
} from "./svgParts.js";

/** A pair of confidence limits [lower, upper], or null where not computed. */
export type ChartLimits = readonly [number, number] | null;

/** Input of {@link seaChart}: one superposed epoch analysis of one index. */
export interface SeaChartInput {
  /** Name of the climate index (escaped). */
  readonly indexName: string;
  /** Lags in years, ascending integers; 0 is the fire year, negative lags are years before. */
  readonly lags: readonly number[];
  /** Mean index departure at each lag (same length as `lags`); null where not computed. */
  readonly mean: readonly (number | null)[];
  /** 95% limits of the random-draw composites at each lag. */
  readonly ci95: readonly ChartLimits[];
  /** 99% limits of the random-draw composites at each lag. */
  readonly ci99: readonly ChartLimits[];
}

const MARGINS = { top: 12, right: 16, bottom: 64, left: 64 };

/**
 * Superposed epoch analysis chart: bars of the mean index departure at each lag around the fire
 * years (lag 0 = fire year), with the 95% limits (teal, solid) and 99% limits (purple, dashed) of
 * the random-draw composites as stepped lines, and a zero line.
 *
 * Bars outside their 95% limits are dark blue, the others pale blue. Tick labels on the y axis use
 * d3's two-significant-digit tick format; lag labels are signed integers with a true minus sign
 * ("−6" … "0" … "+4"). Null means are left out; null limits leave a gap in the stepped line;
 * with no drawable mean the plot shows "not enough data" over the axes.
 *
 * @param input - index name, lags and the per-lag mean and limits (arrays of equal length;
 *   missing entries count as null; a non-finite lag is left out with its values).
 * @param options - viewBox width (default 680) and height (default 260).
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
      { symbol: `<rect${attrs({ x: -7, y: -5, width: 14, height: 10, fill: palette.estimate })}/>`, label: "Mean departure outside 95% limits" },
      { symbol: `<rect${attrs({ x: -7, y: -5, width: 14, height: 10, fill: palette.interval })}/>`, label: "inside" },
      { symbol: `<line${attrs({ x1: -8, x2: 8, y1: 0, y2: 0, stroke: palette.limit95, "stroke-width": 2 })}/>`, label: "95% limits" },
      { symbol: `<line${attrs({ x1: -8, x2: 8, y1: 0, y2: 0, stroke: palette.limit99, "stroke-width": 2, "stroke-dasharray": "5 3" })}/>`, label: "99% limits" },
    ];
  const frame = makeFrame(options, { width: 680, height: 260 }, (width) => ({
    ...MARGINS,
    bottom: MARGINS.bottom + legendExtraHeight(entries, width),
  }));
  const keys = input.lags.filter(isDrawable).map((lag) => String(lag));
  const x = scaleBand<string>().domain(keys).range([frame.left, frame.right]).paddingInner(0.3).paddingOuter(0.15);
  const step = x.step();

  const values: number[] = [0];
  input.lags.forEach((_, index) => {
    const mean = input.mean[index];
    if (isDrawable(mean)) values.push(mean);
    for (const limits of [input.ci95[index], input.ci99[index]]) {
      if (limits && isDrawable(limits[0]) && isDrawable(limits[1])) values.push(limits[0], limits[1]);
    }
  });
  const y = scaleLinear()
    .domain(paddedExtent(values, 0))
    .range([frame.bottom, frame.top])
    .nice(6);

  let body = "";
  const fireBand = x("0");
  if (fireBand !== undefined) {
    body += `<rect${attrs({ x: fireBand - (step - x.bandwidth()) / 2, y: frame.top, width: step, height: frame.bottom - frame.top, fill: palette.shade })}/>`;
  }
  body += axisVertical(y, frame, { title: "Index departure", ticks: 6, grid: true });
  body += axisBottomBand(x, frame, "Years from high-fire year", (key) => formatSigned(Number(key), 0, true));

  let drawn = 0;
  input.lags.forEach((lag, index) => {
    const mean = input.mean[index];
    const start = x(String(lag));
    if (!isDrawable(mean) || start === undefined) return;
    drawn += 1;
    const limits = input.ci95[index];
    const beyond =
      limits !== null && limits !== undefined && isDrawable(limits[0]) && isDrawable(limits[1])
        ? mean < Math.min(limits[0], limits[1]) || mean > Math.max(limits[0], limits[1])
        : false;
    const y0 = y(0);
    const y1 = y(mean);
    body += `<rect${attrs({
      x: start,
      y: Math.min(y0, y1),
      width: x.bandwidth(),
      height: Math.max(Math.abs(y1 - y0), 0.5),
      fill: beyond ? palette.estimate : palette.interval,
    })}><title>${formatSigned(mean, 2)}</title></rect>`;
  });

  const stepped = (limitsList: readonly ChartLimits[], side: 0 | 1): string => {
    const points: { x: number; y: number | null }[] = [];
    input.lags.forEach((lag, index) => {
      const start = x(String(lag));
      if (start === undefined) return;
      const limits = limitsList[index];
      const value = limits && isDrawable(limits[0]) && isDrawable(limits[1]) ? limits[side] : null;
      const gap = (step - x.bandwidth()) / 2;
      points.push({ x: Math.max(frame.left, start - gap), y: value });
      points.push({ x: Math.min(frame.right, start + x.bandwidth() + gap), y: value });
    });
    const path = line<{ x: number; y: number | null }>()
      .defined((point) => point.y !== null)
      .x((point) => point.x)
      .y((point) => y(point.y ?? 0))
      .curve(curveStepAfter)(points);
    return path ?? "";
  };
  for (const [limitsList, colour, dash] of [
    [input.ci99, palette.limit99, "5 3"],
    [input.ci95, palette.limit95, undefined],
  ] as const) {
    for (const side of [0, 1] as const) {
      const d = stepped(limitsList, side);
      if (d !== "") body += `<path${attrs({ d, fill: "none", stroke: colour, "stroke-width": 1.8, "stroke-dasharray": dash })}/>`;
    }
  }
  body += `<line${attrs({ x1: frame.left, x2: frame.right, y1: y(0), y2: y(0), stroke: palette.ink, "stroke-width": 1 })}/>`;
  if (drawn === 0) body += notEnoughData(frame);

  body += legend(entries, frame, frame.bottom + 52);
  return `${svgOpen(frame, `Superposed epoch analysis of ${input.indexName} around high-fire years`)}${body}</svg>`;
}
