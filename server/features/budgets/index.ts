// Public face of the budgets feature (estimates and the accelerator catalog): other features import only from here.
export { resolveAndEstimate } from "./budgets.service";
export { findAccelerator } from "./accelerators.service";
export { acceleratorsFeature, budgetsFeature } from "./budgets.router";
