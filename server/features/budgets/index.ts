// Public face of the budgets feature (estimates and recipes): other features import only from here.
export { resolveAndEstimate } from "./budgets.service";
export { budgetsFeature } from "./budgets.router";
