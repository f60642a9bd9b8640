/**
 * Limits on what the region-folder reader accepts. They keep a mistaken or hostile input (a huge
 * name, a device file, a file of gigabytes) from hanging or exhausting memory, and they are stated
 * in the README ("The region folder"). Every limit, when passed, is a clear input problem.
 */

/**
 * Largest data file read: 32 MiB = 33,554,432 bytes. A fire-events file of that size holds about
 * 2.8 million events and loads in about 20 s in 0.8 GB of memory (measured); a record of 5,000
 * sites × 1,000 years with a fire at every site one year in three is about 20 MB. region.json
 * itself is held to {@link MAX_REGION_JSON_BYTES}.
 */
export const MAX_DATA_FILE_BYTES = 32 * 1024 * 1024;

/** Largest region.json read (1 MiB). */
export const MAX_REGION_JSON_BYTES = 1024 * 1024;

/**
 * Longest free text, in characters, per field: in region.json counted as Unicode code points (a
 * surrogate pair counts once; see settingsSchema.ts), in the CSV files as UTF-16 code units (as
 * JavaScript counts them). Long enough for any real name; short enough that a page of the
 * briefing cannot be swamped.
 */
export const TEXT_LIMITS = Object.freeze({
  /** Region name. */
  name: 200,
  /** Region description. */
  description: 2000,
  /** `preparedBy` and `contact`. */
  preparedBy: 200,
  contact: 200,
  /** Index name (a key of `indices`) and its column name. */
  indexName: 40,
  column: 100,
  /** A phase label. */
  label: 40,
  /** An index's `units`. */
  units: 40,
  /** A data-file path as written in region.json. */
  file: 1000,
  /** Site id and site name in the sites file. */
  siteId: 64,
  siteName: 200,
});

/** Declared missing codes per index, at most. */
export const MAX_MISSING_CODES = 20;

/** Characters of a line (or field) echoed in a problem message, at most. */
export const MAX_ECHO_CHARACTERS = 40;

/**
 * A short, safe excerpt of input text for a problem message: control characters (C0, DEL, C1 and
 * the Unicode line and paragraph separators) are written as `\\n`, `\\t`, `\\r` or `\\u{…}`
 * escapes, and the text is cut at `limit` characters with "..." after it.
 *
 * @param text - any text
 * @param limit - characters kept before the cut (default {@link MAX_ECHO_CHARACTERS}), at least 1
 * @returns the excerpt; "" for ""
 * @example
 * echoText("ab\u001b[2Jc"); // => "ab\\u{1b}[2Jc"
 */
export function echoText(text: string, limit: number = MAX_ECHO_CHARACTERS): string {
  const cut = text.length > limit;
  const kept = cut ? text.slice(0, limit) : text;
  let out = "";
  for (const character of kept) {
    const code = character.codePointAt(0) as number;
    if (character === "\n") out += "\\n";
    else if (character === "\r") out += "\\r";
    else if (character === "\t") out += "\\t";
    else if (code < 0x20 || (code >= 0x7f && code < 0xa0) || code === 0x2028 || code === 0x2029) out += `\\u{${code.toString(16)}}`;
    else out += character;
  }
  return cut ? `${out}...` : out;
}
