/**
 * Rendering the briefing view model to one self-contained HTML document with handlebars.
 */
import { readFileSync, readdirSync } from "node:fs";
import { basename, dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import Handlebars from "handlebars";
import type { BriefingView } from "./buildBriefingView.js";
import { BRIEFING_FACES, embeddedFontCss, fontSubsetsFor } from "./embeddedFonts.js";
import { paletteCss } from "./charts/palette.js";
import { trustCss } from "./trustedMarkup.js";

/** The templates folder shipped with the package (`templates/` beside `src/` and `dist/`). */
export const TEMPLATES_DIR = resolve(dirname(fileURLToPath(import.meta.url)), "..", "..", "templates");

type CompiledBriefing = (data: unknown) => string;
const compiledByFolder = new Map<string, CompiledBriefing>();

function compileTemplates(folder: string): CompiledBriefing {
  const cached = compiledByFolder.get(folder);
  if (cached !== undefined) return cached;
  // A private handlebars environment: no helpers besides the built-in block helpers, strict
  // lookups (a field missing from the view model is an error, never an empty string).
  const environment = Handlebars.create();
  const partialsFolder = join(folder, "partials");
  for (const file of readdirSync(partialsFolder).sort()) {
    if (file.endsWith(".hbs")) environment.registerPartial(basename(file, ".hbs"), readFileSync(join(partialsFolder, file), "utf8"));
  }
  const template = environment.compile(readFileSync(join(folder, "briefing.hbs"), "utf8"), {
    strict: true,
    knownHelpersOnly: true,
    preventIndent: true,
  });
  const compiled: CompiledBriefing = (data) => template(data);
  compiledByFolder.set(folder, compiled);
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
