import { scaleLinear } from "d3-scale";
import { area, curveStepAfter, line } from "d3-shape";
import { palette } from "./palette.js";
import {
  attrs,
  axisBottom,
  axisVertical,
  type ChartOptions,
  formatSigned,
  isDrawable,
  legend,
  legendExtraHeight,
  type LegendEntry,
  makeFrame,
  notEnoughData,
  svgOpen,
  svgText,
  svgTextOnPanel,
} from "./svgParts.js";

/** One year of the fire record in {@link activityTimeline}. */
export interface ActivityTimelineYear {
  /** Calendar year. */
  readonly year: number;
  /** Fire activity in the chosen measure (≥ 0), or null where not usable. */
  readonly activity: number | null;
  /** Number of sites recording (sample depth), ≥ 0. */
  readonly sitesRecording: number;
  /** True for a high-fire year. */
  readonly fireYear: boolean;
}

/** Input of {@link activityTimeline}. */
export interface ActivityTimelineInput {
  /** Years of the record (any order; a few centuries). */
  readonly years: readonly ActivityTimelineYear[];
  /** High-fire threshold in the activity measure, or null when none. */
  readonly threshold: number | null;
  /** Axis title of the activity measure, e.g. "Share of recording sites burned" (escaped). */
  readonly measureLabel: string;
  /** The calibration period, shaded. */
  readonly calibration: { readonly first: number; readonly last: number };
}

const MARGINS = { top: 22, right: 20, bottom: 64, left: 64 };
/** Height of the sample-depth strip under the activity panel, and the gap between them. */
const STRIP = 40;
const GAP = 12;

/**
 * Fire-record timeline in two stacked panels that share the year axis.
 *
 * Upper panel: fire activity per year as a thin line (grey in the calibration period, lighter grey
 * outside it — high-fire years are chosen only among calibration years, so a tall peak outside is
 * not a missed one), with every high-fire year marked by a dot in the high-fire-year colour, the
 * high-fire threshold as a dashed line labelled with its value, and the calibration period shaded
 * and labelled "Calibration 1700–1990". Lower strip: sample depth (sites recording) as a light
 * area with its own small axis, so the depth never shares a scale with the activity.
 *
 * Years with null activity break the line and get no dot. x ticks come from scale.ticks()
 * (integer years); the threshold label uses two decimals when below 1 and an integer otherwise.
 * With no drawable activity the upper panel shows "not enough data".
 *
 * @param input - years, threshold, measure label and calibration period.
 * @param options - viewBox width (default 680) and height (default 300).
 * @returns a self-contained `<svg>` string.
 * @throws RangeError when a width or height option is out of range.
 * @example
 * activityTimeline({ years: [{ year: 1700, activity: 0.3, sitesRecording: 12, fireYear: true }],
 *   threshold: 0.25, measureLabel: "Share of sites burned", calibration: { first: 1700, last: 1990 } });
 * // => '<svg xmlns="http://www.w3.org/2000/svg" …</svg>'
 * @see Cleveland W.S. (1994) The Elements of Graphing Data, revised edition, Hobart Press,
 * Summit NJ (juxtaposed panels on a shared scale instead of a second axis).
 */
