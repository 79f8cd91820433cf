// One "is the build stale?" helper for the server build (build-server.mjs) and the client build (start.ts).
import fs from "node:fs";
import path from "node:path";

/** The newest modification time (ms) of a file, or of any file under a folder. */
export function newestMtime(p) {
  const stat = fs.statSync(p);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = 0;
  for (const entry of fs.readdirSync(p)) newest = Math.max(newest, newestMtime(path.join(p, entry)));
  return newest;
}
