import type { AddressInfo } from "node:net";
import { createApp } from "../../server/app";
import { testDb } from "./db";
import { testConfig } from "./app";
import type { Config } from "../../server/config";

/** The real app with the built client (dist/client) on a free loopback port, for browser tests. */
export async function startTestServer(overrides: Partial<Config> = {}) {
  const { pool, db } = testDb();
  const app = createApp({ config: testConfig(overrides), pool, db });
  const server = await new Promise<import("node:http").Server>((resolve) => {
    const s = app.listen(0, "127.0.0.1", () => resolve(s));
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
