import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { createRequire } from "node:module";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { buildBriefingView } from "../../src/briefing/buildBriefingView.js";
import { precompiledTemplatesModule, templatesDigest, templateSources } from "../../src/briefing/precompiledTemplates.js";
import { compileTemplates, TEMPLATES_DIR } from "../../src/briefing/renderBriefingHtml.js";
import { SAMPLE_SAFETY_MARKDOWN, sampleBriefingInputs } from "./sampleBriefingInputs.js";

const handlebars = createRequire(import.meta.url)("handlebars") as { precompile: (source: string, options: object) => string };
const work = mkdtempSync(join(tmpdir(), "firephase-precompiled-test-"));
afterAll(() => rmSync(work, { recursive: true, force: true }));

const view = buildBriefingView({ ...sampleBriefingInputs(), toolVersion: "0.1.0", safetyMarkdown: SAMPLE_SAFETY_MARKDOWN, paper: "a4" });
const data = { view, style: { trustedMarkup: "" } };

function writeModule(folder: string, name: string): string {
  const file = join(work, name);
  writeFileSync(file, precompiledTemplatesModule(folder, (source, options) => handlebars.precompile(source, options)));
  return file;
}

describe("precompiled briefing templates (build time) and compileTemplates", () => {
  it("the precompiled templates render the sample briefing exactly as the templates compiled at run time", () => {
    const file = writeModule(TEMPLATES_DIR, "briefing-templates.cjs");
    expect((createRequire(import.meta.url)(file) as { digest: string }).digest).toBe(templatesDigest(templateSources(TEMPLATES_DIR)));
    const ahead = compileTemplates(TEMPLATES_DIR, file)(data);
    const atRunTime = compileTemplates(TEMPLATES_DIR, join(work, "none.cjs"))(data);
    expect(ahead.length).toBeGreaterThan(10_000);
    expect(ahead).toBe(atRunTime);
  });

  it("stale precompiled templates (a template edited after the build) are not used: the edited template is compiled and shown", () => {
    const folder = join(work, "templates");
    cpSync(TEMPLATES_DIR, folder, { recursive: true });
    const stale = writeModule(folder, "stale.cjs");
    const main = join(folder, "briefing.hbs");
    writeFileSync(main, readFileSync(main, "utf8").replace("<body", "<!-- edited after the build -->\n<body"));
    expect(compileTemplates(folder, stale)(data)).toContain("edited after the build");
  });

  it("the digest changes with any template's text and not otherwise", () => {
    const sources = templateSources(TEMPLATES_DIR);
    const digest = templatesDigest(sources);
    expect(templatesDigest(templateSources(TEMPLATES_DIR))).toBe(digest);
    const [first, ...rest] = sources.partials;
    const [name, text] = first as readonly [string, string];
    expect(templatesDigest({ main: sources.main, partials: [[name, `${text} `], ...rest] })).not.toBe(digest);
    expect(templatesDigest({ main: `${sources.main} `, partials: sources.partials })).not.toBe(digest);
  });
});

describe("precompiled templates the handlebars runtime refuses", () => {
  it("(another compiler revision than the runtime's) are not used: the templates are compiled here and render the same briefing", () => {
    const file = join(work, "other-revision.cjs");
    const digest = templatesDigest(templateSources(TEMPLATES_DIR));
    writeFileSync(file, `module.exports = { digest: ${JSON.stringify(digest)}, main: { compiler: [1, "< 1.0.0"], main: function () { return "stale"; } }, partials: {} };\n`);
    const rendered = compileTemplates(TEMPLATES_DIR, file)(data);
    expect(rendered).not.toBe("stale");
    expect(rendered).toBe(compileTemplates(TEMPLATES_DIR, join(work, "none.cjs"))(data));
  });
});
