// Public face of the plans feature: other features and server/app.ts import only from here.
export { plansUsingModel } from "./plans.usage";
export { plansFeature } from "./plans.router";
export { conformanceFeature } from "./conformance.router";
