import { scaleLinear } from "d3-scale";
import { area, line, symbol, symbolDiamond } from "d3-shape";
import { palette } from "./palette.js";
import {
  attrs,
  axisBottom,
  axisVertical,
  type ChartOptions,
  coord,
  estimateTextWidth,
  formatSigned,
  isDrawable,
  LABEL_SIZE,
  legend,
  legendExtraHeight,
  type LegendEntry,
  makeFrame,
  notEnoughData,
  paddedExtent,
  svgOpen,
  svgTextOnPanel,
} from "./svgParts.js";

/** Input of {@link responseCurveChart}: one index's logistic response curve. */
export interface ResponseCurveChartInput {
  /** Name of the climate index (escaped). */
  readonly indexName: string;
  /** Fitted chance of a high-fire year with its pointwise band, ascending in value. */
  readonly points: readonly { readonly value: number; readonly estimate: number; readonly lower: number; readonly upper: number }[];
  /** Past calibration years: the index value and whether the year was a high-fire year. */
  readonly years: readonly { readonly value: number; readonly fireYear: boolean }[];
  /** This season's value, or null when there is none. */
  readonly current: number | null;
  /** Phase cuts of the index (drawn lightly), in index units. */
  readonly cuts: readonly number[];
  /** Band coverage, e.g. 0.95. */
  readonly level: number;
}

const MARGINS = { top: 14, right: 18, bottom: 64, left: 58 };
/** Height of the strip of year marks under the curve. */
const RUG = 26;

/**
 * Response-curve chart: the fitted chance of a high-fire year against the index value (ink line)
 * inside its pointwise band (light grey), the phase cuts as light vertical lines, and under the
 * curve a strip with one tick per past year at its index value — high-fire years as taller ticks
 * in the high-fire-year colour, other years short grey ticks — so the reader sees where the
 * record is thick and where the curve rests on few years. This season's value is a violet
 * vertical line with a diamond on the curve, labelled "this season".
 *
 * The x range covers the curve, the years and this season's value; the y axis runs 0 up to the
 * next 10% above the band (at least 50%). Non-finite entries are left out; with no curve point the
 * plot shows "not enough data".
 *
 * @param input - index name, curve points, past years, this season's value, cuts and band level.
 * @param options - viewBox width (default 680) and height (default 240).
 * @returns a self-contained `<svg>` string.
 * @throws RangeError when a width or height option is out of range.
 * @example
 * responseCurveChart({ indexName: "ENSO", points: [{ value: -2, estimate: 0.04, lower: 0.01, upper: 0.1 }, { value: 2, estimate: 0.4, lower: 0.25, upper: 0.57 }],
 *   years: [{ value: 1.6, fireYear: true }, { value: -0.3, fireYear: false }], current: 1.3, cuts: [-0.5, 0.5], level: 0.95 });
 * // => '<svg xmlns="http://www.w3.org/2000/svg" …</svg>'
 * @see Hosmer D.W., Lemeshow S., Sturdivant R.X. (2013) Applied Logistic Regression, 3rd edition,
 * Wiley, Hoboken NJ (fitted logistic curves with pointwise confidence bands).
 */
