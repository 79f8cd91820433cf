// The app as production runs it, for bench:scale, on the bench database. Production skips the development-only check
// of every reply against its schema (server/http/route.ts), so this is the figure a deployment would see. Behind a
// TLS proxy as in production: the session cookie is Secure, so requests say https.
import { startProductionApp } from "../production-app";
import { appUrl, ownerUrl } from "./prepare";

export const PROXIED = { "x-forwarded-proto": "https" };

/** Starts the compiled production server on the bench database; `stop()` ends it. */
export const startProduction = () =>
  startProductionApp({
    databaseUrl: appUrl,
    migrationUrl: ownerUrl,
    seed: false, // the bench database is seeded already, demo accounts included
    tries: 2400, // generous: a stale server or client build happens first
  });
