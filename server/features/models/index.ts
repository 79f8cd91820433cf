// Public face of the models feature: other features import only from here (eslint.config.js enforces it).
export { getModelShape, type ModelUsage } from "./models.service";
// Plans and budgets snapshot a profile's stored row into their own records, so they read it as stored.
export { findModelRow, type ModelRow } from "./models.repo";
export { sourceConfigOf } from "./source-config";
export { modelsFeature } from "./models.router";
