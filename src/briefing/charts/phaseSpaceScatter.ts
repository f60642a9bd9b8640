import { scaleLinear } from "d3-scale";
import { symbol, symbolDiamond, symbolTriangle } from "d3-shape";
import { palette } from "./palette.js";
import {
  attrs,
  axisBottom,
  axisVertical,
  type ChartOptions,
  coord,
  isDrawable,
  legend,
  legendExtraHeight,
  type LegendEntry,
  makeFrame,
  notEnoughData,
  paddedExtent,
  svgOpen,
  svgText,
} from "./svgParts.js";

/** One calibration year in {@link phaseSpaceScatter}. */
export interface PhaseSpacePoint {
  /** Value of the first index (x). */
  readonly x: number | null;
  /** Value of the second index (y). */
  readonly y: number | null;
  /** True for a fire year. */
  readonly fireYear: boolean;
  /** Calendar year (shown in the point's tooltip title). */
  readonly year: number;
}

/** Input of {@link phaseSpaceScatter}. */
export interface PhaseSpaceScatterInput {
  /** Name of the x index (escaped). */
  readonly xName: string;
  /** Name of the y index (escaped). */
  readonly yName: string;
  /** One point per calibration year; points with a null coordinate are left out. */
  readonly points: readonly PhaseSpacePoint[];
  /** This season's values, or null when not known. */
  readonly current: { readonly x: number | null; readonly y: number | null } | null;
  /** Phase cut points of the x index (dashed vertical lines). */
  readonly xCuts: readonly number[];
  /** Phase cut points of the y index (dashed horizontal lines). */
  readonly yCuts: readonly number[];
}

const MARGINS = { top: 12, right: 16, bottom: 64, left: 64 };
const triangle = symbol(symbolTriangle, 56);
const diamond = symbol(symbolDiamond, 260);

/**
 * Phase-space scatter of two climate indices: each calibration year is a point at its two
 * seasonal index values — other years small grey circles, fire years amber triangles — with the
 * phase cut points as dashed lines and this season as a large purple diamond labelled
 * "This season".
 *
 * Axis ticks use d3's default tick format for the domain (fixed decimals per axis). Points with a
 * null or non-finite coordinate are left out; with no drawable point the plot shows "not enough
 * data" over the axes (the current season is still drawn when known).
 *
 * @param input - index names, points, current values and cut points.
 * @param options - viewBox width (default 680) and height (default 320).
 * @returns a self-contained `<svg>` string.
 * @throws RangeError when a width or height option is out of range.
 * @example
 * phaseSpaceScatter({ xName: "ENSO", yName: "PDO",
 *   points: [{ x: 1.2, y: 0.4, fireYear: true, year: 1748 }],
 *   current: { x: 0.8, y: -0.2 }, xCuts: [-0.5, 0.5], yCuts: [-0.5, 0.5] });
 * // => '<svg xmlns="http://www.w3.org/2000/svg" …</svg>'
 * @see Cleveland W.S., McGill R. (1984) "Graphical perception: theory, experimentation, and
 * application to the development of graphical methods", Journal of the American Statistical
 * Association 79(387):531–554 (position on common scales; redundant shape coding).
 */
