#!/usr/bin/env node
// The `brittle` command: runs the compiled command line in lib/, which
// `npm pack` (prepack) and `npm run build` write. In the repository,
// `npm run calc` and `npm run demo` compile it first when a source changed.
import { existsSync } from "node:fs";

const compiled = new URL("../lib/brittle.mjs", import.meta.url);
if (!existsSync(compiled)) {
  process.stderr.write("brittle: the command line is not compiled (lib/brittle.mjs is missing): in the repository run `npm run build:cli`\n");
  process.exit(1);
}
await import(compiled.href);
