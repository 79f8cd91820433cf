export * from "./users";
