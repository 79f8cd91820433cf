// Types of build-server.mjs (plain JavaScript so `npm start` needs no TypeScript loader), for the tests that call it.
export const SERVER_OUT: string;
export const SERVER_ENTRY: string;
export function serverBuildIsStale(): boolean;
export function buildServer(): Promise<void>;
export function buildServerIfStale(): Promise<boolean>;
