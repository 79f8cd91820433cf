import fs from "node:fs";
import { spawnSync } from "node:child_process";
import { chromium } from "playwright-core";
import { BROWSER_ENDPOINT_ENV, LAUNCH_OPTIONS } from "./browser";

/**
 * The browser tests drive Debian's Chromium; on a fresh machine the e2e project installs it the way `npm start`
 * installs PostgreSQL (root with apt-get), or says plainly what is missing. Only the e2e projects list this file.
 */
function ensureChromium() {
  if (process.env.CHROMIUM_PATH || fs.existsSync("/usr/lib/chromium/chromium") || fs.existsSync("/usr/bin/chromium"))
    return;
  const asRoot = process.getuid?.() === 0;
  const hasApt = spawnSync("sh", ["-c", "command -v apt-get"]).status === 0;
  if (!asRoot || !hasApt) {
    console.error(
      "Chromium is missing for the browser tests: install it with `apt-get install -y chromium` (or set CHROMIUM_PATH).",
    );
    return;
  }
  console.error("Chromium is missing; installing Debian's package for the browser tests: apt-get install -y chromium");
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  const tryInstall = () =>
    spawnSync("apt-get", ["install", "-y", "chromium"], { stdio: ["ignore", "ignore", "inherit"], env }).status === 0;
  if (!tryInstall()) {
    spawnSync("apt-get", ["update"], { stdio: ["ignore", "ignore", "inherit"], env });
    if (!tryInstall())
      console.error("apt-get install -y chromium failed; the browser tests will fail until Chromium is installed.");
  }
}

/** One Chromium for the whole e2e run: files connect to it (`launchBrowser()`) instead of each starting and stopping one. */
export default async function setup() {
  ensureChromium();
  let server;
  try {
    server = await chromium.launchServer(LAUNCH_OPTIONS);
  } catch (e) {
    // Each file then tries its own launch and fails with the reason beside the test.
    console.error(`Chromium did not start for the browser tests: ${(e as Error).message}`);
    return;
  }
  process.env[BROWSER_ENDPOINT_ENV] = server.wsEndpoint();
  return () => server.close();
}
