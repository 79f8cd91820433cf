import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

/**
 * The folder holding package.json, found by walking up from this module. The same answer from source
 * (server/platform/) and from the built bundle (dist/server/), so migrations/ and the db scripts are found in both.
 */
export function projectRoot(from: string = import.meta.url): string {
  let dir = path.dirname(fileURLToPath(from));
  while (!fs.existsSync(path.join(dir, "package.json"))) {
    const up = path.dirname(dir);
    if (up === dir) throw new Error(`no package.json above ${fileURLToPath(from)}`);
    dir = up;
  }
  return dir;
}
