#!/usr/bin/env node
// Runs a repository TypeScript script (benchmarks, example builders) through tsx.
import { register } from "tsx/esm/api";
import { pathToFileURL } from "node:url";
import { resolve } from "node:path";

register();
const [script, ...args] = process.argv.slice(2);
process.argv = [process.argv[0], script, ...args];
await import(pathToFileURL(resolve(script)).href);
