/**
 * The briefing's typeface, Source Sans 3 (SIL Open Font License, from `@fontsource/source-sans-3`),
 * embedded as base64 `data:` URLs so the page renders the same on every machine and loads nothing.
 */
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";

/** One embedded face: weight, style and the subsets it carries. */
export interface EmbeddedFace {
  readonly weight: 400 | 600 | 700;
  readonly style: "normal" | "italic";
}

/** The faces the briefing uses: regular, italic, semibold and bold. */
export const BRIEFING_FACES: readonly EmbeddedFace[] = Object.freeze([
  { weight: 400, style: "normal" },
  { weight: 400, style: "italic" },
  { weight: 600, style: "normal" },
  { weight: 700, style: "normal" },
]);

/** Unicode ranges of the two subsets, as published in the package's own CSS (latin-400.css). */
const SUBSETS = Object.freeze({
  latin:
    "U+0000-00FF,U+0131,U+0152-0153,U+02BB-02BC,U+02C6,U+02DA,U+02DC,U+0304,U+0308,U+0329,U+2000-206F,U+20AC,U+2122,U+2191,U+2193,U+2212,U+2215,U+FEFF,U+FFFD",
  "latin-ext":
    "U+0100-02BA,U+02BD-02C5,U+02C7-02CC,U+02CE-02D7,U+02DD-02FF,U+0304,U+0308,U+0329,U+1D00-1DBF,U+1E00-1E9F,U+1EF2-1EFF,U+2020,U+20A0-20AB,U+20AD-20C4,U+2113,U+2C60-2C7F,U+A720-A7FF",
});

const require = createRequire(import.meta.url);
const cache = new Map<string, string>();

function fontDataUrl(subset: keyof typeof SUBSETS, face: EmbeddedFace): string {
  const file = `@fontsource/source-sans-3/files/source-sans-3-${subset}-${face.weight}-${face.style}.woff2`;
  const cached = cache.get(file);
  if (cached !== undefined) return cached;
  const url = `data:font/woff2;base64,${readFileSync(require.resolve(file)).toString("base64")}`;
  cache.set(file, url);
  return url;
}

/**
 * CSS `@font-face` rules for Source Sans 3 with every font file inlined as a base64 data URL.
 *
 * @param faces - which weights and styles to embed (default {@link BRIEFING_FACES}).
 * @param subsets - which character subsets (default latin and latin-ext).
 * @returns CSS text; never refers to a file or network address.
 * @throws Error when `@fontsource/source-sans-3` is not installed.
 * @example
 * embeddedFontCss([{ weight: 400, style: "normal" }], ["latin"]).startsWith("@font-face"); // => true
 * @see Source Sans 3, Adobe (P. D. Hunt), SIL Open Font License 1.1; packaged by Fontsource.
 */
export function embeddedFontCss(
  faces: readonly EmbeddedFace[] = BRIEFING_FACES,
  subsets: readonly (keyof typeof SUBSETS)[] = ["latin", "latin-ext"],
): string {
  const rules: string[] = [];
  for (const face of faces) {
    for (const subset of subsets) {
      rules.push(
        `@font-face{font-family:'Source Sans 3';font-style:${face.style};font-weight:${face.weight};` +
          `font-display:block;src:url(${fontDataUrl(subset, face)}) format('woff2');unicode-range:${SUBSETS[subset]};}`,
      );
    }
  }
  return rules.join("\n");
}

/** Characters covered by the latin-ext subset but not by latin (see SUBSETS). */
const LATIN_EXT_ONLY = /[\u0100-\u0130\u0132-\u0151\u0154-\u02BA\u02BD-\u02C5\u02C7-\u02CC\u02CE-\u02D7\u02DD-\u02FF\u1D00-\u1DBF\u1E00-\u1E9F\u1EF2-\u1EFF\u20A0-\u20AB\u20AD-\u20C4\u2113\u2C60-\u2C7F\uA720-\uA7FF]/;

/**
 * The font subsets a text needs: always latin; latin-ext too when the text has a character only
 * that subset covers (e.g. "ł", "ő", "ș"). Leaving latin-ext out when unused keeps the page small.
 *
 * @param text - every string the page will print (e.g. the JSON of the view model).
 * @returns `["latin"]` or `["latin", "latin-ext"]`.
 * @throws never.
 * @example
 * fontSubsetsFor("Łódź"); // => ["latin", "latin-ext"]
 */
export function fontSubsetsFor(text: string): ("latin" | "latin-ext")[] {
  return LATIN_EXT_ONLY.test(text) ? ["latin", "latin-ext"] : ["latin"];
}
