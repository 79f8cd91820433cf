// Public face of the accelerators feature (the catalog budgets are costed on): other features import only from here.
export { findAccelerator } from "./accelerators.service";
export { acceleratorsFeature } from "./accelerators.router";
