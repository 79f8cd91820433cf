export * from "./users";
export * from "./models";
export * from "./plans";
export * from "./accelerators";
