/**
 * Markup that a template may insert without escaping (`{{{ x.trustedMarkup }}}`). Only two kinds
 * exist: chart SVG made by src/briefing/charts from numbers (every text node escaped there), and
 * the briefing's own style sheet with its embedded fonts. Region text never becomes trusted markup.
 */

/** A string of markup made by our own code. Templates insert it with `{{{ x.trustedMarkup }}}`. */
export interface TrustedMarkup {
  readonly trustedMarkup: string;
}

const FORBIDDEN_IN_SVG: readonly RegExp[] = [
  /<script/i,
  /<foreignObject/i,
  /<iframe/i,
  /<image/i,
  /\son[a-z]+\s*=/i,
  /javascript:/i,
  /(?:xlink:)?href\s*=\s*["'](?!#)/i,
  /url\(\s*['"]?(?!#)/i,
];

/**
 * Accept a chart's SVG string as trusted markup after checking that it is one self-contained
 * `<svg>` element with no script, event handler, foreign object, external image or outside
 * reference (only `#fragment` references are allowed).
 *
 * @param svg - an SVG string returned by a chart function of src/briefing/charts.
 * @returns the same string wrapped as {@link TrustedMarkup}.
 * @throws RangeError when the string is not a single `<svg>…</svg>` or contains a forbidden construct.
 * @example
 * trustSvg('<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 10 10"></svg>').trustedMarkup.length; // => 65
 */
export function trustSvg(svg: string): TrustedMarkup {
  const text = svg.trim();
  if (!text.startsWith("<svg") || !text.endsWith("</svg>")) throw new RangeError("trustSvg: not a single <svg> element");
  for (const pattern of FORBIDDEN_IN_SVG) {
    if (pattern.test(text)) throw new RangeError(`trustSvg: forbidden construct in chart SVG (${pattern.source})`);
  }
  return { trustedMarkup: text };
}

/**
 * Accept the briefing's own CSS (templates/briefing.css plus embedded font faces) as trusted
 * markup for the `<style>` element, after checking it cannot close the element early.
 *
 * @param css - style sheet text made by the package itself.
 * @returns the CSS wrapped as {@link TrustedMarkup}.
 * @throws RangeError when the text contains `</style` or `<`-tags, or refers to a non-data URL.
 * @example
 * trustCss("body{margin:0}").trustedMarkup; // => "body{margin:0}"
 */
export function trustCss(css: string): TrustedMarkup {
  if (/<\/?[a-z!]/i.test(css)) throw new RangeError("trustCss: markup inside a style sheet");
  if (/url\(\s*['"]?(?!data:|#)/i.test(css) || /@import/i.test(css)) throw new RangeError("trustCss: style sheet refers to an outside resource");
  return { trustedMarkup: css };
}
