/**
 * The cell functions whose evaluation can run a seeded simulation (a few
 * hundred milliseconds to seconds): censored-sample unbiasing (MODULUS) and
 * bounds, the fit table's single-population and mixture checks, the lot check
 * and the pooled material fit. The spreadsheet host runs these asynchronously
 * and lets the user cancel them (JSDoc @cancelable); every other function is
 * closed-form or tabulated and stays synchronous. test/cancelable-cells.test.ts
 * checks that no function outside this list simulates.
 */
export const SIMULATING: readonly string[] = [
  "MODULUS",
  "FIT",
  "ORIGINFIT",
  "MODULUSBOUNDS",
  "CHARSTRENGTHBOUNDS",
  "DESIGNSTRESSBOUND",
  "LOTCHECK",
  "MATERIALFIT",
];

/** What the function reference and the help page say about a simulating function in the spreadsheet. */
export const IN_THE_BACKGROUND =
  "Simulates: in the spreadsheet it is computed in the background (the sheet stays usable meanwhile); editing its cell or its inputs, or recalculating by hand, cancels the run under way.";
