// Makes the built CLI entry executable after `tsc` (tsc does not keep file modes).
import { chmodSync, existsSync } from "node:fs";
const entry = new URL("../dist/cli/main.js", import.meta.url);
if (existsSync(entry)) chmodSync(entry, 0o755);
