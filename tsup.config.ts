import { defineConfig } from "tsup";

export default defineConfig([
  {
    entry: { index: "src/index.ts" },
    format: ["esm", "cjs"],
    dts: true,
    sourcemap: true,
    clean: true,
    target: "node20",
    // import.meta.url (the nested-dissection helper script sits beside the bundle) in the CommonJS build
    shims: true,
  },
  {
    // the helper thread of nested dissection, loaded by path from the bundles above
    entry: { "dissection-worker": "src/ordering/nested-dissection/worker.ts" },
    format: ["esm"],
    sourcemap: true,
    clean: false,
    target: "node20",
  },
  {
    entry: { cli: "src/cli/main.ts" },
    format: ["esm"],
    sourcemap: true,
    clean: false,
    target: "node20",
    banner: { js: "#!/usr/bin/env node" },
  },
]);
