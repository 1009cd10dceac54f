// `npm run test:fast`: the inner loop (core, adapters, engine, command line in process), under a minute on a
// two-core machine. Left to `npm test`: property tests (many random cases), the browser tests (build the pane and
// drive Chromium), the pack-and-install test (npm pack and a registry install) and the million-row tests.
import { availableParallelism } from "node:os";
import { configDefaults, defineConfig, mergeConfig } from "vitest/config";
import base from "./vitest.config";

// The censored-coverage test simulates thousands of bootstrap fits (a statistical check, not the inner loop).
export const SLOW_TESTS = ["test/properties-*.test.ts", "test/browser-*.test.ts", "test/package-install.test.ts", "test/uncertainty-censored-coverage.test.ts"];

// Every core: vitest's default leaves one free, which on a two-core machine runs the files one at a time
// (82 s measured, against 55 s with both cores). Modules are shared between the files a worker runs
// (isolate: false): importing the same core, adapters and engine again for every file was more than half
// the time (60 s against 28 s measured). `npm test`, which CI runs, keeps every file isolated; a test that
// needs cold caches makes its own fresh modules (vi.resetModules), and the files pass in shuffled order.
export default mergeConfig(
  base,
  defineConfig({ test: { exclude: [...configDefaults.exclude, ...SLOW_TESTS], maxWorkers: availableParallelism(), isolate: false } }),
);
