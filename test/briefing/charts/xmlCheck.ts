/**
 * A small strict XML well-formedness checker for the chart tests (no dependency): balanced and
 * properly nested tags, quoted attributes without duplicates, only predefined or numeric
 * entities, no stray `<` or `&`, exactly one root element. It returns the elements and the
 * decoded text nodes so tests can look inside the SVG.
 */

export interface XmlElement {
  readonly name: string;
  readonly attributes: Readonly<Record<string, string>>;
  /** Names of the enclosing elements, outermost first. */
  readonly ancestors: readonly string[];
}

export interface XmlDocument {
  readonly root: XmlElement;
  readonly elements: readonly XmlElement[];
  /** Decoded text of each text node (whitespace-only nodes left out). */
  readonly texts: readonly string[];
}

const NAME = /^[A-Za-z_][\w.:-]*/;
const ENTITY = /&(?:amp|lt|gt|quot|apos|#[0-9]+|#x[0-9a-fA-F]+);/y;

function decode(raw: string, where: string): string {
  let out = "";
  for (let index = 0; index < raw.length; index += 1) {
    const char = raw[index] as string;
    if (char === "<") throw new Error(`raw '<' in ${where}`);
    if (char !== "&") {
      out += char;
      continue;
    }
    ENTITY.lastIndex = index;
    const match = ENTITY.exec(raw);
    if (!match) throw new Error(`bad entity in ${where}: ${raw.slice(index, index + 12)}`);
    const entity = match[0];
    const named: Record<string, string> = { "&amp;": "&", "&lt;": "<", "&gt;": ">", "&quot;": '"', "&apos;": "'" };
    out += named[entity] ?? String.fromCodePoint(entity.startsWith("&#x") ? parseInt(entity.slice(3, -1), 16) : parseInt(entity.slice(2, -1), 10));
    index += entity.length - 1;
  }
  return out;
}

/**
 * Parses a string as a standalone XML document (no prolog, doctype, CDATA or processing
 * instructions: the charts never emit them) and throws an Error naming the first problem.
 */
export function parseXml(source: string): XmlDocument {
  const elements: XmlElement[] = [];
  const texts: string[] = [];
  const stack: XmlElement[] = [];
  let root: XmlElement | undefined;
  let position = 0;
  while (position < source.length) {
    const open = source.indexOf("<", position);
    const textEnd = open === -1 ? source.length : open;
    const rawText = source.slice(position, textEnd);
    if (rawText.trim() !== "") {
      if (stack.length === 0) throw new Error(`text outside the root element: ${rawText.slice(0, 20)}`);
      texts.push(decode(rawText, "text"));
    }
    if (open === -1) break;
    if (source.startsWith("<!--", open)) {
      const close = source.indexOf("-->", open + 4);
      if (close === -1) throw new Error("unterminated comment");
      position = close + 3;
      continue;
    }
    if (source.startsWith("<!", open) || source.startsWith("<?", open)) {
      throw new Error(`unsupported markup at ${open}`);
    }
    const close = source.indexOf(">", open);
    if (close === -1) throw new Error(`unterminated tag at ${open}`);
    const tag = source.slice(open + 1, close);
    position = close + 1;
    if (tag.startsWith("/")) {
      const name = tag.slice(1).trim();
      const top = stack.pop();
      if (!top || top.name !== name) throw new Error(`end tag </${name}> does not match <${top?.name ?? "nothing"}>`);
      continue;
    }
    const selfClosing = tag.endsWith("/");
    const body = selfClosing ? tag.slice(0, -1) : tag;
    const nameMatch = NAME.exec(body);
    if (!nameMatch) throw new Error(`bad tag name at ${open}: <${tag.slice(0, 20)}`);
    const name = nameMatch[0];
    let rest = body.slice(name.length);
    const attributes: Record<string, string> = {};
    while (rest.trim() !== "") {
      const attribute = /^\s+([A-Za-z_:][\w.:-]*)\s*=\s*(?:"([^"]*)"|'([^']*)')/.exec(rest);
      if (!attribute) throw new Error(`bad attribute syntax in <${name}>: ${rest.slice(0, 30)}`);
      const key = attribute[1] as string;
      if (key in attributes) throw new Error(`duplicate attribute ${key} in <${name}>`);
      attributes[key] = decode(attribute[2] ?? attribute[3] ?? "", `attribute ${key}`);
      rest = rest.slice(attribute[0].length);
    }
    if (stack.length === 0 && root) throw new Error("more than one root element");
    const element: XmlElement = { name, attributes, ancestors: stack.map((entry) => entry.name) };
    elements.push(element);
    if (!root) root = element;
    if (!selfClosing) stack.push(element);
  }
  if (stack.length > 0) throw new Error(`unclosed element <${stack[stack.length - 1]?.name}>`);
  if (!root) throw new Error("no root element");
  return { root, elements, texts };
}
