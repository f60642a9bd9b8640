/** Checks every chart's output must pass, shared by the chart tests. */
import { expect } from "vitest";
import { parseXml, type XmlDocument } from "./xmlCheck.js";

/**
 * Parses a chart's SVG strictly and checks the promises of every chart: one `<svg>` root with a
 * viewBox and 100% width, the chart font, no scripts, no links, no foreignObject, no event
 * handlers, and no "NaN", "undefined", "Infinity" or "null" anywhere in the text.
 */
export function checkChartSvg(svg: string): XmlDocument {
  const document = parseXml(svg);
  expect(document.root.name).toBe("svg");
  expect(document.root.attributes.xmlns).toBe("http://www.w3.org/2000/svg");
  expect(document.root.attributes.viewBox).toMatch(/^0 0 \d+(\.\d+)? \d+(\.\d+)?$/);
  expect(document.root.attributes.width).toBe("100%");
  expect(document.root.attributes["font-family"]).toContain("Source Sans 3");
  expect(svg).not.toMatch(/<script/i);
  expect(svg).not.toMatch(/href\s*=/i);
  expect(svg).not.toMatch(/foreignObject/i);
  expect(svg).not.toMatch(/url\(/i);
  expect(svg).not.toMatch(/NaN|undefined|Infinity|null/);
  for (const element of document.elements) {
    for (const name of Object.keys(element.attributes)) expect(name.toLowerCase().startsWith("on")).toBe(false);
  }
  return document;
}

/** All decoded text of a chart joined by newlines. */
export function chartText(document: XmlDocument): string {
  return document.texts.join("\n");
}

/** Elements of a given name carrying a given attribute value. */
export function elementsWith(document: XmlDocument, name: string, attribute: string, value: string) {
  return document.elements.filter((element) => element.name === name && element.attributes[attribute] === value);
}
