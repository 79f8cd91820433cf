import fs from "node:fs";
import { fileURLToPath, pathToFileURL } from "node:url";
import { MessageChannel } from "node:worker_threads";
import { Piscina } from "piscina";
import { describe, expect, it } from "vitest";
import { buildServer, SERVER_ENTRY, serverBuildIsStale } from "../../scripts/build-server.mjs";
import { workerEntry } from "../../server/platform/worker-entry";

describe("the server build (dist/server)", () => {
  it("puts each pool's worker where the bundle looks for it, and that worker runs without tsx", async () => {
    await buildServer();
    const bundleUrl = pathToFileURL(SERVER_ENTRY).href;
    for (const name of ["bounds.worker", "analyses.worker"]) {
      const file = workerEntry(bundleUrl, name);
      expect(file.endsWith(`/dist/server/${name}.js`)).toBe(true);
      expect(fs.existsSync(fileURLToPath(file))).toBe(true);
    }
    const pool = new Piscina({ filename: workerEntry(bundleUrl, "bounds.worker"), maxThreads: 1 });
    try {
      const { port1, port2 } = new MessageChannel();
      const answer = await pool.run(
        { query: { kind: "supportedLength", rotaryDim: 128, base: 10_000, maxLength: 4096 }, progress: port2 },
        { transferList: [port2] },
      );
      port1.close();
      // Men et al. 2024: b = 10 000 at d = 128 supports 1707 positions (as tests/api/bounds.test.ts)
      expect(answer).toEqual({ supportedLength: 1707, maxLength: 4096 });
    } finally {
      await pool.destroy();
    }
  }, 60_000);

  it("is stale when the bundle is older than the sources, fresh right after a build", () => {
    expect(serverBuildIsStale()).toBe(false);
    const now = fs.statSync(SERVER_ENTRY).mtime;
    fs.utimesSync(SERVER_ENTRY, new Date(0), new Date(0));
    try {
      expect(serverBuildIsStale()).toBe(true);
    } finally {
      fs.utimesSync(SERVER_ENTRY, now, now);
    }
  });
});
