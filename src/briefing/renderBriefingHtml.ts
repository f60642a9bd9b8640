/**
 * Rendering the briefing view model to one self-contained HTML document with handlebars.
 */
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import type { BriefingView } from "./buildBriefingView.js";
import { BRIEFING_FACES, embeddedFontCss, fontSubsetsFor } from "./embeddedFonts.js";
import { paletteCss } from "./charts/palette.js";
import { TEMPLATE_OPTIONS, templatesDigest, templateSources } from "./precompiledTemplates.js";
import { trustCss } from "./trustedMarkup.js";

/** The templates folder shipped with the package (`templates/` beside `src/` and `dist/`). */
export const TEMPLATES_DIR = resolve(dirname(fileURLToPath(import.meta.url)), "..", "..", "templates");

/** The templates compiled at build time (scripts/precompile-templates.mjs), beside the package's dist/. */
export const PRECOMPILED_TEMPLATES = resolve(TEMPLATES_DIR, "..", "dist", "briefing-templates.cjs");

const requireFromHere = createRequire(import.meta.url);

/** The part of a handlebars environment used here (the full package and the runtime alike). */
interface HandlebarsEnvironment {
  create(): HandlebarsEnvironment;
  registerPartial(name: string, partial: unknown): void;
  compile(source: string, options: typeof TEMPLATE_OPTIONS): (data: unknown) => string;
  template(spec: unknown): (data: unknown) => string;
}

interface PrecompiledTemplates {
  readonly digest: string;
  readonly main: unknown;
  readonly partials: Readonly<Record<string, unknown>>;
}

type CompiledBriefing = (data: unknown) => string;
const compiledByFolder = new Map<string, CompiledBriefing>();

/** The build's precompiled templates when they were made from exactly these sources, else null. */
function precompiledFor(digest: string, file: string): PrecompiledTemplates | null {
  try {
    const loaded = requireFromHere(file) as PrecompiledTemplates;
    return loaded.digest === digest ? loaded : null;
  } catch {
    return null; // not built (running from the sources), or unreadable: compile here
  }
}

/**
 * The briefing template of `folder`, with its partials: the build's precompiled templates (only the
 * handlebars runtime is loaded) when their digest matches the sources, else compiled here with the same
 * options. A private handlebars environment: no helpers besides the built-in block helpers, strict lookups
 * (a field missing from the view model is an error, never an empty string).
 *
 * @param precompiledFile - where the precompiled templates are looked for (default {@link PRECOMPILED_TEMPLATES}).
 */
export function compileTemplates(folder: string, precompiledFile: string = PRECOMPILED_TEMPLATES): CompiledBriefing {
  const key = `${folder}\u0000${precompiledFile}`;
  const cached = compiledByFolder.get(key);
  if (cached !== undefined) return cached;
  const sources = templateSources(folder);
  const precompiled = precompiledFor(templatesDigest(sources), precompiledFile);
  let template: ((data: unknown) => string) | null = null;
  if (precompiled !== null) {
    try {
      const environment = (requireFromHere("handlebars/runtime") as { default: HandlebarsEnvironment }).default.create();
      for (const [name, spec] of Object.entries(precompiled.partials)) environment.registerPartial(name, environment.template(spec));
      template = environment.template(precompiled.main);
    } catch {
      template = null; // e.g. a handlebars runtime of another compiler revision than the build's: compile here
    }
  }
  if (template === null) {
    const environment = (requireFromHere("handlebars") as HandlebarsEnvironment).create();
    for (const [name, text] of sources.partials) environment.registerPartial(name, text);
    template = environment.compile(sources.main, { ...TEMPLATE_OPTIONS }); // a copy: handlebars adds to its options
  }
  const ready = template;
  const compiled: CompiledBriefing = (data) => ready(data);
  compiledByFolder.set(key, compiled);
  return compiled;
}

/**
 * The briefing's complete style sheet: embedded Source Sans 3 faces, the palette as CSS custom
 * properties (`--fp-<role>`, so the page and the charts share one colour map), then
 * templates/briefing.css.
 *
 * @param templatesDir - folder holding briefing.css (default {@link TEMPLATES_DIR}).
 * @param subsets - font subsets to embed (default latin and latin-ext).
 * @returns CSS text with every font inlined as a data URL.
 * @throws Error when the style sheet or font files cannot be read.
 * @example
 * briefingStyleSheet().includes("font-family:'Source Sans 3'"); // => true
 */
export function briefingStyleSheet(
  templatesDir: string = TEMPLATES_DIR,
  subsets: readonly ("latin" | "latin-ext")[] = ["latin", "latin-ext"],
): string {
  return `${embeddedFontCss(BRIEFING_FACES, subsets)}\n${paletteCss()}${readFileSync(join(templatesDir, "briefing.css"), "utf8")}`;
}

/**
 * A small document with the briefing's own style sheet (latin faces, as most briefings use) and a
 * line in each face plus a little SVG: printed once while the statistics are computed
 * (the rehearsal of `PdfPrinter.warmUp`), so the browser has decoded the fonts and set up its
 * printing before the briefing itself arrives. Nothing of it is kept.
 *
 * @param templatesDir - folder holding briefing.css (default {@link TEMPLATES_DIR}).
 * @returns a complete HTML document that loads nothing.
 * @example
 * rehearsalHtml().includes("@font-face"); // => true
 */
export function rehearsalHtml(templatesDir: string = TEMPLATES_DIR): string {
  return (
    `<!DOCTYPE html><html lang="en"><head><meta charset="utf-8"><style>${briefingStyleSheet(templatesDir, ["latin"])}</style></head>` +
    `<body class="paper-a4"><h1>Rehearsal</h1><p>Regular <em>italic</em> <span style="font-weight:600">semibold</span> <strong>bold</strong> 0123456789 −%</p>` +
    `<svg xmlns="http://www.w3.org/2000/svg" width="120" height="40" viewBox="0 0 120 40"><path d="M0 30 L40 10 L80 25 L120 5" fill="none" stroke="currentColor"/>` +
    `<circle cx="40" cy="10" r="3"/><rect x="0" y="32" width="120" height="8" opacity="0.3"/><text x="2" y="12" font-size="9">text</text></svg></body></html>`
  );
}

/**
 * Render the view model to a self-contained HTML document (fonts and charts inline, no scripts,
 * no outside references, a Content-Security-Policy that forbids any load but data: URLs).
 *
 * Every value is escaped by handlebars; only chart SVG and the style sheet, wrapped as trusted
 * markup after checks (src/briefing/trustedMarkup.ts), are inserted raw.
 *
 * @param view - the view model from `buildBriefingView`.
 * @param templatesDir - folder with briefing.hbs, partials/ and briefing.css (default {@link TEMPLATES_DIR}).
 * @returns the HTML text.
 * @throws Error when a template refers to a field the view model lacks (strict mode) or files are missing.
 * @example
 * renderBriefingHtml(view).startsWith("<!DOCTYPE html>"); // => true
 * @see Handlebars.js manual, "Precompilation / compile options": strict, knownHelpersOnly.
 */
export function renderBriefingHtml(view: BriefingView, templatesDir: string = TEMPLATES_DIR): string {
  const render = compileTemplates(templatesDir);
  const subsets = fontSubsetsFor(JSON.stringify(view));
  return render({ view, style: trustCss(briefingStyleSheet(templatesDir, subsets)) }).trimStart();
}
