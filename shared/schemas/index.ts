export * from "./common";
export * from "./auth";
export * from "./users";
export * from "./models";
export * from "./plans";
export * from "./analysis";
export * from "./tokens";
export * from "./audit";
