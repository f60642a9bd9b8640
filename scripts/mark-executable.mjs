// Makes the compiled (unbundled) CLI entry executable after `tsc` (tsc does not keep file modes); the
// bundle the package runs (dist/bin/main.js, scripts/bundle.mjs) is made executable there.
import { chmodSync, existsSync } from "node:fs";
const entry = new URL("../dist/cli/main.js", import.meta.url);
if (existsSync(entry)) chmodSync(entry, 0o755);
