/** Text of every page of a PDF, extracted with pdfjs-dist (test helper). */
import { getDocument } from "pdfjs-dist/legacy/build/pdf.mjs";

export async function pdfPageTexts(pdf: Uint8Array): Promise<string[]> {
  const document = await getDocument({ data: new Uint8Array(pdf), disableFontFace: true, useSystemFonts: false, verbosity: 0 }).promise;
  const pages: string[] = [];
  for (let number = 1; number <= document.numPages; number++) {
    const page = await document.getPage(number);
    const content = await page.getTextContent();
    pages.push(
      content.items
        .map((item) => ("str" in item ? item.str + (item.hasEOL ? "\n" : "") : ""))
        .join("")
        .replace(/[ \t]+/g, " "),
    );
  }
  await document.destroy();
  return pages;
}

/** All page texts joined, with line breaks turned into spaces (for phrase searches). */
export function flatText(pages: readonly string[]): string {
  return pages.join("\n").replace(/\s+/g, " ");
}
