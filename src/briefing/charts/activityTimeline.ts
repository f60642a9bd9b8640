import { scaleLinear } from "d3-scale";
import { curveStepAfter, line } from "d3-shape";
import { palette } from "./palette.js";
import {
  attrs,
  axisBottom,
  axisVertical,
  type ChartOptions,
  coord,
  formatSigned,
  isDrawable,
  legend,
  legendExtraHeight,
  type LegendEntry,
  makeFrame,
  notEnoughData,
  svgOpen,
  svgText,
} from "./svgParts.js";

/** One year of the fire record in {@link activityTimeline}. */
export interface ActivityTimelineYear {
  /** Calendar year. */
  readonly year: number;
  /** Fire activity in the chosen measure (≥ 0), or null where not usable. */
  readonly activity: number | null;
  /** Number of sites recording (sample depth), ≥ 0. */
  readonly sitesRecording: number;
  /** True for a fire year. */
  readonly fireYear: boolean;
}

/** Input of {@link activityTimeline}. */
export interface ActivityTimelineInput {
  /** Years of the record (any order; a few centuries). */
  readonly years: readonly ActivityTimelineYear[];
  /** Fire-year threshold in the activity measure, or null when none. */
  readonly threshold: number | null;
  /** Axis title of the activity measure, e.g. "Share of recording sites burned" (escaped). */
  readonly measureLabel: string;
  /** The calibration period, shaded. */
  readonly calibration: { readonly first: number; readonly last: number };
}

const MARGINS = { top: 22, right: 64, bottom: 64, left: 64 };

/**
 * Fire-record timeline: one bar per year of fire activity (high-fire years amber, other
 * calibration years grey, years outside the calibration period light grey — fire years are chosen
 * only among calibration years, so a tall light bar is not a missed fire year), the fire-year
 * threshold as a dashed line, sample depth (sites recording) as a stepped blue line
 * on a second, right-hand axis, and the calibration period shaded and labelled
 * "Calibration 1700–1990".
 *
 * Bars are drawn as three paths (one per colour) one year wide, so four centuries stay legible in a
 * page column; x ticks come from scale.ticks() (every 50 or 100 years, integer format); the
 * threshold label uses two decimals when below 1 and an integer otherwise. Years with null
 * activity have no bar. With no drawable activity the plot shows "not enough data" over the axes.
 *
 * @param input - years, threshold, measure label and calibration period.
 * @param options - viewBox width (default 680) and height (default 240).
 * @returns a self-contained `<svg>` string.
 * @throws RangeError when a width or height option is out of range.
 * @example
 * activityTimeline({ years: [{ year: 1700, activity: 0.3, sitesRecording: 12, fireYear: true }],
 *   threshold: 0.25, measureLabel: "Share of sites burned", calibration: { first: 1700, last: 1990 } });
 * // => '<svg xmlns="http://www.w3.org/2000/svg" …</svg>'
 * @see Cleveland W.S. (1994) The Elements of Graphing Data, revised edition, Hobart Press,
 * Summit NJ (bar and step displays of long series; a second scale kept visually separate).
 */
