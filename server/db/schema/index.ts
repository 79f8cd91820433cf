export * from "./users";
export * from "./models";
