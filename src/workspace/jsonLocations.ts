/** Where each value of a JSON text starts, for error messages that name a line. */
export interface JsonLocations {
  /** Line (1-based) of the key of each member, or of the value for the root and array items. */
  readonly lineOf: (path: readonly (string | number)[]) => number | null;
  /** The text of a number literal at `path` as written (e.g. "1e400"), or null when the value there is not a number. */
  readonly literalOf: (path: readonly (string | number)[]) => string | null;
  /** Keys that appear twice in the same object, with the line of the second one. */
  readonly duplicateKeys: readonly { readonly path: readonly string[]; readonly key: string; readonly line: number }[];
}

/** A JSON syntax error with the 1-based line where it was found. */
export class JsonSyntaxError extends Error {
  constructor(
    message: string,
    readonly line: number,
  ) {
    super(message);
    this.name = "JsonSyntaxError";
  }
}

const pathKey = (path: readonly (string | number)[]): string => JSON.stringify(path.map(String));

/**
 * JSON locator: scans a JSON text (RFC 8259) and records the line of every member and item, so
 * that a validation problem found later on the parsed value can name its line. Also finds keys
 * repeated within one object, which `JSON.parse` silently overwrites.
 *
 * @param text - the JSON text
 * @returns the locations
 * @throws JsonSyntaxError at the first syntax error, with its line
 * @example
 * locateJson('{\n  "a": {\n    "b": 1\n  }\n}').lineOf(["a", "b"]); // => 3
 */
export function locateJson(text: string): JsonLocations {
  const lines = new Map<string, number>();
  const numbers = new Map<string, string>();
  const literalPattern = /true|false|null|-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][+-]?\d+)?/y;
  const duplicateKeys: { path: string[]; key: string; line: number }[] = [];
  let index = 0;
  let line = 1;

  const fail = (what: string): never => {
    const found = index < text.length ? JSON.stringify(text[index]) : "the end of the text";
    throw new JsonSyntaxError(`invalid JSON: ${what} (found ${found})`, line);
  };
  const skipWhitespace = (): void => {
    while (index < text.length) {
      const character = text[index];
      if (character === "\n") line++;
      else if (character !== " " && character !== "\t" && character !== "\r") return;
      index++;
    }
  };
  const readString = (): string => {
    if (text[index] !== '"') fail("expected a string in double quotes");
    const start = index;
    index++;
    while (index < text.length && text[index] !== '"') {
      const code = text.charCodeAt(index);
      if (code < 0x20) fail("control character inside a string");
      if (text[index] === "\\") {
        index++;
        if (index >= text.length) break;
        if (!'"\\/bfnrtu'.includes(text[index] as string)) fail("invalid escape in a string");
        if (text[index] === "u") {
          if (!/^[0-9a-fA-F]{4}$/.test(text.slice(index + 1, index + 5))) fail("invalid \\u escape");
          index += 4;
        }
      }
      index++;
    }
    if (index >= text.length) fail("unterminated string");
    index++;
    return JSON.parse(text.slice(start, index)) as string;
  };
  const readValue = (path: (string | number)[]): void => {
    if (path.length > 64) fail("values nested more than 64 levels deep");
    skipWhitespace();
    if (!lines.has(pathKey(path))) lines.set(pathKey(path), line);
    const character = text[index];
    if (character === "{") {
      index++;
      skipWhitespace();
      if (text[index] === "}") {
        index++;
        return;
      }
      const seen = new Set<string>();
      for (;;) {
        skipWhitespace();
        const keyLine = line;
        const key = readString();
        if (seen.has(key)) duplicateKeys.push({ path: path.map(String), key, line: keyLine });
        seen.add(key);
        const child = [...path, key];
        lines.set(pathKey(child), keyLine);
        skipWhitespace();
        if (text[index] !== ":") fail(`expected ":" after key "${key}"`);
        index++;
        readValue(child);
        skipWhitespace();
        if (text[index] === ",") {
          index++;
          continue;
        }
        if (text[index] === "}") {
          index++;
          return;
        }
        fail('expected "," or "}"');
      }
    }
    if (character === "[") {
      index++;
      skipWhitespace();
      if (text[index] === "]") {
        index++;
        return;
      }
      for (let item = 0; ; item++) {
        readValue([...path, item]);
        skipWhitespace();
        if (text[index] === ",") {
          index++;
          continue;
        }
        if (text[index] === "]") {
          index++;
          return;
        }
        fail('expected "," or "]"');
      }
    }
    if (character === '"') {
      readString();
      return;
    }
    literalPattern.lastIndex = index;
    const literal = literalPattern.exec(text);
    if (text[index] === "\u2212") fail('expected a value: write a minus sign as "-", not the Unicode minus sign U+2212');
    if (literal === null || literal[0] === "") fail("expected a value");
    const written = (literal as RegExpExecArray)[0];
    if (written !== "true" && written !== "false" && written !== "null") numbers.set(pathKey(path), written);
    index += written.length;
  };

  readValue([]);
  skipWhitespace();
  if (index < text.length) fail("unexpected text after the end of the JSON value");
  return {
    lineOf: (path) => {
      for (let length = path.length; length >= 0; length--) {
        const found = lines.get(pathKey(path.slice(0, length)));
        if (found !== undefined) return found;
      }
      return null;
    },
    literalOf: (path) => numbers.get(pathKey(path)) ?? null,
    duplicateKeys,
  };
}