export function responseCurveChart(input: Readonly<ResponseCurveChartInput>, options?: ChartOptions): string {
  const level = isDrawable(input.level) ? Math.round(input.level * 100) : 95;
  const entries: LegendEntry[] = [
    { symbol: `<rect${attrs({ x: -8, y: -5, width: 16, height: 10, fill: palette.interval })}/><line${attrs({ x1: -8, x2: 8, y1: 0, y2: 0, stroke: palette.estimate, "stroke-width": 2 })}/>`, label: `Fitted chance, ${level}% band` },
    { symbol: `<line${attrs({ x1: 0, x2: 0, y1: -6, y2: 6, stroke: palette.fireYear, "stroke-width": 2 })}/>`, label: "High-fire year" },
    { symbol: `<line${attrs({ x1: 0, x2: 0, y1: -2, y2: 4, stroke: palette.otherYear, "stroke-width": 1.5 })}/>`, label: "Other year" },
    { symbol: `<line${attrs({ x1: 0, x2: 0, y1: -6, y2: 6, stroke: palette.current, "stroke-width": 2 })}/>`, label: "This season" },
    { symbol: `<line${attrs({ x1: 0, x2: 0, y1: -6, y2: 6, stroke: palette.grid, "stroke-width": 2, "stroke-dasharray": "3 2" })}/>`, label: "Phase cut" },
  ];
  const frame = makeFrame(options, { width: 680, height: 240 }, (width) => ({ ...MARGINS, bottom: MARGINS.bottom + legendExtraHeight(entries, width) }));
  const plot = { ...frame, bottom: frame.bottom - RUG };
  const points = input.points.filter((point) => isDrawable(point.value) && isDrawable(point.estimate) && isDrawable(point.lower) && isDrawable(point.upper)).slice().sort((a, b) => a.value - b.value);
  const years = input.years.filter((year) => isDrawable(year.value));
  const current = isDrawable(input.current) ? input.current : null;
  const cuts = input.cuts.filter(isDrawable);
  const values: number[] = [];
  for (const point of points) values.push(point.value);
  for (const year of years) values.push(year.value);
  if (current !== null) values.push(current);
  const x = scaleLinear().domain(paddedExtent(values, 0.03)).range([frame.left, frame.right]).nice(8);
  let top = 0.5;
  for (const point of points) top = Math.max(top, point.upper);
  top = Math.min(1, Math.ceil(top * 10 - 1e-9) / 10);
  const y = scaleLinear().domain([0, top]).range([plot.bottom, plot.top]).clamp(true);

  let body = axisVertical(y, plot, { title: "Chance of a high-fire year", ticks: 5, format: ".0%", grid: true });
  body += axisBottom(x, frame, { title: `${input.indexName} value this winter–spring`, ticks: 8 });
  const [low, high] = x.domain() as [number, number];
  for (const cut of cuts) {
    if (cut < low || cut > high) continue;
    body += `<line${attrs({ class: "phase-cut", x1: x(cut), x2: x(cut), y1: plot.top, y2: frame.bottom, stroke: palette.grid, "stroke-width": 1.5, "stroke-dasharray": "3 2" })}/>`;
  }
  if (points.length > 0) {
    const band = area<(typeof points)[number]>()
      .x((point) => x(point.value))
      .y0((point) => y(point.lower))
      .y1((point) => y(point.upper))(points);
    if (band) body += `<path${attrs({ class: "curve-band", d: band, fill: palette.interval })}/>`;
    const curve = line<(typeof points)[number]>()
      .x((point) => x(point.value))
      .y((point) => y(point.estimate))(points);
    if (curve) body += `<path${attrs({ class: "curve", d: curve, fill: "none", stroke: palette.estimate, "stroke-width": 2 })}/>`;
  } else {
    body += notEnoughData(plot);
  }
  // The strip of past years: one tick each, high-fire years taller and coloured.
  const rugTop = plot.bottom + 6;
  let other = "";
  let fire = "";
  for (const year of years) {
    const cx = coord(x(year.value));
    if (year.fireYear) fire += `M${cx} ${coord(rugTop)}V${coord(frame.bottom - 2)}`;
    else other += `M${cx} ${coord(frame.bottom - 10)}V${coord(frame.bottom - 2)}`;
  }
  if (other !== "") body += `<path${attrs({ class: "rug-other", d: other, stroke: palette.otherYear, "stroke-width": 1, "stroke-opacity": 0.7 })}/>`;
  if (fire !== "") body += `<path${attrs({ class: "rug-fire", d: fire, stroke: palette.fireYear, "stroke-width": 1.6 })}/>`;

  if (current !== null) {
    const cx = x(current);
    body += `<line${attrs({ class: "this-season", x1: cx, x2: cx, y1: plot.top, y2: frame.bottom, stroke: palette.current, "stroke-width": 2 })}/>`;
    const reading = interpolate(points, current);
    if (reading !== null) {
      const diamond = symbol(symbolDiamond, 90)() ?? "";
      body += `<path${attrs({ d: diamond, transform: `translate(${coord(cx)} ${coord(y(reading))})`, fill: palette.current, stroke: palette.paper, "stroke-width": 1.5 })}/>`;
    }
    // The label goes beside the line, on the side where its box stays inside the plot and covers no phase-cut
    // line (the wider-room side first); where neither side has room for one line, as two lines ("this season"
    // over the value) beside the line; only then just past the nearest cut, and at last wherever it fits.
    const lines = [`this season (${formatSigned(current, 2)})`, ["this season", `(${formatSigned(current, 2)})`]] as const;
    const widthOf = (text: string): number => estimateTextWidth(text, LABEL_SIZE) * 1.1 + 4;
    const cutXs = cuts.filter((cut) => cut >= low && cut <= high).map((cut) => x(cut));
    const preferred = cx < (frame.left + frame.right) / 2;
    type Candidate = { readonly right: boolean; readonly at: number; readonly text: string | readonly string[] };
    const besideLine = (text: Candidate["text"]): Candidate[] => [preferred, !preferred].map((right) => ({ right, at: cx + (right ? 6 : -6), text }));
    const pastCuts: Candidate[] = [];
    for (const right of [preferred, !preferred]) {
      const beyond = cutXs.filter((cutX) => (right ? cutX > cx : cutX < cx)).sort((a, b) => (right ? a - b : b - a));
      for (const cutX of beyond) pastCuts.push({ right, at: cutX + (right ? 5 : -5), text: lines[0] });
    }
    const span = (candidate: Candidate): [number, number] => {
      const width = typeof candidate.text === "string" ? widthOf(candidate.text) : Math.max(...candidate.text.map(widthOf));
      return candidate.right ? [candidate.at - 2, candidate.at + width] : [candidate.at - width, candidate.at + 2];
    };
    const fits = (candidate: Candidate): boolean => span(candidate)[0] >= frame.left && span(candidate)[1] <= frame.right;
    const clear = (candidate: Candidate): boolean => {
      const [from, to] = span(candidate);
      return cutXs.every((cutX) => cutX < from || cutX > to) && (cx < from || cx > to);
    };
    const oneLine = besideLine(lines[0]);
    const chosen =
      [...oneLine, ...besideLine(lines[1]), ...pastCuts].find((candidate) => fits(candidate) && clear(candidate)) ??
      [...oneLine, ...pastCuts].find(fits) ??
      (oneLine[0] as Candidate);
    const labelAttributes = { "text-anchor": chosen.right ? "start" : "end", fill: palette.current, "font-weight": 600 };
    const rows = typeof chosen.text === "string" ? [chosen.text] : chosen.text;
    rows.forEach((row, i) => {
      body += svgTextOnPanel(chosen.at, plot.top + 12 + i * (LABEL_SIZE + 2), row, labelAttributes);
    });
  }
  body += legend(entries, frame, frame.bottom + 52);
  return `${svgOpen(frame, `Chance of a high-fire year against the ${input.indexName} value`)}${body}</svg>`;
}

/** The fitted chance at a value by linear interpolation between curve points; null outside them. */
function interpolate(points: readonly { readonly value: number; readonly estimate: number }[], value: number): number | null {
  for (let i = 1; i < points.length; i += 1) {
    const a = points[i - 1]!;
    const b = points[i]!;
    if (value >= a.value && value <= b.value) return b.value === a.value ? a.estimate : a.estimate + ((value - a.value) / (b.value - a.value)) * (b.estimate - a.estimate);
  }
  return null;
}
