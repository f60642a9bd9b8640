/**
 * Markup that a template may insert without escaping (`{{{ x.trustedMarkup }}}`). Only two kinds
 * exist: chart SVG made by src/briefing/charts from numbers (every text node escaped there), and
 * the briefing's own style sheet with its embedded fonts. Region text never becomes trusted markup.
 */

/** A string of markup made by our own code. Templates insert it with `{{{ x.trustedMarkup }}}`. */
export interface TrustedMarkup {
  readonly trustedMarkup: string;
}

/** Elements a chart never makes and a trusted SVG must not contain. */
const FORBIDDEN_ELEMENTS = new Set(["script", "foreignobject", "iframe", "image", "style", "object", "embed", "use", "a", "animate", "set"]);

/** A start or end tag with double- or single-quoted attribute values (what escapeXml writes). */
const TAG = /<(\/?)([A-Za-z][\w:.-]*)((?:\s+[A-Za-z_:][\w:.-]*\s*=\s*(?:"[^"<]*"|'[^'<]*'))*)\s*(\/?)>/y;
const ATTRIBUTE = /([A-Za-z_:][\w:.-]*)\s*=\s*(?:"([^"]*)"|'([^']*)')/g;

/** Why a chart's SVG is not trusted, or null when it is. Only markup is examined: text nodes are escaped text. */
function svgProblem(text: string): string | null {
  let position = 0;
  let first = true;
  while (position < text.length) {
    const next = text.indexOf("<", position);
    if (next === -1) break;
    TAG.lastIndex = next;
    const match = TAG.exec(text);
    if (match === null) return "markup that is not a plain start or end tag (comment, declaration or malformed tag)";
    const name = (match[2] ?? "").toLowerCase();
    if (first && (match[1] !== "" || name !== "svg")) return "not a single <svg> element";
    first = false;
    if (FORBIDDEN_ELEMENTS.has(name)) return `forbidden element <${name}>`;
    for (const attribute of (match[3] ?? "").matchAll(ATTRIBUTE)) {
      const attributeName = (attribute[1] ?? "").toLowerCase();
      const value = attribute[2] ?? attribute[3] ?? "";
      if (attributeName.startsWith("on")) return `event handler attribute ${attributeName}`;
      if ((attributeName === "href" || attributeName.endsWith(":href") || attributeName === "src") && !value.startsWith("#")) {
        return `outside reference in ${attributeName}`;
      }
      // Text-like attributes (labels) may say anything; elsewhere url() may only point inside the document.
      if (!attributeName.startsWith("aria-") && /url\(\s*(?:['"]|&quot;|&apos;|&#39;)?(?!#)/i.test(value)) return `outside reference in ${attributeName}`;
      if (!attributeName.startsWith("aria-") && /javascript:/i.test(value)) return `script URL in ${attributeName}`;
    }
    position = TAG.lastIndex;
  }
  return first ? "not a single <svg> element" : null;
}

/**
 * Accept a chart's SVG string as trusted markup after checking its markup — the tags and their
 * attributes, not the escaped text between them — so that a phase label such as
 * "phase one = wet" or "&lt;script&gt;" in a title or label passes, while the chart itself may
 * contain no script, style or foreign element, no event-handler attribute, no external image or
 * link and no outside reference (only `#fragment` references are allowed). Comments,
 * declarations and anything that is not a plain start or end tag are refused.
 *
 * @param svg - an SVG string returned by a chart function of src/briefing/charts.
 * @returns the same string (trimmed) wrapped as {@link TrustedMarkup}.
 * @throws RangeError when the string is not a single `<svg>…</svg>` or contains a forbidden construct.
 * @example
 * trustSvg('<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 10 10"></svg>').trustedMarkup.length; // => 65
 * @see W3C (2011) "Scalable Vector Graphics (SVG) 1.1 (Second Edition)", §5.6 (the 'use' element), §14.1 (links), §18 (scripting).
 */
export function trustSvg(svg: string): TrustedMarkup {
  const text = svg.trim();
  if (!text.startsWith("<svg") || !text.endsWith("</svg>")) throw new RangeError("trustSvg: not a single <svg> element");
  const problem = svgProblem(text);
  if (problem !== null) throw new RangeError(`trustSvg: ${problem} in chart SVG`);
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
