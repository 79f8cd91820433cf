/* The plans domain: request bodies and queries (requests.ts) and the bodies /api/plans answers with (responses.ts). */
export * from "./requests";
export * from "./responses";
