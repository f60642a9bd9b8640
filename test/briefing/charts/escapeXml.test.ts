import { describe, expect, it } from "vitest";
import { escapeXml } from "../../../src/briefing/charts/escapeXml.js";
import { parseXml } from "./xmlCheck.js";

describe("escapeXml", () => {
  it("escapeXml('<script>alert(\"x\")</script> & co') escapes all five markup characters", () => {
    expect(escapeXml('<script>alert("x")</script> & co')).toBe("&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; &amp; co");
    expect(escapeXml("it's")).toBe("it&apos;s");
  });

  it("escapeXml('&amp;') escapes an existing entity again (no double-decoding)", () => {
    expect(escapeXml("&amp;")).toBe("&amp;amp;");
  });

  it("escapeXml removes characters XML 1.0 forbids and keeps tab, newline and non-Latin text", () => {
    expect(escapeXml("a\u0000b\u0008c\u001Fd\uFFFE")).toBe("abcd");
    expect(escapeXml("x\ty\nz")).toBe("x\ty\nz");
    expect(escapeXml("Niño 3.4 – 🔥")).toBe("Niño 3.4 – 🔥");
    expect(escapeXml("lone \uD800 surrogate")).toBe("lone  surrogate");
  });

  it("escapeXml output is always well-formed inside a text node and an attribute", () => {
    const hostile = `"><script>x</script><a b='c' & \u0001 ]]>`;
    const document = parseXml(`<t a="${escapeXml(hostile)}" b='${escapeXml(hostile)}'>${escapeXml(hostile)}</t>`);
    const expected = hostile.replace("\u0001", "");
    expect(document.texts).toEqual([expected]);
    expect(document.root.attributes.a).toBe(expected);
    expect(document.root.attributes.b).toBe(expected);
  });

  it("escapeXml('') is ''", () => {
    expect(escapeXml("")).toBe("");
  });
});