export function activityTimeline(input: Readonly<ActivityTimelineInput>, options?: ChartOptions): string {
  const thresholdText = isDrawable(input.threshold)
    ? `High-fire threshold (${input.threshold < 1 ? formatSigned(input.threshold, 2) : String(Math.round(input.threshold))})`
    : "High-fire threshold: none";
  const entries: LegendEntry[] = [
      { symbol: `<rect${attrs({ x: -4, y: -6, width: 8, height: 12, fill: palette.fireYear })}/>`, label: "High-fire years" },
      { symbol: `<rect${attrs({ x: -4, y: -6, width: 8, height: 12, fill: palette.otherYear })}/>`, label: "Other calibration years" },
      { symbol: `<rect${attrs({ x: -4, y: -6, width: 8, height: 12, fill: palette.outsideYear })}/>`, label: "Outside calibration (not used)" },
      { symbol: `<line${attrs({ x1: -8, x2: 8, y1: 0, y2: 0, stroke: palette.ink, "stroke-width": 1.2, "stroke-dasharray": "6 3" })}/>`, label: thresholdText },
      { symbol: `<line${attrs({ x1: -8, x2: 8, y1: 0, y2: 0, stroke: palette.sampleDepth, "stroke-width": 1.6 })}/>`, label: "Sites recording (right axis)" },
    ];
  const frame = makeFrame(options, { width: 680, height: 240 }, (width) => ({
    ...MARGINS,
    bottom: MARGINS.bottom + legendExtraHeight(entries, width),
  }));
  const years = input.years.filter((entry) => isDrawable(entry.year)).slice().sort((a, b) => a.year - b.year);
  const withActivity = years.filter(
    (entry): entry is ActivityTimelineYear & { activity: number } => isDrawable(entry.activity),
  );
  const calibration = input.calibration;
  const spanYears = [
    ...years.map((entry) => entry.year),
    ...[calibration.first, calibration.last].filter(isDrawable),
  ];
  const firstYear = spanYears.length > 0 ? Math.min(...spanYears) : 0;
  const lastYear = spanYears.length > 0 ? Math.max(...spanYears) : 100;
  const x = scaleLinear()
    .domain([firstYear - 0.5, lastYear + 0.5 + (firstYear === lastYear ? 1 : 0)])
    .range([frame.left, frame.right]);
  const maxActivity = Math.max(
    0,
    ...withActivity.map((entry) => entry.activity),
    ...(isDrawable(input.threshold) ? [input.threshold] : []),
  );
  const y = scaleLinear()
    .domain([0, maxActivity > 1e-9 ? maxActivity : 1])
    .range([frame.bottom, frame.top])
    .nice(5)
    .clamp(true);
  const maxDepth = Math.max(0, ...years.map((entry) => (isDrawable(entry.sitesRecording) ? entry.sitesRecording : 0)));
  const depth = scaleLinear()
    .domain([0, Math.max(maxDepth, 5)])
    .range([frame.bottom, frame.top])
    .nice(5);

  let body = "";
  if (isDrawable(calibration.first) && isDrawable(calibration.last)) {
    const first = Math.min(calibration.first, calibration.last);
    const last = Math.max(calibration.first, calibration.last);
    const x0 = x(first - 0.5);
    const x1 = x(last + 0.5);
    body += `<rect${attrs({ x: x0, y: frame.top, width: x1 - x0, height: frame.bottom - frame.top, fill: palette.shade })}/>`;
    body += svgText((x0 + x1) / 2, frame.top - 7, `Calibration ${Math.round(first)}\u2013${Math.round(last)}`, {
      "text-anchor": "middle",
      fill: palette.inkMuted,
    });
  }
  body += axisVertical(y, frame, { title: input.measureLabel, ticks: 5, grid: true });
  body += axisVertical(depth, frame, { title: "Sites recording", ticks: 5, format: "d", integer: true, colour: palette.sampleDepth }, "right");
  body += axisBottom(x, frame, { title: "Year", ticks: 8, format: "d", integer: true });

  const calibrationLow = isDrawable(calibration.first) && isDrawable(calibration.last) ? Math.min(calibration.first, calibration.last) : -Infinity;
  const calibrationHigh = isDrawable(calibration.first) && isDrawable(calibration.last) ? Math.max(calibration.first, calibration.last) : Infinity;
  const kindOf = (entry: ActivityTimelineYear): "fire" | "other" | "outside" =>
    entry.year < calibrationLow || entry.year > calibrationHigh ? "outside" : entry.fireYear ? "fire" : "other";
  const barPath = (kind: "fire" | "other" | "outside"): string => {
    let d = "";
    const y0 = y(0);
    for (const entry of withActivity) {
      if (kindOf(entry) !== kind || entry.activity <= 0) continue;
      const x0 = x(entry.year - 0.5);
      const x1 = x(entry.year + 0.5);
      const top = y(Math.max(0, entry.activity));
      d += `M${coord(x0)} ${coord(y0)}V${coord(top)}H${coord(x1)}V${coord(y0)}Z`;
    }
    return d;
  };
  const outsideBars = barPath("outside");
  const otherBars = barPath("other");
  const fireBars = barPath("fire");
  if (outsideBars !== "") body += `<path${attrs({ d: outsideBars, fill: palette.outsideYear })}/>`;
  if (otherBars !== "") body += `<path${attrs({ d: otherBars, fill: palette.otherYear })}/>`;
  if (fireBars !== "") body += `<path${attrs({ d: fireBars, fill: palette.fireYear, stroke: palette.fireYear, "stroke-width": 0.6 })}/>`;
  if (withActivity.length === 0) body += notEnoughData(frame);

  if (isDrawable(input.threshold)) {
    const ty = y(input.threshold);
    body += `<line${attrs({ x1: frame.left, x2: frame.right, y1: ty, y2: ty, stroke: palette.ink, "stroke-width": 1.2, "stroke-dasharray": "6 3" })}/>`;
  }

  const depthPoints = years
    .filter((entry) => isDrawable(entry.sitesRecording))
    .map((entry) => ({ year: entry.year, depth: entry.sitesRecording }));
  const last = depthPoints[depthPoints.length - 1];
  if (last) depthPoints.push({ year: last.year + 1, depth: last.depth });
  const depthLine = line<{ year: number; depth: number }>()
    .x((point) => x(point.year - 0.5))
    .y((point) => depth(point.depth))
    .curve(curveStepAfter)(depthPoints);
  if (depthLine && depthPoints.length > 1) {
    body += `<path${attrs({ d: depthLine, fill: "none", stroke: palette.sampleDepth, "stroke-width": 1.6 })}/>`;
  }

  body += legend(entries, frame, frame.bottom + 52);
  return `${svgOpen(frame, `Fire activity by year: ${input.measureLabel}`)}${body}</svg>`;
}
