/**
 * Shared building blocks of the briefing charts: the frame, coordinates, fixed number formats,
 * axes drawn from d3-scale ticks, legends and the "not enough data" notice. Every text node
 * passes through {@link escapeXml}.
 */
import type { ScaleBand, ScaleLinear } from "d3-scale";
import { escapeXml } from "./escapeXml.js";
import { palette } from "./palette.js";

/** Size options common to every chart, in SVG user units (1 unit ≈ 1 CSS px at 100%). */
export interface ChartOptions {
  /** viewBox width; default 680 (a ~170 mm page column). Range: 200–4000. */
  readonly width?: number;
  /** viewBox height; each chart has its own default. Range: 120–4000. */
  readonly height?: number;
}

/** The drawing area of a chart: outer size, margins and the inner plot rectangle. */
export interface Frame {
  readonly width: number;
  readonly height: number;
  readonly left: number;
  readonly right: number;
  readonly top: number;
  readonly bottom: number;
}

/** Margins around the plot rectangle, in user units. */
export interface Margins {
  readonly top: number;
  readonly right: number;
  readonly bottom: number;
  readonly left: number;
}

/** The font stack of every chart; the briefing page embeds Source Sans 3. */
export const FONT_FAMILY = "'Source Sans 3', sans-serif";
/** Tick and legend label size, px. */
export const LABEL_SIZE = 11;
/** Axis title size, px. */
export const AXIS_TITLE_SIZE = 12;
/** The words shown where a chart or a part of it cannot be drawn. */
export const NOT_ENOUGH_DATA = "not enough data";

/**
 * True when a value is a finite number (not null, undefined, NaN or ±Infinity).
 *
 * @param value - anything.
 * @returns whether it can be drawn.
 * @example
 * isDrawable(null); // => false
 */
export function isDrawable(value: unknown): value is number {
  return typeof value === "number" && Number.isFinite(value);
}

/**
 * Builds the frame of a chart from the caller's options and the chart's defaults.
 *
 * @param options - caller's width and height (optional).
 * @param defaults - the chart's default width and height.
 * @param margins - margins around the plot area, or a function of the chart width giving them
 *   (so a chart can reserve room for a legend that wraps).
 * @returns the frame.
 * @throws RangeError when a width or height is not a finite number in its range.
 * @example
 * makeFrame({}, { width: 680, height: 260 }, { top: 10, right: 10, bottom: 40, left: 50 }).right; // => 670
 */
export function makeFrame(
  options: ChartOptions | undefined,
  defaults: { readonly width: number; readonly height: number },
  margins: Margins | ((width: number) => Margins),
): Frame {
  const width = options?.width ?? defaults.width;
  const height = options?.height ?? defaults.height;
  if (!isDrawable(width) || width < 200 || width > 4000) {
    throw new RangeError(`chart width must be a number from 200 to 4000 (got ${String(width)})`);
  }
  if (!isDrawable(height) || height < 120 || height > 4000) {
    throw new RangeError(`chart height must be a number from 120 to 4000 (got ${String(height)})`);
  }
  const resolved = typeof margins === "function" ? margins(width) : margins;
  const left = Math.min(resolved.left, width / 2 - 20);
  const right = Math.max(width - resolved.right, width / 2 + 20);
  const top = Math.min(resolved.top, height / 2 - 20);
  const bottom = Math.max(height - resolved.bottom, height / 2 + 20);
  return { width, height, left, right, top, bottom };
}

/**
 * A scale domain covering the values, widened by `padShare` of their spread on each side; a
 * spread too small to draw (under a billionth of the values' magnitude, or none) becomes ±1
 * around the middle, so d3's ticks never meet a degenerate domain.
 *
 * @param values - finite numbers (may be empty: gives [−1, 1]).
 * @param padShare - share of the spread added each side, 0–1.
 * @returns [low, high] with high > low.
 * @example
 * paddedExtent([0, 10], 0.1); // => [-1, 11]
 */
