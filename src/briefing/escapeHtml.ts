/**
 * Escape text for HTML element content and double- or single-quoted attribute values.
 *
 * Replaces the five characters that HTML gives meaning to: `&` → `&amp;`, `<` → `&lt;`,
 * `>` → `&gt;`, `"` → `&quot;`, `'` → `&#39;`. Used for the few strings built outside the
 * handlebars templates (the PDF footer); the templates escape with `{{ }}`.
 *
 * @param text - any string, including the empty string.
 * @returns the escaped string (the empty string for the empty string).
 * @throws never.
 * @example
 * escapeHtml('<img src="x">'); // => "&lt;img src=&quot;x&quot;&gt;"
 * @see WHATWG HTML Living Standard, §13.1.2.6 "Restrictions on the contents of raw text and escapable raw text elements".
 */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (character) => {
    switch (character) {
      case "&":
        return "&amp;";
      case "<":
        return "&lt;";
      case ">":
        return "&gt;";
      case '"':
        return "&quot;";
      default:
        return "&#39;";
    }
  });
}
