// ESLint 9 flat config: the JavaScript and typescript-eslint recommended rules
// everywhere, and the add-in platform's own rules (eslint-plugin-office-addins)
// where the spreadsheet API is called.
//
// The plugin's "recommended" preset is not used whole: it also switches on
// prettier formatting with its own settings, which would rewrite every file of
// this codebase for no change in behaviour. Its office-addins/* rules, the part
// that finds real mistakes (reading a proxy before load/sync, sync in a loop),
// are all on below.
import js from "@eslint/js";
import tseslint from "typescript-eslint";
import officeAddins from "eslint-plugin-office-addins";
import globals from "globals";

const officeRules = Object.fromEntries(Object.keys(officeAddins.rules).map((name) => [`office-addins/${name}`, "error"]));

export default tseslint.config(
  { ignores: ["dist/", "lib/", "node_modules/", "test-artifacts/", "examples/out/", "coverage/", "**/*.d.ts"] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node } },
    rules: {
      // Cell adapters take `any` and `any[][]` on purpose: the host passes whatever a cell holds, and the
      // metadata generator rejects unions (see DEVELOPERS.md); every value is then read through cells.ts.
      "@typescript-eslint/no-explicit-any": "off",
      // `_name` marks an argument kept for its position in a signature the host or a library fixes.
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_", caughtErrors: "none" }],
    },
  },
  {
    // Series coefficients and constants are written with the digits their source publishes (more than a double
    // holds); the parser rounds each to the nearest double, which is the intent, and the digits stay checkable.
    files: ["src/numeric/**/*.ts", "src/weibull/modulus-from-cv.ts"],
    rules: { "no-loss-of-precision": "off" },
  },
  {
    files: ["taskpane/**/*.ts", "functions/**/*.ts"],
    languageOptions: { globals: { ...globals.browser, Office: "readonly", Excel: "readonly", CustomFunctions: "readonly" } },
    plugins: { "office-addins": officeAddins },
    rules: officeRules,
  },
);