export function phaseSpaceScatter(input: Readonly<PhaseSpaceScatterInput>, options?: ChartOptions): string {
  const currentKnown = input.current !== null && isDrawable(input.current.x) && isDrawable(input.current.y);
  const entries: LegendEntry[] = [
    { symbol: `<circle${attrs({ r: 3, fill: palette.otherYear })}/>`, label: "Other years" },
    { symbol: `<path${attrs({ d: triangle() ?? "", fill: palette.fireYear, stroke: palette.ink, "stroke-width": 0.6 })}/>`, label: "Fire years" },
    { symbol: `<line${attrs({ x1: -8, x2: 8, y1: 0, y2: 0, stroke: palette.inkMuted, "stroke-dasharray": "5 4" })}/>`, label: "Phase cuts" },
  ];
  if (currentKnown) {
    entries.push({ symbol: `<path${attrs({ d: symbol(symbolDiamond, 90)() ?? "", fill: palette.current })}/>`, label: "This season" });
  }
  const frame = makeFrame(options, { width: 680, height: 320 }, (width) => ({
    ...MARGINS,
    bottom: MARGINS.bottom + legendExtraHeight(entries, width),
  }));
  const points = input.points.filter(
    (point): point is PhaseSpacePoint & { x: number; y: number } => isDrawable(point.x) && isDrawable(point.y),
  );
  const current =
    input.current !== null && isDrawable(input.current.x) && isDrawable(input.current.y)
      ? { x: input.current.x, y: input.current.y }
      : null;
  const xs = [...points.map((point) => point.x), ...input.xCuts.filter(isDrawable)];
  const ys = [...points.map((point) => point.y), ...input.yCuts.filter(isDrawable)];
  if (current) {
    xs.push(current.x);
    ys.push(current.y);
  }
  const x = scaleLinear().domain(paddedExtent(xs, 0.04)).range([frame.left, frame.right]).nice(8);
  const y = scaleLinear().domain(paddedExtent(ys, 0.04)).range([frame.bottom, frame.top]).nice(6);

  let body = axisBottom(x, frame, { title: input.xName, ticks: 8, grid: true });
  body += axisVertical(y, frame, { title: input.yName, ticks: 6, grid: true });
  const [xLow, xHigh] = x.domain() as [number, number];
  const [yLow, yHigh] = y.domain() as [number, number];
  for (const cut of input.xCuts) {
    if (!isDrawable(cut) || cut < xLow || cut > xHigh) continue;
    body += `<line${attrs({ x1: x(cut), x2: x(cut), y1: frame.top, y2: frame.bottom, stroke: palette.inkMuted, "stroke-dasharray": "5 4" })}/>`;
  }
  for (const cut of input.yCuts) {
    if (!isDrawable(cut) || cut < yLow || cut > yHigh) continue;
    body += `<line${attrs({ x1: frame.left, x2: frame.right, y1: y(cut), y2: y(cut), stroke: palette.inkMuted, "stroke-dasharray": "5 4" })}/>`;
  }

  for (const point of points.filter((candidate) => !candidate.fireYear)) {
    body += `<circle${attrs({ cx: x(point.x), cy: y(point.y), r: 2.6, fill: palette.otherYear, "fill-opacity": 0.85 })}><title>${Math.round(point.year)}</title></circle>`;
  }
  for (const point of points.filter((candidate) => candidate.fireYear)) {
    body += `<path${attrs({ d: triangle() ?? "", transform: `translate(${coord(x(point.x))} ${coord(y(point.y))})`, fill: palette.fireYear, stroke: palette.ink, "stroke-width": 0.6 })}><title>${Math.round(point.year)} fire year</title></path>`;
  }
  if (points.length === 0) body += notEnoughData(frame);
  if (current) {
    const cx = x(current.x);
    const cy = y(current.y);
    body += `<path${attrs({ d: diamond() ?? "", transform: `translate(${coord(cx)} ${coord(cy)})`, fill: palette.current, stroke: "#ffffff", "stroke-width": 2 })}/>`;
    const onRight = cx < (frame.left + frame.right) / 2;
    const labelX = onRight ? cx + 14 : cx - 14;
    const labelY = cy - 10 < frame.top + 10 ? cy + 20 : cy - 10;
    body += svgText(labelX, labelY, "This season", {
      "text-anchor": onRight ? "start" : "end",
      "font-size": 12,
      "font-weight": 700,
      fill: palette.current,
      stroke: "#ffffff",
      "stroke-width": 3,
      "paint-order": "stroke",
    });
  }

  body += legend(entries, frame, frame.bottom + 52);
  return `${svgOpen(frame, `${input.yName} against ${input.xName}, fire years marked`)}${body}</svg>`;
}