export function paddedExtent(values: readonly number[], padShare: number): [number, number] {
  if (values.length === 0) return [-1, 1];
  // A loop, not Math.min(...values): a spread of a long record overflows the call stack.
  let low = Infinity;
  let high = -Infinity;
  for (const value of values) {
    if (value < low) low = value;
    if (value > high) high = value;
  }
  const spread = high - low;
  if (!(spread > 1e-9 * Math.max(1, Math.abs(low), Math.abs(high)))) {
    const middle = (low + high) / 2;
    return [middle - 1, middle + 1];
  }
  return [low - spread * padShare, high + spread * padShare];
}

/**
 * A coordinate as SVG text, rounded to 0.01 unit.
 *
 * @param value - a finite number.
 * @returns the number with at most two decimals, never "-0".
 * @throws RangeError for a non-finite value (a drawing bug: charts filter missing data first).
 * @example
 * coord(12.3456); // => "12.35"
 */
export function coord(value: number): string {
  if (!Number.isFinite(value)) throw new RangeError(`non-finite coordinate ${String(value)}`);
  const rounded = Math.round(value * 100) / 100;
  return String(rounded === 0 ? 0 : rounded);
}

/**
 * Fixed percent format of a probability: whole percent, e.g. 0.4249 → "42%".
 *
 * @param probability - a probability in [0, 1].
 * @returns the percent text.
 * @example
 * formatPercent(0.4249); // => "42%"
 */
export function formatPercent(probability: number): string {
  return `${Math.round(probability * 100)}%`;
}

/**
 * Fixed signed format with a given number of decimals and a true minus sign (U+2212).
 *
 * @param value - a finite number.
 * @param decimals - decimals, 0–6.
 * @returns e.g. "−0.25", "0.10", "+2" when `plus` is set.
 * @example
 * formatSigned(-0.254, 2); // => "−0.25"
 */
export function formatSigned(value: number, decimals: number, plus = false): string {
  const text = Math.abs(value).toFixed(decimals);
  const isZero = Number(text) === 0;
  if (value < 0 && !isZero) return `\u2212${text}`;
  if (plus && value > 0 && !isZero) return `+${text}`;
  return text;
}

/** Attributes as an SVG attribute string; values are escaped, undefined ones skipped. */
export function attrs(values: Readonly<Record<string, string | number | undefined>>): string {
  let out = "";
  for (const [name, value] of Object.entries(values)) {
    if (value === undefined) continue;
    out += ` ${name}="${escapeXml(typeof value === "number" ? coord(value) : value)}"`;
  }
  return out;
}

/**
 * A text element with escaped content.
 *
 * @param x - x position.
 * @param y - baseline y position.
 * @param content - the text (any string; escaped).
 * @param extra - further attributes (text-anchor, font-size, fill …).
 * @returns the `<text>` element.
 * @example
 * svgText(0, 10, "a<b"); // => '<text x="0" y="10">a&lt;b</text>'
 */
export function svgText(
  x: number,
  y: number,
  content: string,
  extra: Readonly<Record<string, string | number | undefined>> = {},
): string {
  return `<text${attrs({ x, y, ...extra })}>${escapeXml(content)}</text>`;
}

/**
 * A label on a white panel: a `<text>` preceded by a white rectangle sized from the label's
 * estimated width, so the label stays readable over grid lines and marks. A stroked halo
 * (paint-order: stroke) is not used because PDF printers draw such text twice, which doubles it
 * in the PDF's text layer (copy, search, screen readers).
 *
 * Panel width = estimated text width (×1.1 when bold) + 2 × padding; height = 1.05 × font size
 * + padding, placed from the text anchor ("start", "middle" or "end") and the baseline.
 *
 * @param x - anchor x position.
 * @param y - baseline y position.
 * @param content - the text (any string; escaped).
 * @param extra - further text attributes; "font-size" (default LABEL_SIZE), "text-anchor" and
 *   "font-weight" also size and place the panel.
 * @param padding - room around the text, px (≥ 0, default 2).
 * @returns a `<rect class="label-panel">` followed by the `<text>` element.
 * @example
 * svgTextOnPanel(10, 20, "ENSO").startsWith('<rect class="label-panel"'); // => true
 */
