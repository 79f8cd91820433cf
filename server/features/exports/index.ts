// Public face of the exports feature.
export { exportsFeature } from "./exports.router";
