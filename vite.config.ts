import { defineConfig } from "vite";
import { resolve } from "node:path";

// The task pane; functions.json, the help page generated from it, functions.js and (with --office-js local) office.js
// are added by scripts/build.mjs.
export default defineConfig({
  root: "taskpane",
  base: "./",
  publicDir: "assets-public",
  build: {
    outDir: resolve(import.meta.dirname, "dist"),
    emptyOutDir: true,
    target: "es2020",
    rollupOptions: {
      input: {
        taskpane: resolve(import.meta.dirname, "taskpane/taskpane.html"),
      },
    },
  },
});
