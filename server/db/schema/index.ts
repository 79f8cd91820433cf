export * from "./users";
export * from "./models";
export * from "./plans";
export * from "./accelerators";
export * from "./bounds";
export * from "./conformance";
export * from "./evidence";
