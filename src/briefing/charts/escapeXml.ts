/**
 * Escape text for an XML text node or a double- or single-quoted attribute value.
 *
 * Replaces the five characters with a meaning in XML markup (`&`, `<`, `>`, `"`, `'`) by their
 * predefined entities and removes the characters that XML 1.0 does not allow at all (C0 control
 * characters other than tab, line feed and carriage return, lone surrogates, U+FFFE and U+FFFF),
 * so that any user-supplied text (an index name, a phase label) yields well-formed SVG.
 *
 * @param text - any string, including the empty string.
 * @returns the escaped string; the empty string for the empty string.
 * @throws never.
 * @example
 * escapeXml('<script>alert("x")</script> & co');
 * // => '&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; &amp; co'
 * @see W3C (2008) "Extensible Markup Language (XML) 1.0 (Fifth Edition)", sections 2.2
 * (Characters) and 2.4 (Character Data and Markup), https://www.w3.org/TR/xml/.
 */
export function escapeXml(text: string): string {
  return text
    .replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]/g, "")
    .replace(/[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g, "")
    .replace(/&/g, "&amp;")
    .replace(/</g, "&lt;")
    .replace(/>/g, "&gt;")
    .replace(/"/g, "&quot;")
    .replace(/'/g, "&apos;");
}
