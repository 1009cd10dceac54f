/** Effective volume and area: fixtures, multiaxial criteria, presets, element tables, streaming. */
export * from "./criteria";
export * from "./flexure";
export * from "./plate-field";
export * from "./disk";
export * from "./presets";
export * from "./principal";
export * from "./power-kernel";
export * from "./part";
export * from "./part-columns";
export * from "./part-stream";
