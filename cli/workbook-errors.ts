/** A workbook or sheet that cannot be read or evaluated: one line for the user, exit code 1. */
export class WorkbookError extends Error {}
