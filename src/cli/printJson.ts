/**
 * JSON text as every firephase command prints it (and as `brief` keeps an outlook): stable
 * 2-space indented JSON with a final newline. Object keys keep their insertion order; non-finite
 * numbers (NaN, ±Infinity) become `null`, as in `JSON.stringify`, so callers give a `reason`
 * beside any value that could not be computed. The C1 control characters U+0080–U+009F, DEL, the
 * Unicode line and paragraph separators and the bidirectional controls are written as `\uXXXX` escapes (the same JSON value), so
 * the text is safe on a terminal; JSON.stringify already escapes the C0 controls.
 *
 * @param value - any JSON-serialisable value
 * @returns the text, ending in a newline
 * @example
 * jsonText({ schema: "firephase.check/1" }); // => '{\n  "schema": "firephase.check/1"\n}\n'
 */
export function jsonText(value: unknown): string {
  return `${JSON.stringify(value, null, 2)}\n`.replace(
    /[\u007f-\u009f\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g,
    (character) => `\\u${character.charCodeAt(0).toString(16).padStart(4, "0")}`,
  );
}

/**
 * JSON printer for `--json` output: {@link jsonText} on stdout.
 *
 * @param value - any JSON-serialisable value
 * @param write - where the text goes (default: process.stdout)
 * @example
 * printJson({ schema: "firephase.check/1" }); // writes '{\n  "schema": "firephase.check/1"\n}\n'
 */
export function printJson(value: unknown, write: (text: string) => void = (text) => process.stdout.write(text)): void {
  write(jsonText(value));
}
