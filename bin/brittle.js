#!/usr/bin/env node
// Runs the TypeScript command directly: tsx compiles it in memory, so the
// command works from a fresh clone after `npm ci`, with no build step.
import { register } from "tsx/esm/api";

register();
const { main } = await import("../cli/cli.ts");
process.exitCode = await main(process.argv.slice(2));
