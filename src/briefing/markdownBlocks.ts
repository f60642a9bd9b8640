/**
 * A deliberately tiny reader for the project's own markdown documents (SAFETY.md): headings,
 * paragraphs, bullet lists and inline **strong**, *emphasis* and `code`. It produces plain data,
 * never HTML: the templates print every run with `{{ }}`, so every character is escaped there.
 */

/** A run of inline text with its emphasis. */
export interface TextRun {
  readonly text: string;
  readonly strong: boolean;
  readonly emphasis: boolean;
  readonly code: boolean;
}

/** One block of the document. */
export interface MarkdownBlock {
  readonly kind: "heading" | "paragraph" | "list";
  /** Heading level 1–3 (deeper headings are shown as level 3); 0 for other blocks. */
  readonly level: 0 | 1 | 2 | 3;
  /** Inline runs of a heading or paragraph; empty for a list. */
  readonly runs: readonly TextRun[];
  /** Items of a list; empty for other blocks. */
  readonly items: readonly (readonly TextRun[])[];
  /** One flag per kind, so a logic-free template can branch on them. */
  readonly isHeading: boolean;
  readonly isParagraph: boolean;
  readonly isList: boolean;
}

function block(kind: MarkdownBlock["kind"], level: MarkdownBlock["level"], runs: readonly TextRun[], items: readonly (readonly TextRun[])[]): MarkdownBlock {
  return { kind, level, runs, items, isHeading: kind === "heading", isParagraph: kind === "paragraph", isList: kind === "list" };
}

/**
 * Split inline markdown into runs: `**strong**`, `*emphasis*` or `_emphasis_`, and `` `code` ``;
 * a link `[text](address)` keeps its text and prints the address in brackets. Unmatched markers
 * stay as literal characters.
 *
 * @param text - one paragraph or list item, any characters.
 * @returns the runs in order (an empty array for the empty string).
 * @throws never.
 * @example
 * inlineRuns("a **b** c").map((run) => run.text); // => ["a ", "b", " c"]
 */
export function inlineRuns(text: string): TextRun[] {
  const runs: TextRun[] = [];
  const pattern = /\*\*([^*]+)\*\*|`([^`]+)`|\*([^*\s][^*]*)\*|(?<![A-Za-z0-9])_([^_\s][^_]*)_(?![A-Za-z0-9])|\[([^\]]+)\]\(([^)\s]+)\)/g;
  let last = 0;
  const plain = (value: string): void => {
    if (value !== "") runs.push({ text: value, strong: false, emphasis: false, code: false });
  };
  for (const match of text.matchAll(pattern)) {
    const start = match.index;
    plain(text.slice(last, start));
    if (match[1] !== undefined) runs.push({ text: match[1], strong: true, emphasis: false, code: false });
    else if (match[2] !== undefined) runs.push({ text: match[2], strong: false, emphasis: false, code: true });
    else if (match[3] !== undefined) runs.push({ text: match[3], strong: false, emphasis: true, code: false });
    else if (match[4] !== undefined) runs.push({ text: match[4], strong: false, emphasis: true, code: false });
    else if (match[5] !== undefined) plain(`${match[5]} (${match[6] ?? ""})`);
    last = start + match[0].length;
  }
  plain(text.slice(last));
  return runs;
}

/**
 * Read markdown text into blocks: `#`, `##`, `###` headings; bullet items starting `-`, `*` or
 * `+` (continuation lines indented); numbered items `1.` are read as bullets; other non-blank
 * lines join into paragraphs. HTML in the source is not interpreted: it stays text.
 *
 * @param markdown - the document text (CRLF or LF line ends).
 * @returns the blocks in order (an empty array for an empty document).
 * @throws never.
 * @example
 * markdownBlocks("# Cautions\n\n- one\n- two").map((block) => block.kind); // => ["heading", "list"]
 * @see CommonMark Spec 0.31.2 (2024), §4.2 ATX headings, §5.2 list items — a small subset.
 */
export function markdownBlocks(markdown: string): MarkdownBlock[] {
  const blocks: MarkdownBlock[] = [];
  let paragraph: string[] = [];
  let items: string[] | null = null;
  const flushParagraph = (): void => {
    if (paragraph.length > 0) blocks.push(block("paragraph", 0, inlineRuns(paragraph.join(" ")), []));
    paragraph = [];
  };
  const flushList = (): void => {
    if (items !== null && items.length > 0) blocks.push(block("list", 0, [], items.map(inlineRuns)));
    items = null;
  };
  for (const rawLine of markdown.replace(/\r\n?/g, "\n").split("\n")) {
    const line = rawLine.trimEnd();
    const heading = /^(#{1,6})\s+(.*?)\s*#*$/.exec(line);
    const bullet = /^\s{0,3}(?:[-*+]|\d{1,3}[.)])\s+(.*)$/.exec(line);
    if (line.trim() === "") {
      flushParagraph();
      flushList();
    } else if (heading !== null) {
      flushParagraph();
      flushList();
      const level = Math.min(3, heading[1]?.length ?? 1) as 1 | 2 | 3;
      blocks.push(block("heading", level, inlineRuns(heading[2] ?? ""), []));
    } else if (bullet !== null) {
      flushParagraph();
      items ??= [];
      items.push(bullet[1] ?? "");
    } else if (items !== null && /^\s+\S/.test(line)) {
      const lastIndex = items.length - 1;
      items[lastIndex] = `${items[lastIndex] ?? ""} ${line.trim()}`;
    } else {
      flushList();
      paragraph.push(line.trim());
    }
  }
  flushParagraph();
  flushList();
  return blocks;
}
