// server/shutdown.ts against a real HTTP server and real PostgreSQL pools: a clean stop waits for the request in flight
// and drops idle keep-alive sockets at once; a stop with parts that never finish gives up on each after its limit and
// names them, instead of waiting for ever (the outage case: a pool whose connection never comes back).
import http from "node:http";
import type { AddressInfo } from "node:net";
import pg from "pg";
import { describe, expect, it } from "vitest";
import { shutDown } from "../../server/shutdown";

/** A server whose /slow answers when `release()` is called and whose /hang never answers. */
async function serve() {
  let release = () => {};
  let markStarted = () => {};
  const slowStarted = new Promise<void>((r) => (markStarted = r));
  const server = http.createServer((req, res) => {
    if (req.url === "/slow") {
      release = () => res.end("slow done");
      markStarted();
    } else if (req.url !== "/hang") res.end("ok");
  });
  // Longer than any test here: a keep-alive socket must be closed by the shutdown, not by this timer.
  server.keepAliveTimeout = 60_000;
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
  const agent = new http.Agent({ keepAlive: true });
  const get = (path: string) =>
    new Promise<{ status: number; body: string; error?: string }>((done) => {
      const req = http.get({ host: "127.0.0.1", port: (server.address() as AddressInfo).port, path, agent }, (res) => {
        let body = "";
        res.on("data", (c) => (body += c));
        res.on("end", () => done({ status: res.statusCode!, body }));
      });
      req.on("error", (e) => done({ status: 0, body: "", error: e.message }));
    });
  return { server, get, agent, slowStarted, finishSlow: () => release() };
}

const pool = () => new pg.Pool({ connectionString: process.env.TEST_DATABASE_URL, max: 2 });

describe("shutDown", () => {
  it("finishes the request in flight, drops idle keep-alive sockets, ends the pools: a clean stop", async () => {
    const { server, get, agent, slowStarted, finishSlow } = await serve();
    const db = pool();
    await db.query("select 1");
    expect(await get("/")).toEqual({ status: 200, body: "ok" }); // leaves an idle keep-alive socket
    const slow = get("/slow");
    await slowStarted;
    let stopped = false;
    const stopping = shutDown(
      { server, workers: {}, pools: { db } },
      { requestsMs: 60_000, workersMs: 100, poolsMs: 5000 },
    );
    void stopping.then(() => (stopped = true));
    await new Promise((r) => setImmediate(r));
    expect(stopped).toBe(false); // still waiting for /slow
    finishSlow();
    expect(await slow).toEqual({ status: 200, body: "slow done" });
    // The keep-alive socket /slow used is closed once its response is sent, long before keepAliveTimeout.
    expect(await stopping).toEqual([]);
    expect(server.listening).toBe(false);
    agent.destroy();
  });

  it("gives up on a hung request, a stuck worker and a pool whose connection never returns, and names them", async () => {
    const { server, get, agent } = await serve();
    const db = pool();
    const sessions = pool();
    await db.connect(); // checked out and never released: db.end() waits for it for ever
    await sessions.query("select 1");
    const hung = get("/hang");
    await new Promise((r) => server.once("request", r));
    const late = await shutDown(
      { server, workers: { mail: { stop: () => new Promise<void>(() => {}) } }, pools: { db, sessions } },
      { requestsMs: 200, workersMs: 200, poolsMs: 500 },
    );
    expect(late).toEqual(["requests", "mail", "db"]);
    expect((await hung).error).toBe("socket hang up"); // closed by closeAllConnections
    expect(sessions.totalCount).toBe(0);
    agent.destroy();
  });
});