export function svgTextOnPanel(
  x: number,
  y: number,
  content: string,
  extra: Readonly<Record<string, string | number | undefined>> = {},
  padding = 2,
): string {
  const size = Number(extra["font-size"] ?? LABEL_SIZE);
  const bold = Number(extra["font-weight"] ?? 400) >= 600;
  const width = estimateTextWidth(content, size) * (bold ? 1.1 : 1) + 2 * padding;
  const anchor = extra["text-anchor"] ?? "start";
  const left = anchor === "middle" ? x - width / 2 : anchor === "end" ? x - width + padding : x - padding;
  const panel = `<rect${attrs({ class: "label-panel", x: left, y: y - size * 0.8 - padding / 2, width, height: size * 1.05 + padding, fill: palette.paper, "fill-opacity": 0.9 })}/>`;
  return panel + svgText(x, y, content, extra);
}

/**
 * The opening `<svg>` tag of a chart: viewBox of the frame size, 100% wide, the chart font,
 * an accessible label and a white background.
 *
 * @param frame - the chart frame.
 * @param label - accessible description (escaped).
 * @returns the opening tag plus the background rectangle.
 * @example
 * svgOpen(frame, "Odds by phase").startsWith("<svg"); // => true
 */
export function svgOpen(frame: Frame, label: string): string {
  return (
    `<svg xmlns="http://www.w3.org/2000/svg"` +
    attrs({
      viewBox: `0 0 ${coord(frame.width)} ${coord(frame.height)}`,
      width: "100%",
      preserveAspectRatio: "xMidYMid meet",
      role: "img",
      "aria-label": label,
      "font-family": FONT_FAMILY,
      "font-size": LABEL_SIZE,
      fill: palette.ink,
    }) +
    `><title>${escapeXml(label)}</title>` +
    `<rect${attrs({ x: 0, y: 0, width: frame.width, height: frame.height, fill: palette.paper })}/>`
  );
}

/** Options of a linear axis. */
export interface AxisOptions {
  /** Axis title (escaped). */
  readonly title: string;
  /** Approximate number of ticks passed to scale.ticks(). */
  readonly ticks?: number;
  /** A d3-format specifier passed to scale.tickFormat(), e.g. ".0%", "d", ".1f". */
  readonly format?: string;
  /** Draw light grid lines across the plot at each tick. */
  readonly grid?: boolean;
  /** Colour of tick labels and title (default muted ink). */
  readonly colour?: string;
  /** Keep only integer ticks (counts, years). */
  readonly integer?: boolean;
}

function tickList(
  scale: ScaleLinear<number, number>,
  options: AxisOptions,
  labelRoom?: number,
): { value: number; label: string }[] {
  let count = options.ticks ?? 5;
  for (;;) {
    const format = scale.tickFormat(count, options.format);
    const ticks = scale
      .ticks(count)
      .filter((value) => !options.integer || Number.isInteger(value))
      .map((value) => ({ value, label: format(value) }));
    // On a horizontal axis, fewer ticks until the labels fit side by side.
    if (labelRoom === undefined || count <= 2) return ticks;
    const widest = Math.max(0, ...ticks.map((tick) => estimateTextWidth(tick.label)));
    if (ticks.length * (widest + 10) <= labelRoom) return ticks;
    count = Math.floor(count / 2);
  }
}

/**
 * A bottom axis along the plot's lower edge, from scale.ticks() and scale.tickFormat(); the tick
 * count is halved until the labels fit side by side.
 *
 * @param scale - a d3 linear scale whose range is the plot's x extent.
 * @param frame - the chart frame.
 * @param options - title, tick count, format, grid.
 * @returns SVG elements of the axis.
 * @example
 * axisBottom(scaleLinear().domain([0, 1]).range([50, 670]), frame, { title: "Chance", format: ".0%" });
 */
