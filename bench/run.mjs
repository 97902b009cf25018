// Runs every benchmark in bench/ in sequence (each prints its own table).
// `npm run bench` builds first; `node bench/run.mjs name...` runs a subset.
import { readdirSync } from "node:fs";
import { spawnSync } from "node:child_process";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

const here = dirname(fileURLToPath(import.meta.url));
const wanted = process.argv.slice(2);
const files = readdirSync(here)
  .filter((f) => f.endsWith(".mjs") && !["run.mjs", "common.mjs"].includes(f))
  .filter((f) => wanted.length === 0 || wanted.some((w) => f.includes(w)))
  .sort();
let failed = 0;
for (const f of files) {
  console.log(`\n=== ${f} ===`);
  const r = spawnSync(process.execPath, [join(here, f)], { stdio: "inherit" });
  if (r.status !== 0) failed++;
}
process.exit(failed ? 1 : 0);
