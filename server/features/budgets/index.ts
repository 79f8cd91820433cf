// Public face of the budgets feature (estimates, recipes and the workspace currency): other features import only from here.
export { profileExtras, resolveAndEstimate } from "./budgets.service";
export { budgetsFeature } from "./budgets.router";
