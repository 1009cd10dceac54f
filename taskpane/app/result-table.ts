/** The result rows the form, the CSV export and the printout show: the core's one list (src/design/check-rows.ts). */
export { resultRows, type ResultRow } from "../../src/design/check-rows";
