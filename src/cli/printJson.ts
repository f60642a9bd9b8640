/**
 * JSON printer for `--json` output: stable 2-space indented JSON with a final newline on stdout.
 * Object keys keep their insertion order; non-finite numbers (NaN, ±Infinity) become `null`, as in
 * `JSON.stringify`, so callers give a `reason` beside any value that could not be computed.
 *
 * @param value - any JSON-serialisable value
 * @param write - where the text goes (default: process.stdout)
 * @example
 * printJson({ schema: "firephase.check/1" }); // writes '{\n  "schema": "firephase.check/1"\n}\n'
 */
export function printJson(value: unknown, write: (text: string) => void = (text) => process.stdout.write(text)): void {
  write(`${JSON.stringify(value, null, 2)}\n`);
}
