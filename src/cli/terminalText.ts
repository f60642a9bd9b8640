/**
 * Terminal-safe text: every line the CLI prints goes through {@link terminalSafe}, so that text
 * from a region folder (a region name, description, site id or index name) or from the command
 * line cannot drive the terminal — retitle it (OSC), move the cursor or erase a warning line
 * (ESC/CSI), or reorder what is shown (bidirectional controls).
 */

/**
 * Control characters written as visible escapes: C0 controls except line feed and tab (so ESC
 * 0x1B becomes `\u{1b}` and carriage return `\r`), DEL 0x7F, the C1 controls 0x80–0x9F (8-bit CSI
 * and OSC), the Unicode line and paragraph separators, and the bidirectional embedding, override
 * and isolate controls (U+202A–U+202E, U+2066–U+2069, U+200E, U+200F, U+061C). Everything else,
 * including every printable Unicode character, is unchanged.
 *
 * @param text - any text; line feeds are kept
 * @returns the text with each control character escaped; "" for ""
 * @example
 * terminalSafe("Ridge\u001b]0;owned\u0007\n"); // => "Ridge\\u{1b}]0;owned\\u{7}\n"
 */
export function terminalSafe(text: string): string {
  return text.replace(/[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g, (character) =>
    character === "\r" ? "\\r" : `\\u{${(character.codePointAt(0) as number).toString(16)}}`,
  );
}

/** Writes text to stdout after {@link terminalSafe}. */
export function writeOut(text: string): void {
  process.stdout.write(terminalSafe(text));
}

/** Writes text to stderr after {@link terminalSafe}. */
export function writeErr(text: string): void {
  process.stderr.write(terminalSafe(text));
}
