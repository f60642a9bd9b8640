// Compiles the briefing's handlebars templates ahead of time into dist/briefing-templates.cjs (after
// tsc): see src/briefing/precompiledTemplates.ts. A briefing then loads only the handlebars runtime.
import { renameSync, writeFileSync } from "node:fs";
import { createRequire } from "node:module";
import { fileURLToPath } from "node:url";

const root = fileURLToPath(new URL("..", import.meta.url));
const { precompiledTemplatesModule } = await import(new URL("../dist/briefing/precompiledTemplates.js", import.meta.url).href);
const handlebars = createRequire(import.meta.url)("handlebars");
const text = precompiledTemplatesModule(`${root}templates`, (source, options) => handlebars.precompile(source, options));
const target = `${root}dist/briefing-templates.cjs`;
const temporary = `${target}.${process.pid}.tmp`;
writeFileSync(temporary, text);
renameSync(temporary, target);