export function activityTimeline(input: Readonly<ActivityTimelineInput>, options?: ChartOptions): string {
  const thresholdText = isDrawable(input.threshold)
    ? `High-fire threshold (${input.threshold < 1 ? formatSigned(input.threshold, 2) : String(Math.round(input.threshold))})`
    : "High-fire threshold: none";
  const entries: LegendEntry[] = [
    { symbol: `<circle${attrs({ r: 3.2, fill: palette.fireYear })}/>`, label: "High-fire years" },
    { symbol: `<line${attrs({ x1: -8, x2: 8, y1: 0, y2: 0, stroke: palette.otherYear, "stroke-width": 1.6 })}/>`, label: "Activity, calibration years" },
    { symbol: `<line${attrs({ x1: -8, x2: 8, y1: 0, y2: 0, stroke: palette.outsideYear, "stroke-width": 2 })}/>`, label: "Outside calibration (not used)" },
    { symbol: `<line${attrs({ x1: -8, x2: 8, y1: 0, y2: 0, stroke: palette.ink, "stroke-width": 1.2, "stroke-dasharray": "6 3" })}/>`, label: thresholdText },
    { symbol: `<rect${attrs({ x: -7, y: -5, width: 14, height: 10, fill: palette.sampleDepth })}/>`, label: "Sites recording (lower strip)" },
  ];
  const frame = makeFrame(options, { width: 680, height: 300 }, (width) => ({
    ...MARGINS,
    bottom: MARGINS.bottom + legendExtraHeight(entries, width),
  }));
  const mainFrame = { ...frame, bottom: frame.bottom - STRIP - GAP };
  const stripFrame = { ...frame, top: frame.bottom - STRIP };

  const years = input.years.filter((entry) => isDrawable(entry.year)).slice().sort((a, b) => a.year - b.year);
  const calibration = input.calibration;
  const calibrationKnown = isDrawable(calibration.first) && isDrawable(calibration.last);
  let firstYear = Number.POSITIVE_INFINITY;
  let lastYear = Number.NEGATIVE_INFINITY;
  for (const year of [...years.map((entry) => entry.year), ...(calibrationKnown ? [calibration.first, calibration.last] : [])]) {
    firstYear = Math.min(firstYear, year);
    lastYear = Math.max(lastYear, year);
  }
  if (!isDrawable(firstYear) || !isDrawable(lastYear)) {
    firstYear = 0;
    lastYear = 100;
  }
  const x = scaleLinear()
    .domain([firstYear - 0.5, lastYear + 0.5 + (firstYear === lastYear ? 1 : 0)])
    .range([frame.left, frame.right]);
  let maxActivity = isDrawable(input.threshold) ? Math.max(0, input.threshold) : 0;
  let maxDepth = 0;
  for (const entry of years) {
    if (isDrawable(entry.activity)) maxActivity = Math.max(maxActivity, entry.activity);
    if (isDrawable(entry.sitesRecording)) maxDepth = Math.max(maxDepth, entry.sitesRecording);
  }
  const y = scaleLinear()
    .domain([0, maxActivity > 1e-9 ? maxActivity : 1])
    .range([mainFrame.bottom, mainFrame.top])
    .nice(4)
    .clamp(true);
  const depth = scaleLinear()
    .domain([0, Math.max(maxDepth, 5)])
    .range([stripFrame.bottom, stripFrame.top])
    .nice(2);

  const calibrationLow = calibrationKnown ? Math.min(calibration.first, calibration.last) : Number.NEGATIVE_INFINITY;
  const calibrationHigh = calibrationKnown ? Math.max(calibration.first, calibration.last) : Number.POSITIVE_INFINITY;
  const inCalibration = (year: number): boolean => year >= calibrationLow && year <= calibrationHigh;

  let body = "";
  if (calibrationKnown) {
    const x0 = x(calibrationLow - 0.5);
    const x1 = x(calibrationHigh + 0.5);
    body += `<rect${attrs({ x: x0, y: mainFrame.top, width: x1 - x0, height: mainFrame.bottom - mainFrame.top, fill: palette.shade })}/>`;
    body += svgText((x0 + x1) / 2, mainFrame.top - 7, `Calibration ${Math.round(calibrationLow)}\u2013${Math.round(calibrationHigh)}`, {
      "text-anchor": "middle",
      fill: palette.inkMuted,
    });
  }
  body += axisVertical(y, mainFrame, { title: input.measureLabel, ticks: 4, grid: true });
  body += axisVertical(depth, stripFrame, { title: "Sites", ticks: 2, format: "d", integer: true });
  body += axisBottom(x, frame, { title: "Year", ticks: 8, format: "d", integer: true });

  // Sample depth: a light stepped area in the lower strip.
  const depthPoints = years
    .filter((entry) => isDrawable(entry.sitesRecording))
    .map((entry) => ({ year: entry.year, depth: Math.max(0, entry.sitesRecording) }));
  const lastDepth = depthPoints[depthPoints.length - 1];
  if (lastDepth) depthPoints.push({ year: lastDepth.year + 1, depth: lastDepth.depth });
  const depthArea = area<{ year: number; depth: number }>()
    .x((point) => x(point.year - 0.5))
    .y0(depth(0))
    .y1((point) => depth(point.depth))
    .curve(curveStepAfter)(depthPoints);
  if (depthArea && depthPoints.length > 1) body += `<path${attrs({ class: "sample-depth", d: depthArea, fill: palette.sampleDepth })}/>`;

  // Activity: the whole record light, the calibration years over it in grey.
  type Point = { year: number; activity: number | null };
  const points: Point[] = years.map((entry) => ({ year: entry.year, activity: isDrawable(entry.activity) ? Math.max(0, entry.activity) : null }));
  const activityLine = (keep: (point: Point) => boolean): string =>
    line<Point>()
      .defined((point) => point.activity !== null && keep(point))
      .x((point) => x(point.year))
      .y((point) => y(point.activity ?? 0))(points) ?? "";
  const outsideLine = activityLine((point) => !inCalibration(point.year));
  const insideLine = activityLine((point) => inCalibration(point.year));
  if (outsideLine !== "") body += `<path${attrs({ class: "activity-outside", d: outsideLine, fill: "none", stroke: palette.outsideYear, "stroke-width": 1.4 })}/>`;
  if (insideLine !== "") body += `<path${attrs({ class: "activity", d: insideLine, fill: "none", stroke: palette.otherYear, "stroke-width": 0.9 })}/>`;
  const drawable = points.filter((point) => point.activity !== null);
  if (drawable.length === 0) body += notEnoughData(mainFrame);

  if (isDrawable(input.threshold)) {
    const ty = y(input.threshold);
    body += `<line${attrs({ x1: mainFrame.left, x2: mainFrame.right, y1: ty, y2: ty, stroke: palette.ink, "stroke-width": 1.2, "stroke-dasharray": "6 3" })}/>`;
  }
  let dots = "";
  for (const entry of years) {
    if (!entry.fireYear || !inCalibration(entry.year) || !isDrawable(entry.activity)) continue;
    dots += `<circle${attrs({ class: "fire-year", cx: x(entry.year), cy: y(Math.max(0, entry.activity)), r: 2.6, fill: palette.fireYear })}/>`;
  }
  body += dots;
  if (isDrawable(input.threshold)) {
    body += svgTextOnPanel(mainFrame.right - 4, y(input.threshold) - 5, "threshold", { "text-anchor": "end", fill: palette.ink });
  }

  body += legend(entries, frame, frame.bottom + 52);
  return `${svgOpen(frame, `Fire activity by year: ${input.measureLabel}`)}${body}</svg>`;
}
