export { evidenceFeature } from "./evidence.router";
