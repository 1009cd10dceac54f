export function pivotalTable(): any { throw new Error("table pending"); }
