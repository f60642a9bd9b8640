import { describe, expect, it } from "vitest";
import { parseXml } from "./xmlCheck.js";

describe("parseXml (test helper)", () => {
  it("parseXml('<a x=\"1\"><b/>t &amp; u</a>') returns elements and decoded text", () => {
    const document = parseXml('<a x="1"><b/>t &amp; u</a>');
    expect(document.root.name).toBe("a");
    expect(document.root.attributes).toEqual({ x: "1" });
    expect(document.elements.map((element) => element.name)).toEqual(["a", "b"]);
    expect(document.texts).toEqual(["t & u"]);
  });

  it.each([
    ["<a><b></a></b>", /does not match/],
    ["<a>", /unclosed/],
    ["<a>x < y</a>", /bad tag name|raw/],
    ["<a>R&D</a>", /bad entity/],
    ["<a x=1/>", /attribute syntax/],
    ['<a x="1" x="2"/>', /duplicate/],
    ["<a/><b/>", /more than one root/],
    ["text<a/>", /outside the root/],
    ['<a title="<"/>', /raw '<'/],
  ])("parseXml(%j) throws", (source, message) => {
    expect(() => parseXml(source)).toThrow(message);
  });
});
