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
