// `npm run test:fast`: the inner loop (core, adapters, engine, command line in process), under a minute on a
// two-core machine. Left to `npm test`: property tests (many random cases), the browser tests (build the pane and
// drive Chromium), the pack-and-install test (npm pack and a registry install) and the million-row tests.
import { availableParallelism } from "node:os";
import { configDefaults, defineConfig, mergeConfig } from "vitest/config";
import base from "./vitest.config";

// The censored-coverage test simulates thousands of bootstrap fits (a statistical check, not the inner loop).
export const SLOW_TESTS = ["test/properties-*.test.ts", "test/browser-*.test.ts", "test/package-install.test.ts", "test/uncertainty-censored-coverage.test.ts"];

// Every core: vitest's default leaves one free, which on a two-core machine runs the files one at a time
// (82 s measured, against 55 s with both cores).
export default mergeConfig(
  base,
  defineConfig({ test: { exclude: [...configDefaults.exclude, ...SLOW_TESTS], maxWorkers: availableParallelism() } }),
);
