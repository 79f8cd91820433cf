import fs from "node:fs";
import path from "node:path";
import type { Express } from "express";
import expressStaticGzip from "express-static-gzip";

/** Kept for a year and never revalidated: the name changes whenever the content does. */
export const IMMUTABLE = "public, max-age=31536000, immutable";
/** Everything else (index.html above all) is revalidated on each use, so a release is seen at the next load. */
export const REVALIDATE = "no-cache";

/**
 * Vite names build assets `assets/<name>-<hash>.<ext>` (an 8-character base64url content hash); the served file may
 * be the `.br`/`.gz` twin written at build time (vite.config.ts).
 */
const HASHED = /^assets\/.+-[A-Za-z0-9_-]{8}\.[A-Za-z0-9]+(\.br|\.gz)?$/;
export const isHashedAsset = (relative: string) => HASHED.test(relative.split(path.sep).join("/"));

/**
 * Serves the built client: precompressed brotli or gzip twins when the browser accepts them (express-static-gzip
 * picks by Accept-Encoding and sets Content-Encoding and Vary), immutable caching on hashed files only, and
 * index.html for every other path (client-side routes).
 */
export function serveClient(app: Express, clientDir: string) {
  const index = path.join(clientDir, "index.html");
  if (!fs.existsSync(index)) return;
  app.use(
    expressStaticGzip(clientDir, {
      enableBrotli: true,
      orderPreference: ["br", "gz"],
      index: false,
      serveStatic: {
        index: false,
        setHeaders: (res, file) =>
          res.setHeader("Cache-Control", isHashedAsset(path.relative(clientDir, file)) ? IMMUTABLE : REVALIDATE),
      },
    }),
  );
  app.get("/{*splat}", (_req, res) => {
    res.setHeader("Cache-Control", REVALIDATE);
    res.sendFile(index);
  });
}
