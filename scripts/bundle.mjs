// Bundles the compiled CLI (dist/cli/*.js, from tsc) into dist/bin/ with esbuild: the program the
// package's "bin" runs. A cold start then reads a few files instead of resolving and compiling some
// hundreds of modules one by one. The commands stay lazy: each dynamic import() becomes its own chunk
// (code splitting), so `check` still never loads the browser, the charts or the templates.
//
// Kept outside the bundle (resolved from node_modules at run time, as before): @sparticuz/chromium,
// which finds its packed browser beside its package (a bundle would move its code away from it); and
// the optional native helpers of the WebSocket library (bufferutil, utf-8-validate), which it loads
// only when installed. puppeteer-core is bundled (a chunk of its own, loaded only by `brief`): loading
// it module by module took about 150 ms of the launch. handlebars is loaded by renderBriefingHtml
// through createRequire, at run time. Everything else (commander, d3, pure-rand, @stdlib, the
// project's code) is bundled. dist/bin/ sits two folders below the package root, like dist/cli/, so
// the paths the code builds from import.meta.url (package.json, SAFETY.md, templates/, the fonts)
// resolve the same.
// The worker threads' entries (hindcastWorker, briefWorker) are entry points of their own, so
// `new URL("./hindcastWorker.js", import.meta.url)` finds them beside the chunk that starts them.
import { build } from "esbuild";
import { chmodSync, mkdirSync, readdirSync, renameSync, rmSync, statSync, writeFileSync } from "node:fs";
import { basename, dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

const root = fileURLToPath(new URL("..", import.meta.url));
const outdir = join(root, "dist", "bin");
const entries = ["main", "hindcastWorker", "briefWorker"];
const result = await build({
  absWorkingDir: root,
  entryPoints: entries.map((name) => `dist/cli/${name}.js`),
  outdir,
  entryNames: "[name]",
  chunkNames: "chunk-[hash]",
  bundle: true,
  splitting: true,
  format: "esm",
  platform: "node",
  target: "node20",
  external: ["@sparticuz/chromium", "bufferutil", "utf-8-validate"],
  // CommonJS packages inside an ES-module bundle call require() for Node's own modules.
  banner: { js: "import { createRequire as firephaseCreateRequire } from 'node:module'; const require = firephaseCreateRequire(import.meta.url);" },
  legalComments: "eof", // the bundled packages' licence comments kept at the end of each file
  logLevel: "warning",
  write: false,
});
// Written file by file, each to a temporary name then renamed, chunks before the entries that import
// them: a program already running from dist/bin (a test, while another rebuilds) never sees a half
// file, and chunk names carry a hash of their content, so a running program's chunks stay in place.
mkdirSync(outdir, { recursive: true });
const isEntry = (path) => entries.includes(basename(path, ".js"));
const files = [...result.outputFiles].sort((a, b) => Number(isEntry(a.path)) - Number(isEntry(b.path)));
for (const file of files) {
  const temporary = join(dirname(file.path), `.${basename(file.path)}.${process.pid}.tmp`);
  writeFileSync(temporary, file.contents);
  if (basename(file.path) === "main.js") chmodSync(temporary, 0o755); // executable from the moment it is there
  renameSync(temporary, file.path);
}
// Chunks of earlier builds: removed by a plain build; kept (an hour) when tests rebuild while others run.
const current = new Set(files.map((file) => basename(file.path)));
const keepRecent = process.env.FIREPHASE_BUNDLE_KEEP_RECENT === "1";
for (const name of readdirSync(outdir)) {
  // Another build's temporary files (between their write and rename) are never touched.
  if (current.has(name) || /^\..*\.tmp$/.test(name)) continue;
  const path = join(outdir, name);
  try {
    if (keepRecent && Date.now() - statSync(path).mtimeMs < 3_600_000) continue;
    rmSync(path, { force: true, recursive: true });
  } catch {
    // removed meanwhile by another build
  }
}