export function axisBottom(scale: ScaleLinear<number, number>, frame: Frame, options: AxisOptions): string {
  const colour = options.colour ?? palette.inkMuted;
  let out = `<g class="axis axis-x">`;
  for (const tick of tickList(scale, options, Math.abs(frame.right - frame.left))) {
    const x = scale(tick.value);
    if (options.grid) out += `<line${attrs({ x1: x, x2: x, y1: frame.top, y2: frame.bottom, stroke: palette.grid })}/>`;
    out += `<line${attrs({ x1: x, x2: x, y1: frame.bottom, y2: frame.bottom + 4, stroke: palette.inkMuted })}/>`;
    out += svgText(x, frame.bottom + 16, tick.label, { "text-anchor": "middle", fill: colour });
  }
  out += `<line${attrs({ x1: frame.left, x2: frame.right, y1: frame.bottom, y2: frame.bottom, stroke: palette.inkMuted })}/>`;
  out += svgText((frame.left + frame.right) / 2, frame.bottom + 33, options.title, {
    "text-anchor": "middle",
    "font-size": AXIS_TITLE_SIZE,
    fill: palette.ink,
  });
  return `${out}</g>`;
}

/**
 * A vertical axis at the plot's left or right edge, from scale.ticks() and scale.tickFormat();
 * the title is written rotated beside the tick labels.
 *
 * @param scale - a d3 linear scale whose range is the plot's y extent.
 * @param frame - the chart frame.
 * @param options - title, tick count, format, grid, colour.
 * @param side - "left" (default) or "right".
 * @returns SVG elements of the axis.
 * @example
 * axisVertical(scaleLinear().domain([0, 1]).range([220, 10]), frame, { title: "Hit rate" });
 */
export function axisVertical(
  scale: ScaleLinear<number, number>,
  frame: Frame,
  options: AxisOptions,
  side: "left" | "right" = "left",
): string {
  const colour = options.colour ?? palette.inkMuted;
  const x0 = side === "left" ? frame.left : frame.right;
  const direction = side === "left" ? -1 : 1;
  let out = `<g class="axis axis-y-${side}">`;
  let widest = 0;
  for (const tick of tickList(scale, options)) {
    const y = scale(tick.value);
    if (options.grid) out += `<line${attrs({ x1: frame.left, x2: frame.right, y1: y, y2: y, stroke: palette.grid })}/>`;
    out += `<line${attrs({ x1: x0, x2: x0 + 4 * direction, y1: y, y2: y, stroke: palette.inkMuted })}/>`;
    out += svgText(x0 + 7 * direction, y + 4, tick.label, {
      "text-anchor": side === "left" ? "end" : "start",
      fill: colour,
    });
    widest = Math.max(widest, estimateTextWidth(tick.label));
  }
  out += `<line${attrs({ x1: x0, x2: x0, y1: frame.top, y2: frame.bottom, stroke: palette.inkMuted })}/>`;
  const titleX = x0 + direction * (widest + 16);
  const titleY = (frame.top + frame.bottom) / 2;
  out += svgText(titleX, titleY, options.title, {
    "text-anchor": "middle",
    "font-size": AXIS_TITLE_SIZE,
    fill: options.colour ?? palette.ink,
    transform: `rotate(${side === "left" ? -90 : 90} ${coord(titleX)} ${coord(titleY)})`,
  });
  return `${out}</g>`;
}

/**
 * A bottom axis for a band scale: one label per band, centred.
 *
 * @param scale - a d3 band scale over the plot's x extent.
 * @param frame - the chart frame.
 * @param title - axis title (none when empty).
 * @param label - text of each band's tick.
 * @returns SVG elements of the axis.
 * @example
 * axisBottomBand(scaleBand().domain(["a"]).range([50, 670]), frame, "Lag", (key) => key);
 */
export function axisBottomBand(
  scale: ScaleBand<string>,
  frame: Frame,
  title: string,
  label: (key: string) => string,
): string {
  let out = `<g class="axis axis-x">`;
  for (const key of scale.domain()) {
    const start = scale(key);
    if (start === undefined) continue;
    const x = start + scale.bandwidth() / 2;
    out += `<line${attrs({ x1: x, x2: x, y1: frame.bottom, y2: frame.bottom + 4, stroke: palette.inkMuted })}/>`;
    out += svgText(x, frame.bottom + 16, label(key), { "text-anchor": "middle", fill: palette.inkMuted });
  }
  out += `<line${attrs({ x1: frame.left, x2: frame.right, y1: frame.bottom, y2: frame.bottom, stroke: palette.inkMuted })}/>`;
  if (title !== "") {
    out += svgText((frame.left + frame.right) / 2, frame.bottom + 33, title, {
      "text-anchor": "middle",
      "font-size": AXIS_TITLE_SIZE,
      fill: palette.ink,
    });
  }
  return `${out}</g>`;
}

