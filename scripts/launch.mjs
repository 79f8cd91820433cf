// `npm start`: builds the server into dist/server when it is missing or older than its sources, then runs the
// compiled bundle (scripts/start.ts: database, migrations, seed, client build when stale, server).
import { pathToFileURL } from "node:url";
import { buildServerIfStale, SERVER_ENTRY } from "./build-server.mjs";

await buildServerIfStale();
await import(pathToFileURL(SERVER_ENTRY).href);
