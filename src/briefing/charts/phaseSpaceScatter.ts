import { scaleLinear } from "d3-scale";
import { symbol, symbolDiamond, symbolTriangle } from "d3-shape";
import { palette } from "./palette.js";
import {
  attrs,
  axisBottom,
  axisVertical,
  type ChartOptions,
  coord,
  estimateTextWidth,
  isDrawable,
  legend,
  legendExtraHeight,
  type LegendEntry,
  makeFrame,
  notEnoughData,
  paddedExtent,
  svgOpen,
  svgText,
  svgTextOnPanel,
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
const LABEL_FONT = 12;

interface LabelSpot {
  /** Where the leader line ends (the label's nearest corner or edge midpoint). */
  readonly anchorX: number;
  readonly anchorY: number;
  readonly textX: number;
  readonly textY: number;
  readonly anchor: "start" | "end" | "middle";
}

/**
 * A place for the "This season" label near the current-season marker where it covers the fewest
 * points and cut lines: 16 candidate boxes (8 directions at two distances) are scored by the
 * points under them, cut lines crossing them (3 each) and distance; boxes leaving the plot are not used.
 */
function labelSpot(
  marker: { readonly x: number; readonly y: number },
  frame: { readonly left: number; readonly right: number; readonly top: number; readonly bottom: number },
  points: readonly { readonly x: number; readonly y: number }[],
  cutXs: readonly number[],
  cutYs: readonly number[],
): LabelSpot {
  const width = estimateTextWidth("This season", LABEL_FONT) + 4;
  const height = LABEL_FONT + 2;
  let best: { spot: LabelSpot; score: number } | null = null;
  for (const reach of [26, 52]) {
    for (const [dx, dy] of [[1, -1], [-1, -1], [1, 1], [-1, 1], [0, -1], [0, 1], [1, 0], [-1, 0]] as const) {
      const anchorX = marker.x + dx * reach;
      const anchorY = marker.y + dy * reach * 0.75;
      const left = dx > 0 ? anchorX : dx < 0 ? anchorX - width : anchorX - width / 2;
      const top = dy > 0 ? anchorY : dy < 0 ? anchorY - height : anchorY - height / 2;
      if (left < frame.left + 2 || left + width > frame.right - 2 || top < frame.top + 2 || top + height > frame.bottom - 2) continue;
      const covered = points.filter((point) => point.x >= left - 4 && point.x <= left + width + 4 && point.y >= top - 4 && point.y <= top + height + 4).length;
      const crossed =
        cutXs.filter((cut) => cut >= left - 2 && cut <= left + width + 2).length + cutYs.filter((cut) => cut >= top - 2 && cut <= top + height + 2).length;
      const score = covered + 3 * crossed + reach / 52;
      if (best !== null && best.score <= score) continue;
      best = {
        score,
        spot: {
          anchorX,
          anchorY,
          textX: dx > 0 ? left + 2 : dx < 0 ? left + width - 2 : anchorX,
          textY: top + height - 3,
          anchor: dx > 0 ? "start" : dx < 0 ? "end" : "middle",
        },
      };
    }
  }
  if (best !== null) return best.spot;
  // No candidate fits inside the plot: beside the marker, towards the middle.
  const onRight = marker.x < (frame.left + frame.right) / 2;
  return { anchorX: marker.x, anchorY: marker.y, textX: onRight ? marker.x + 14 : marker.x - 14, textY: marker.y - 10 < frame.top + 10 ? marker.y + 20 : marker.y - 10, anchor: onRight ? "start" : "end" };
}
const triangle = symbol(symbolTriangle, 56);
const diamond = symbol(symbolDiamond, 260);

/**
 * Phase-space scatter of two climate indices: each calibration year is a point at its two
 * seasonal index values — other years small grey circles, fire years amber triangles — with the
 * phase cut points as dashed lines and this season as a large purple diamond labelled
 * "This season". The label goes where it covers the fewest points and cut lines (of 16 nearby
 * places), joined to the diamond by a short leader line when it sits away from it; the words
 * appear once (on a white panel, not in the legend), so the PDF's text layer holds them once.
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
  const entries: LegendEntry[] = [
    { symbol: `<circle${attrs({ r: 3, fill: palette.otherYear })}/>`, label: "Other years" },
    { symbol: `<path${attrs({ d: triangle() ?? "", fill: palette.fireYear, stroke: palette.ink, "stroke-width": 0.6 })}/>`, label: "High-fire years" },
    { symbol: `<line${attrs({ x1: -8, x2: 8, y1: 0, y2: 0, stroke: palette.inkMuted, "stroke-dasharray": "5 4" })}/>`, label: "Phase cuts" },
  ];
  // This season's diamond carries its own label, so the legend does not repeat "This season".
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
    body += `<path${attrs({ d: triangle() ?? "", transform: `translate(${coord(x(point.x))} ${coord(y(point.y))})`, fill: palette.fireYear, stroke: palette.ink, "stroke-width": 0.6 })}><title>${Math.round(point.year)} high-fire year</title></path>`;
  }
  if (points.length === 0) body += notEnoughData(frame);
  if (current) {
    const cx = x(current.x);
    const cy = y(current.y);
    body += `<path${attrs({ d: diamond() ?? "", transform: `translate(${coord(cx)} ${coord(cy)})`, fill: palette.current, stroke: palette.paper, "stroke-width": 2 })}/>`;
    const cutXs = input.xCuts.filter(isDrawable).map((cut) => x(cut));
    const cutYs = input.yCuts.filter(isDrawable).map((cut) => y(cut));
    const spot = labelSpot({ x: cx, y: cy }, frame, points.map((point) => ({ x: x(point.x), y: y(point.y) })), cutXs, cutYs);
    const distance = Math.hypot(spot.anchorX - cx, spot.anchorY - cy);
    if (distance > 16) {
      const ux = (spot.anchorX - cx) / distance;
      const uy = (spot.anchorY - cy) / distance;
      body += `<line${attrs({ class: "leader", x1: cx + ux * 11, y1: cy + uy * 11, x2: spot.anchorX - ux * 2, y2: spot.anchorY - uy * 2, stroke: palette.current, "stroke-width": 1.2 })}/>`;
    }
    body += svgTextOnPanel(spot.textX, spot.textY, "This season", {
      "text-anchor": spot.anchor,
      "font-size": LABEL_FONT,
      "font-weight": 700,
      fill: palette.current,
    });
  }

  body += legend(entries, frame, frame.bottom + 52);
  return `${svgOpen(frame, `${input.yName} against ${input.xName}, high-fire years marked`)}${body}</svg>`;
}