/**
 * The words "not enough data", centred in the plot area.
 *
 * @param frame - the chart frame.
 * @returns a white panel and a `<text>` element.
 * @example
 * notEnoughData(frame).includes("not enough data"); // => true
 */
export function notEnoughData(frame: Frame): string {
  return svgTextOnPanel((frame.left + frame.right) / 2, (frame.top + frame.bottom) / 2 + 5, NOT_ENOUGH_DATA, {
    "text-anchor": "middle",
    "font-size": 14,
    fill: palette.inkMuted,
    class: "not-enough-data",
  });
}

/**
 * Approximate width of a label in Source Sans 3 at the given size (0.5 em per character):
 * used only to place legend entries and axis titles.
 *
 * @param text - the label.
 * @param size - font size in px.
 * @returns the estimated width in user units.
 * @example
 * estimateTextWidth("abcd", 10); // => 20
 */
export function estimateTextWidth(text: string, size: number = LABEL_SIZE): number {
  return [...text].length * size * 0.5;
}

/** One legend entry: a symbol drawn in a 16 × 12 box whose centre is (0, 0), and its label. */
export interface LegendEntry {
  readonly symbol: string;
  readonly label: string;
}

/** Left edge and row height of chart legends. */
export const LEGEND_INSET = 12;
const LEGEND_ROW = 16;

function legendWidth(entry: LegendEntry): number {
  return 22 + estimateTextWidth(entry.label) + 16;
}

/**
 * Number of rows a legend takes when it wraps at `maxWidth`.
 *
 * @param entries - symbols and labels.
 * @param maxWidth - width available.
 * @returns rows, at least 1.
 * @example
 * legendRows([{ symbol: "", label: "Fire years" }], 600); // => 1
 */
export function legendRows(entries: readonly LegendEntry[], maxWidth: number): number {
  let rows = 1;
  let used = 0;
  for (const entry of entries) {
    const width = legendWidth(entry);
    if (used > 0 && used + width > maxWidth) {
      rows += 1;
      used = 0;
    }
    used += width;
  }
  return rows;
}

/**
 * The extra bottom margin a legend needs beyond its first row, for a chart of the given width
 * (the legend spans the chart from {@link LEGEND_INSET} to the right edge less the inset).
 *
 * @param entries - symbols and labels.
 * @param chartWidth - the chart's viewBox width.
 * @returns extra height in user units (0 for a one-row legend).
 * @example
 * legendExtraHeight([{ symbol: "", label: "Fire years" }], 680); // => 0
 */
export function legendExtraHeight(entries: readonly LegendEntry[], chartWidth: number): number {
  return (legendRows(entries, chartWidth - 2 * LEGEND_INSET) - 1) * LEGEND_ROW;
}

/**
 * A legend across the chart from {@link LEGEND_INSET}, wrapping to further rows when wider than
 * the chart; its first row is centred on `y`.
 *
 * @param entries - symbols and labels.
 * @param frame - the chart frame.
 * @param y - centre line of the first row.
 * @returns a `<g>` element.
 * @example
 * legend([{ symbol: "<circle r='4'/>", label: "Fire years" }], frame, 250);
 */
export function legend(entries: readonly LegendEntry[], frame: Frame, y: number): string {
  const x = LEGEND_INSET;
  const maxWidth = frame.width - 2 * LEGEND_INSET;
  let out = `<g class="legend">`;
  let cursorX = x;
  let cursorY = y;
  for (const entry of entries) {
    const width = legendWidth(entry);
    if (cursorX > x && cursorX + width - x > maxWidth) {
      cursorX = x;
      cursorY += LEGEND_ROW;
    }
    out += `<g transform="translate(${coord(cursorX + 8)} ${coord(cursorY)})">${entry.symbol}</g>`;
    out += svgText(cursorX + 22, cursorY + 4, entry.label, { fill: palette.ink });
    cursorX += width;
  }
  return `${out}</g>`;
}
